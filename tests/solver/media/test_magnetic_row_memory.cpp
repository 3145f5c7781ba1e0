// The contiguous loads of a row of magnetic cells (solver/media/magnetic_row_memory.h) against
// the definition they shortcut: the per-cell neighbour index list and each cell's own medium
// (MagneticCells::deviation), on a hand-made list with a gap, two media and missing neighbours.
#include <doctest/doctest.h>

#include <algorithm>
#include <vector>

#include "solver/media/magnetic_row_memory.h"

using namespace ty;

namespace {

/// Three rows of a 6-cell-wide grid: row 0 all medium 0 (cells 0-5); row 1 cells i = 1, 2 of
/// medium 0 and i = 3, 4 of medium 1 (cells 6-9); row 2 all medium 0 (cells 10-15). The
/// state: distinct values per cell, two media of different moments and ground states.
MagneticCells three_rows() {
  MagneticCells M;
  auto add = [&](int i, int j, int slot) {
    if (M.runs.empty() || M.runs.back().slot != slot || M.cj.back() != j || M.ci.back() != i - 1)
      M.runs.push_back({i, i, M.count(), slot});
    M.runs.back().i1 = i + 1;
    M.ci.push_back(i), M.cj.push_back(j), M.medium.push_back(slot);
  };
  M.row_runs.assign(4, 0);
  for (int i = 0; i < 6; ++i) add(i, 0, 0);
  M.row_runs[1] = static_cast<int>(M.runs.size());
  for (int i = 1; i < 5; ++i) add(i, 1, i < 3 ? 0 : 1);
  M.row_runs[2] = static_cast<int>(M.runs.size());
  for (int i = 0; i < 6; ++i) add(i, 2, 0);
  M.row_runs[3] = static_cast<int>(M.runs.size());
  M.net = {{0.75, 0.75, 0.01, -0.02, 0.0}, {1.3, 0.4, 0.2, 0.05, 0.1}};
  for (int p = 0; p < 2; ++p)
    for (int c = 0; c < 6; ++c) {
      M.m[p][c].resize(M.ci.size());
      for (size_t k = 0; k < M.ci.size(); ++k) M.m[p][c][k] = 0.1 * c + 0.013 * k + 0.5 * p - 0.0007 * k * k;
    }
  return M;
}

}  // namespace

TEST_CASE("magnetic rows: contiguous neighbour loads are taken only where the index list is one run") {
  const MagneticCells M = three_rows();
  const int none = static_cast<int>(M.count());
  int slot = -1;
  const int all_row0[4] = {1, 2, 3, 4};
  CHECK(contiguous_neighbours(M, all_row0, 4, slot) == 1);
  CHECK(slot == 0);
  const int two_media[4] = {6, 7, 8, 9};  // contiguous indices, but two runs of the list
  CHECK(contiguous_neighbours(M, two_media, 4, slot) == -1);
  const int medium1[2] = {8, 9};
  CHECK(contiguous_neighbours(M, medium1, 2, slot) == 8);
  CHECK(slot == 1);
  const int missing_first[3] = {none, 6, 7}, missing_last[3] = {6, 7, none};
  CHECK(contiguous_neighbours(M, missing_first, 3, slot) == -1);
  CHECK(contiguous_neighbours(M, missing_last, 3, slot) == -1);
  const int gap[3] = {0, 1, 3};  // the same row, not adjacent
  CHECK(contiguous_neighbours(M, gap, 3, slot) == -1);
  const int one[1] = {none};
  CHECK(contiguous_neighbours(M, one, 1, slot) == -1);
}

TEST_CASE("magnetic rows: the y neighbours' deviations by contiguous loads equal the per-cell sum, bit for bit") {
  const MagneticCells M = three_rows();
  const int none = static_cast<int>(M.count());
  // the run of row 1 at i = 1, 2: below row 0 (cells 1, 2), above row 2 (cells 11, 12); and
  // a run of row 2 over the medium-1 cells of row 1; and one with a missing neighbour
  const int D[3][2] = {{1, 2}, {8, 9}, {1, 2}}, U[3][2] = {{11, 12}, {13, 14}, {11, none}};
  for (int p = 0; p < 2; ++p)
    for (int c = 0; c < 3; ++c) {
      double out[2];
      vertical_pair(M, p, D[c], U[c], 2, out);
      for (int q = 0; q < 2; ++q) {
        const double want = M.deviation(p, 1, D[c][q]) + M.deviation(p, 1, U[c][q]);
        CHECK(out[q] == want);
        CHECK(want != 0.0);
      }
    }
}

/// \file test_state_owners.cpp
/// \brief The parts of each state array the ranks write of a checkpoint
/// (solver/parallel/state_owners.cpp) tile the array exactly once, for several rank counts.
/// In a collective parallel-HDF5 write, elements selected by two ranks get an undefined value
/// (MPI-3.1 standard, section 13.6.1, file consistency of overlapping accesses) and elements no
/// rank selects keep the dataset's fill value (HDF5 User's Guide, "Datasets": fill values), so
/// a checkpoint holds the one-process arrays only when the parts are disjoint and cover every
/// element. Checked for the bench over ranks (absorbing sides, probes, a line, a map,
/// snapshots, a Poynting frame's kept E), a dispersive wafer, a magnetic slab (their per-node
/// and per-cell lists), a Bloch half-space (its sine copy's arrays, sine/) and a rotated-tensor
/// disc (its list, the same on every rank).
#include <doctest/doctest.h>

#include <algorithm>
#include <string>
#include <tuple>

#include "io/scene/scene_reader.h"
#include "solver/parallel/slabs.h"
#include "solver/simulation.h"

using namespace ty;

TEST_CASE("checkpoint over ranks: the ranks' parts of every state array tile it exactly once") {
  bool seen_psi_y = false, seen_poles = false, seen_cells = false, seen_kept_e = false, seen_sine = false,
       seen_tensor = false;
  for (const char* file : {"tests/data/ranks-bench.yaml", "scenarios/gaas-reststrahlen.yaml", "tests/data/mnf2-slab.yaml",
                           "tests/data/bloch-half-space.yaml", "tests/data/ranks-tensor.yaml"}) {
    const std::string path = std::string(TERAYEE_SOURCE_DIR) + "/" + file;
    const Scene scene = read_scene(path);
    Simulation<double> sim(scene, 1);
    const long stride = sim.grid().stride;
    for (int P : {1, 2, 3, 7}) {
      if (sim.grid().ny < 2 * P) continue;
      sim.visit_state([&](const std::string& name, auto*, std::size_t n) {
        CAPTURE(path);
        CAPTURE(name);
        CAPTURE(P);
        std::vector<std::pair<std::size_t, std::size_t>> all;
        for (int r = 0; r < P; ++r)
          for (const auto& part : sim.owned_parts(name, n, r, P)) {
            CHECK(part.first < part.second);
            if (name.rfind("fields/", 0) == 0) {  // whole rows, the rows gather_state takes from the rank
              CHECK(part.first % stride == 0);
              CHECK(part.second % stride == 0);
            }
            all.push_back(part);
          }
        std::sort(all.begin(), all.end());
        std::size_t next = 0;
        for (const auto& [a, b] : all) {
          CHECK(a == next);  // no gap, no overlap
          next = b;
        }
        CHECK(next == n);
        if (n > 0 && P > 1) {
          seen_psi_y |= name == "absorber/psi-hxy";
          seen_poles |= name == "media/polarization";
          seen_cells |= name == "magnets/m00";
          seen_kept_e |= name == "snapshots/E-before-frame";
          seen_sine |= name == "sine/fields/Ez";
          seen_tensor |= name == "media/tensor-polarization";
        }
      });
    }
  }
  CHECK(seen_psi_y);
  CHECK(seen_poles);
  CHECK(seen_cells);
  CHECK(seen_kept_e);
  CHECK(seen_sine);
  CHECK(seen_tensor);
}

TEST_CASE("snapshots over ranks: the slabs' frame rows tile every frame exactly once") {
  // the same rule for frames (HDF5 collective writes, as above): each frame row written by one rank
  SnapshotField f;
  for (const auto& shape : {std::tuple{0, 10, 1}, std::tuple{3, 7, 3}, std::tuple{5, 1, 2}, std::tuple{2, 0, 1}})
    for (int P : {1, 2, 3, 7}) {
      const int j0 = std::get<0>(shape), nj = std::get<1>(shape), stride = std::get<2>(shape);
      f.j0 = j0, f.nj = nj, f.stride = stride;
      const int ny = 30;
      int next = 0;
      for (int r = 0; r < P; ++r) {
        int lo, hi, b0, b1;
        parallel::slab_rows(ny, r, P, lo, hi);
        FrameRows{lo, hi, true}.of(f, b0, b1);
        CAPTURE(j0);
        CAPTURE(stride);
        CAPTURE(P);
        CAPTURE(r);
        CHECK(b0 == next);  // in order, no gap, no overlap
        CHECK(b1 >= b0);
        for (int b = b0; b < b1; ++b) {  // each frame row's grid row is the rank's
          CHECK(j0 + b * stride >= lo);
          CHECK(j0 + b * stride < hi);
        }
        next = b1;
      }
      CHECK(next == nj);
    }
}

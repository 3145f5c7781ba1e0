/// \file test_slabs.cpp
/// \brief The cut of a run over MPI ranks (solver/parallel/slabs.h): the halo components it
/// derives from the curl stencil table against Maxwell's curl equations on the Yee cell, and
/// the slabs' cover of the rows.
#include <doctest/doctest.h>

#include <set>

#include "solver/parallel/ranks.h"
#include "solver/parallel/slabs.h"
#include "solver/simulation.h"

using namespace ty;

TEST_CASE("slabs: the halo rows are the y-derivative terms of the curl equations") {
  // Yee, IEEE Trans. Antennas Propag. 14, 302 (1966), with d/dz = 0 (Taflove & Hagness, 3rd
  // ed., eqs. 3.1): mu dHx/dt = -dEz/dy, mu dHz/dt = dEx/dy - dEy/dx, eps dEx/dt = dHz/dy,
  // eps dEz/dt = dHy/dx - dHx/dy. Only d/dy reaches across a row: H reads Ez and Ex of the row
  // above (Hx, Hz sit half a cell above Ez, Ex), E reads Hz and Hx of the row below.
  auto as_set = [](bool electric) {
    std::set<int> s;
    for (int c : parallel::halo_list(electric))
      if (c >= 0) s.insert(c);
    return s;
  };
  CHECK(as_set(true) == std::set<int>{static_cast<int>(Component::Ex), static_cast<int>(Component::Ez)});
  CHECK(as_set(false) == std::set<int>{static_cast<int>(Component::Hx), static_cast<int>(Component::Hz)});
  // four rows of `stride` values cross a cut per step
  CHECK(parallel::halo_bytes_per_cut(112, 8) == 4 * 112 * 8);
}

TEST_CASE("slabs: P slabs cover the rows once, in rank order, sizes within one") {
  for (int ny : {2, 7, 80, 1001})
    for (int P = 1; P <= 8 && P * parallel::kMinRowsPerRank <= ny; ++P) {
      int next = 0, fewest = ny, most = 0;
      for (int r = 0; r < P; ++r) {
        int lo, hi;
        parallel::slab_rows(ny, r, P, lo, hi);
        CHECK(lo == next);
        next = hi;
        fewest = std::min(fewest, hi - lo), most = std::max(most, hi - lo);
        int tlo, thi;  // the same split as the threads' blocks inside a rank
        block_rows(ny, r, P, tlo, thi);
        CHECK((tlo == lo && thi == hi));
      }
      CHECK(next == ny);
      CHECK(most - fewest <= 1);
    }
}

TEST_CASE("ranks: without mpirun the program is one rank") {
  CHECK(parallel::size() == 1);
  CHECK(parallel::rank() == 0);
  CHECK(parallel::max_over_ranks(7) == 7);
}

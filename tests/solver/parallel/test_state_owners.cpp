/// \file test_state_owners.cpp
/// \brief The parts of each state array the ranks write of a checkpoint
/// (solver/parallel/state_owners.cpp) tile the array exactly once, for several rank counts.
/// In a collective parallel-HDF5 write, elements selected by two ranks get an undefined value
/// (MPI-3.1 standard, section 13.6.1, file consistency of overlapping accesses) and elements no
/// rank selects keep the dataset's fill value (HDF5 User's Guide, "Datasets": fill values), so
/// a checkpoint holds the one-process arrays only when the parts are disjoint and cover every
/// element. Checked for the bench over ranks (absorbing sides, probes, a line, a map,
/// snapshots), a dispersive wafer and a magnetic slab (their per-node and per-cell lists).
#include <doctest/doctest.h>

#include <algorithm>
#include <string>

#include "io/scene/scene_reader.h"
#include "solver/simulation.h"

using namespace ty;

TEST_CASE("checkpoint over ranks: the ranks' parts of every state array tile it exactly once") {
  bool seen_psi_y = false, seen_poles = false, seen_cells = false;
  for (const char* file : {"tests/data/ranks-bench.yaml", "scenarios/gaas-reststrahlen.yaml", "tests/data/mnf2-slab.yaml"}) {
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
        }
      });
    }
  }
  CHECK(seen_psi_y);
  CHECK(seen_poles);
  CHECK(seen_cells);
}

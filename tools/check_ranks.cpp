/// \file check_ranks.cpp
/// \brief `terayee check SCENE --ranks P`: how a run over P MPI ranks would cut the grid
/// (slabs of whole rows, solver/parallel/slabs.h) and what crosses the cuts every step,
/// with the communication time of a step on two typical networks (the model of
/// docs/parallel.md: a message costs latency + bytes / bandwidth), and the memory per rank
/// (the field and absorber arrays divided by rows; the lists and recorders whole on every rank).
#include <fmt/format.h>

#include <algorithm>
#include <iostream>
#include <tuple>

#include "io/scene/scene_reader.h"
#include "io/scene/validation.h"
#include "solver/grid/yee_grid.h"
#include "solver/parallel/magnet_halo.h"
#include "solver/parallel/slabs.h"
#include "tools/commands.h"

namespace ty {

int check_ranks(const std::string& path, const std::vector<std::string>& sets, int P) {
  const Scene s = read_scene(path, sets);
  const YeeGrid g = grid_for(s, 8);
  const int b = s.time.precision == Precision::single ? 4 : 8;
  const bool wrap = s.grid.by == Boundary::periodic;
  std::cout << fmt::format("ranks: {} slab{} of whole rows over {} rows of {} cells", P, P == 1 ? "" : "s", g.ny, g.nx);
  if (P == 1) {
    std::cout << ": one process, nothing crosses\n";
    return 0;
  }
  int lo, hi, fewest = g.ny;
  std::cout << "\n";
  for (int r = 0; r < P; ++r) {
    parallel::slab_rows(g.ny, r, P, lo, hi);
    fewest = std::min(fewest, hi - lo);
    if (r < 4 || r == P - 1)
      std::cout << fmt::format("  rank {}: rows {}..{} ({} rows)\n", r, lo, hi - 1, hi - lo);
    else if (r == 4)
      std::cout << "  ...\n";
  }
  const int cuts = P - 1 + (wrap ? 1 : 0);
  const long per_cut = parallel::halo_bytes_per_cut(g.stride, b);
  std::cout << fmt::format(
      "  halo per step: {} cut{}{}, each {} bytes ({} E rows down, {} H rows up, {} values a row with its ghost "
      "columns and padding); {} bytes in all, at most {} bytes in and out of one rank\n",
      cuts, cuts == 1 ? "" : "s", wrap ? " (the periodic y seam is one of them)" : "", per_cut,
      parallel::halo_components(true), parallel::halo_components(false), g.stride, per_cut * cuts,
      std::min(cuts, 2) * per_cut);
  // a rank waits for one message a step (the E rows; the H rows travel behind the interior update)
  const double rank_bytes = 0.5 * per_cut;  // one rank's E exchange with its neighbour: Ex and Ez rows
  for (const auto& [name, latency, bandwidth] :
       {std::tuple{"a node's shared memory", 0.5e-6, 5e9}, std::tuple{"InfiniBand-class (2 us, 12 GB/s)", 2e-6, 12e9},
        std::tuple{"10 Gb Ethernet (20 us, 1.2 GB/s)", 20e-6, 1.2e9}})
    std::cout << fmt::format("  exposed halo time per step on {}: about {:.3g} us\n", name,
                             1e6 * (latency + rank_bytes / bandwidth));
  // A rank's field and absorber arrays are resident only in its own rows (solver/grid/aligned.h:
  // zero pages until written), and so are the magnetic cells' and dispersive nodes' state (their
  // lists whole); the recorders are whole on every rank, the medium map on rank 0.
  RunSizes z = run_sizes(s);
  for (MemoryItem& m : z.memory)
    if (m.what.rfind("fields and absorber", 0) == 0 || m.what.find("' state") != std::string::npos) m.bytes /= P;
  const double first = resident_bytes() + z.memory_bytes();  // rank 0 gathers the spectral maps at the end
  for (MemoryItem& m : z.memory) {
    if (m.what.rfind("medium map", 0) == 0) m.bytes = 0;
    if (m.what.rfind("spectral map ", 0) == 0) m.bytes /= P;  // each rank sums its own rows (recorder_gather.cpp)
  }
  const double other = resident_bytes() + z.memory_bytes();
  const double buffers = 4.0 * parallel::halo_components(true) * g.stride * b;  // halo rows out and in, E and H
  std::cout << fmt::format(
      "  memory per rank: about {:.1f} MB on rank 0, {:.1f} MB on each other rank (the field and absorber "
      "arrays and the magnetic cells' and dispersive nodes' state divided by rows, and the spectral maps but "
      "on rank 0, which gathers them at the end; their lists and the other recorders whole on every rank, the "
      "medium map on rank 0), plus {:.3g} MB of halo rows and the recorders' gathered rows; {} ranks on one "
      "node hold about {:.1f} MB there\n",
      first / 1e6, other / 1e6, buffers / 1e6, P, (first + (P - 1) * other) / 1e6);
  if (fewest < parallel::kMinRowsPerRank)
    std::cout << fmt::format("  refused: a rank would hold {} row{}; {} ranks need at least {} rows\n", fewest,
                             fewest == 1 ? "" : "s", P, P * parallel::kMinRowsPerRank);
  for (const Body& body : s.bodies)
    if (s.media.at(body.medium).magnet) {  // magnet_halo.h: what the magnetic step adds
      std::cout << fmt::format(
          "  magnetic cells: each cut also carries {} H row{} down twice (before and after Faraday's law) and "
          "{} values per cell of the row on each side; four more messages a step\n",
          parallel::bits(parallel::cell_h_above_mask()), parallel::bits(parallel::cell_h_above_mask()) == 1 ? "" : "s",
          parallel::kCellValues);
      break;
    }
  return 0;
}

}  // namespace ty

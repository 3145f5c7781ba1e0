/// \file recorder_gather.h
/// \brief What the recorders read of other ranks' rows each step (solver/parallel/
/// recorder_gather.cpp). Probes and power-spectrum lines read a few nodes each (their point
/// stencils): those nodes' values alone are gathered, in row order, and put where a
/// one-process run holds them, so record() reads the same values and sums them in the same
/// order: the same bits. A line across the whole height (a transmission detector at x = const)
/// costs 24 values a point, not 6 whole rows. Each rank sums its own rows of every spectral
/// map (gathered onto rank 0 once, at the end: gather_maps) and takes its own rows of the snapshots; both
/// average to the Ez nodes, reading the row below, so each cut's lower row is gathered whole
/// on the steps a map samples and around a Poynting frame.
#pragma once
#include <vector>

#include "solver/parallel/slabs.h"

namespace ty::parallel {

template <class R>
struct RecorderGather {
  std::vector<int> frame_rows, frame_counts;  ///< each cut's lower row (maps, Poynting frames); bytes per rank
  std::vector<long> frame_steps;          ///< steps a Poynting frame reads (its own and the one before)
  std::vector<std::vector<int>> map_counts;  ///< per map, bytes of one frequency's sums per rank (gather_maps)
  std::vector<R> row_buf;                 ///< the gathered rows, each rank's in rank order
  std::vector<int> node_comp;             ///< the stencils' nodes, by row: component (0..5)
  std::vector<long> node_index;           ///< and index in its field array
  std::vector<int> node_counts;           ///< bytes of them per rank
  std::vector<R> node_buf;
  std::vector<int> cell_rows;             ///< rows of the magnetic probes' cells (gather_recorder_cells)
};

/// The rank of P that owns row j of ny: its slab's, ghost rows to the first and last rank (as
/// the halo lands in them).
inline int row_owner(int j, int ny, int P) {
  int owner = 0;
  for (int r = 0; r < P; ++r) {
    int lo, hi;
    slab_rows(ny, r, P, lo, hi);
    if ((j >= lo || r == 0) && (j < hi || r == P - 1)) owner = r;
  }
  return owner;
}

}  // namespace ty::parallel

/// \file recorder_gather.h
/// \brief What the recorders read of other ranks' rows each step (solver/parallel/
/// recorder_gather.cpp). Probes and power-spectrum lines read a few nodes each (their point
/// stencils): those nodes' values alone are gathered, in row order, and put where a
/// one-process run holds them, so record() reads the same values and sums them in the same
/// order: the same bits. A line across the whole height (a transmission detector at x = const)
/// costs 24 nodes a row point, not 6 whole rows. Spectral maps read whole stretches of rows
/// (their region and the row below, node_average.h), gathered as whole rows; on a Poynting
/// frame's steps each cut's lower row joins them.
#pragma once
#include <vector>

#include "solver/parallel/slabs.h"

namespace ty::parallel {

template <class R>
struct RecorderGather {
  std::vector<int> rows, row_counts;      ///< rows (ghosts -1, ny too) the maps read each step; bytes per rank
  std::vector<int> frame_rows, frame_counts;  ///< on frame_steps: those and each cut's lower row
  std::vector<long> frame_steps;          ///< steps a Poynting frame reads (its own and the one before)
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

/// \file magnetic_row_memory.h
/// \brief How a row of magnetic cells meets memory (solver/media/magnetic_step.cpp): its
/// neighbours in the rows below and above loaded as contiguous stretches where the list
/// allows. (The new state is stored by the run's one pass, magnetic_run.h.)
#pragma once
#include <array>

#include "solver/media/magnetic_cells.h"

namespace ty {

/// The list index of the first of the cells D[0 .. len-1] (a run's neighbours in the row
/// below or above) when they are contiguous cells of one medium run (D[q] = D[0] + q), else
/// -1; slot: their medium. Indices rise along a row, so D[len-1] - D[0] = len - 1 with both
/// magnetic means every cell between is magnetic; one run of the list then holds them all
/// when it holds the first and the last. Lets the neighbour shares and the Hy scatter load
/// contiguous stretches instead of one index per cell.
inline long contiguous_neighbours(const MagneticCells& M, const int* D, long len, int& slot) {
  const long d0 = D[0], d1 = D[len - 1];
  if (d1 >= M.count() || d1 - d0 != len - 1) return -1;
  const int row = M.cj[d0];
  for (int r = M.row_runs[row]; r < M.row_runs[row + 1]; ++r) {
    const MagneticCells::Run& run = M.runs[r];
    if (d0 < run.k0 || d0 >= run.k0 + (run.i1 - run.i0)) continue;
    slot = run.slot;
    return d1 < run.k0 + (run.i1 - run.i0) ? d0 : -1;
  }
  return -1;
}

/// out[q] = mu0 (M - M_ground)_y in state p of cell D[q] plus that of cell U[q] (the y shares'
/// neighbours; 0 for none), by
/// contiguous loads where a run's neighbours allow (contiguous_neighbours), else per cell.
inline void vertical_pair(const MagneticCells& M, int p, const int* D, const int* U, long len, double* out) {
  int sd = 0, su = 0;
  const long d0 = contiguous_neighbours(M, D, len, sd), u0 = contiguous_neighbours(M, U, len, su);
  if (d0 < 0 || u0 < 0) {
    for (long q = 0; q < len; ++q) out[q] = M.deviation(p, 1, D[q]) + M.deviation(p, 1, U[q]);
    return;
  }
  const std::array<double, 5>&ad = M.net[sd], &au = M.net[su];
  const double *d1 = M.m[p][1].data() + d0, *d2 = M.m[p][4].data() + d0;
  const double *u1 = M.m[p][1].data() + u0, *u2 = M.m[p][4].data() + u0;
#pragma omp simd
  for (long q = 0; q < len; ++q)
    out[q] = (ad[0] * d1[q] + ad[1] * d2[q] - ad[3]) + (au[0] * u1[q] + au[1] * u2[q] - au[3]);
}

}  // namespace ty

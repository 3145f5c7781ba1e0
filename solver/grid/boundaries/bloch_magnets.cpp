/// \file bloch_magnets.cpp
/// \brief The step of a Bloch pair (bloch.h, bloch_pair.cpp) that holds magnetic cells:
/// step_magnetic's sweep (solver/media/magnetic_step.cpp) done for both copies, row by row.
///
/// Each copy's cells are a copy's own deviation from the ground state both share (the same
/// medium slots, ground states and small-signal coefficients, built alike from the same
/// scene), moved by the field each gathers from its own H; the small-signal step is linear
/// (materials/magnetic/llg_linear.h), so the cosine copy's cells and the sine copy's are the
/// real and imaginary parts of the complex Bloch solution's, as the fields are. What joins the
/// copies is the seam, at the same points as the fields' ghosts:
///   - the E ghosts of row j before both copies' Faraday update of row j, the H ghosts right
///     after it (pair_h_row) and again after the row's final H (pair_h_ghosts), so that a
///     cell in column nx-1 gathers the phase-shifted Hx(nx) of both copies;
///   - a cell's neighbour across the seam (its own M seen through G P, magnetic_cells.h) and
///     the node Hx(0) (the change of cell nx-1 moved by -L_x) take the phase-shifted values of
///     both copies (Simulation::seam_value); the latter waits until both copies' cells of the
///     row have stepped (scatter_run_ends after both magnetic_row).
/// Everything else of a copy's step is its own, computed as step_magnetic computes it, so the
/// result is the same whatever the thread count. The second order the small-signal step keeps
/// (|m| = 1 through sqrt(1 - |x|^2), relatively |x|/2 <= 5e-5 at its tilt limit) is the only
/// part that does not superpose; a cell tilted further stops the run
/// (Simulation::bloch_superposition_broken).
#include <omp.h>

#include "solver/simulation.h"

namespace ty {

template <class R>
void Simulation<R>::step_pair_magnetic() {
  Simulation& b = *twin_;
  pair_before_sweep();
  const int ny = g_.ny;
  const long w = mag_.longest_row;
#pragma omp parallel num_threads(threads_)
  {
    int j0, j1;
    const int t = omp_get_thread_num();
    work_rows(row_work_, 0, ny, t, omp_get_num_threads(), j0, j1);  // the twin has the same cells
    double* sa = mag_scratch_[t].data();
    double* sb = b.mag_scratch_[t].data();
    double* ring_a[2] = {sa + 7 * w, sa + 10 * w};  // b(n-1/2) of rows j and j+1, as step_magnetic
    double* ring_b[2] = {sb + 7 * w, sb + 10 * w};
    double *top_a = sa + 13 * w, *top_b = sb + 13 * w;  // b(n-1/2) of the block's last row
    if (j1 > j0) {
      gather_row(j0, ring_a[j0 & 1]);
      b.gather_row(j0, ring_b[j0 & 1]);
      if (j1 - 1 > j0) gather_row(j1 - 1, top_a), b.gather_row(j1 - 1, top_b);
    }
#pragma omp barrier
    if (j1 > j0) pair_h_row(j0);
#pragma omp barrier
    for (int j = j0; j < j1; ++j) {
      if (j + 1 < j1 - 1) gather_row(j + 1, ring_a[(j + 1) & 1]), b.gather_row(j + 1, ring_b[(j + 1) & 1]);
      if (j + 1 < j1) pair_h_row(j + 1);
      const bool last = j == j1 - 1 && j > j0;
      magnetic_row(j, n_, last ? top_a : ring_a[j & 1], sa, mag_tilted_[t * 8]);
      b.magnetic_row(j, b.n_, last ? top_b : ring_b[j & 1], sb, b.mag_tilted_[t * 8]);
      scatter_run_ends(j, sa, sb);
      b.scatter_run_ends(j, sb, sa);
      if (in_absorber(j)) graded_decay(j, false, 5), b.graded_decay(j, false, 5);
      if (j > j0) {
        scatter_hy(j, n_);
        b.scatter_hy(j, b.n_);
        if (in_absorber(j)) graded_decay(j, false, 2), b.graded_decay(j, false, 2);
        pair_h_ghosts(j);
        e_row(j);
        b.e_row(j);
      }
    }
#pragma omp barrier
    if (j1 > j0) {
      scatter_hy(j0, n_);
      b.scatter_hy(j0, b.n_);
      if (in_absorber(j0)) graded_decay(j0, false, 2), b.graded_decay(j0, false, 2);
      pair_h_ghosts(j0);
    }
#pragma omp barrier
    if (j0 == 0 && j1 > 0) pair_before_first_e_row();
    if (j1 > j0) e_row(j0), b.e_row(j0);
  }
  ++n_;
  ++b.n_;
  mag_.latest = MagneticCells::newest(n_);
  b.mag_.latest = MagneticCells::newest(b.n_);
}

template void Simulation<float>::step_pair_magnetic();
template void Simulation<double>::step_pair_magnetic();

}  // namespace ty

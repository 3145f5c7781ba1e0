/// \file magnetic_run.h
/// \brief One run of magnetic cells (one medium, consecutive cells of a row) through the
/// small-signal step in a single pass: for each cell the field at the step's ends (the
/// gather G of magnetic_cells.h plus G P of the deviations at n-1/2), the exact linear step
/// (llg_linear.h, LinearLocal::cell), and its new state and change of mu0 M stored in the
/// cell list. Written as one loop so that no per-cell value makes a round trip through a row
/// buffer: the earlier phases (fields to a buffer, the step from it to another, copies to
/// the list) cost twice the step's own arithmetic (perf, `bench --case magnetic`,
/// docs/performance.md). The large-tilt paths (cell_step.h, tilted_cells) then redo the
/// cells that need them, from the fields this pass leaves in b0 and b1.
#pragma once
#include <algorithm>
#include <array>

#include "io/scene/constants.h"
#include "materials/magnetic/llg_linear.h"

namespace ty {

/// mu0 H at the cell (i, j) from the row pointers of its H nodes (hy_up: Hy of the row
/// above): G of magnetic_cells.h, (Hx(i) + Hx(i+1))/2, (Hy(i, j) + Hy(i, j+1))/2, Hz(i),
/// in T (mu0 H = (eta0 H) / c). The one copy of the gather; the scatter is its transpose.
template <class R>
inline void gather(const R* hx, const R* hy, const R* hy_up, const R* hz, long i, double& bx, double& by,
                   double& bz) {
  constexpr double inv_c = 1.0 / constants::c0;
  bx = 0.5 * (static_cast<double>(hx[i]) + static_cast<double>(hx[i + 1])) * inv_c;
  by = 0.5 * (static_cast<double>(hy[i]) + static_cast<double>(hy_up[i])) * inv_c;
  bz = static_cast<double>(hz[i]) * inv_c;
}

/// What one run's pass reads, every pointer at the run's first cell (q = 0).
template <class R>
struct RunInput {
  const double* m[6];    ///< the state at n-1/2 (m1 xyz, m2 xyz)
  const double* old[3];  ///< b(n-1/2) as gathered before Faraday's law moved H
  const double* vert;    ///< mu0 dM_y(n-1/2) of the cells below plus above (0 for none)
  const R *hx, *hy, *hy_up, *hz;  ///< H rows at the run's first cell; hx reaches one node past its end
  double left, right;    ///< mu0 dM_x(n-1/2) of the cells beside the run's ends (0 for none)
  std::array<double, 5> net;  ///< MagneticCells::net of the run's medium
};

/// What it writes, at the run's first cell: the new state, the change of mu0 M, each cell's
/// squared tilt (cell_step.h), and the field at the step's ends (for the large-tilt paths).
struct RunOutput {
  double* m[6];
  double* dM[3];
  double* x2;
  double *b0[3], *b1[3];
};

/// The small-signal step of the run's len cells (N sublattices). The field at the ends of the
/// step is G B / mu0 (magnetic_cells.h): the gather plus G P (mu0 dM(n-1/2)), whose x part is
/// half the cell's own deviation and a quarter of each x neighbour's, y likewise (vert).
/// Stores the new state and dM; with kAll also each cell's squared tilt and its field (what
/// the large-tilt paths read). Returns the run's largest squared tilt. The stores are most of
/// the pass's cost (6 more a cell with kAll: 1.2x its time), so the solver takes kAll only
/// for a run that holds a tilted cell, a second pass with the same arithmetic.
template <int N, bool kAll, class R>
inline double linear_run(const LinearStep& p, const RunInput<R>& in, long len, const RunOutput& out) {
  const LinearLocal<N> L(p);
  const double a0 = in.net[0], a1 = in.net[1], a2 = in.net[2], a3 = in.net[3];
  const double *m0 = in.m[0], *m1 = in.m[1], *m2 = in.m[2], *m3 = in.m[3], *m4 = in.m[4], *m5 = in.m[5];
  const double *o0 = in.old[0], *o1 = in.old[1], *o2 = in.old[2], *vert = in.vert;
  const R *hx = in.hx, *hy = in.hy, *hy_up = in.hy_up, *hz = in.hz;
  double *n0 = out.m[0], *n1 = out.m[1], *n2 = out.m[2], *n3 = out.m[3], *n4 = out.m[4], *n5 = out.m[5];
  double *d0 = out.dM[0], *d1 = out.dM[1], *d2 = out.dM[2], *x2 = out.x2;
  double *f0 = out.b0[0], *f1 = out.b0[1], *f2 = out.b0[2], *g0 = out.b1[0], *g1 = out.b1[1], *g2 = out.b1[2];
  auto dev_x = [&](long q) __attribute__((always_inline)) { return a0 * m0[q] + a1 * m3[q] - a2; };
  auto cell = [&](long q, double left, double right) __attribute__((always_inline)) {
    const double vx = 0.5 * (a0 * m0[q] + a1 * m3[q] - a2) + 0.25 * (left + right);
    const double vy = 0.5 * (a0 * m1[q] + a1 * m4[q] - a3) + 0.25 * vert[q];
    double bx, by, bz;
    gather(hx, hy, hy_up, hz, q, bx, by, bz);
    const double f[6] = {o0[q] + vx, o1[q] + vy, o2[q], bx + vx, by + vy, bz};
    const double o[6] = {m0[q], m1[q], m2[q], N == 2 ? m3[q] : 0.0, N == 2 ? m4[q] : 0.0, N == 2 ? m5[q] : 0.0};
    double n[6], d[3];
    const double t = L.cell(o, f, n, d);
    if constexpr (kAll) {
      x2[q] = t;
      f0[q] = f[0], f1[q] = f[1], f2[q] = f[2], g0[q] = f[3], g1[q] = f[4], g2[q] = f[5];
    }
    n0[q] = n[0], n1[q] = n[1], n2[q] = n[2], n3[q] = n[3], n4[q] = n[4], n5[q] = n[5];
    d0[q] = d[0], d1[q] = d[1], d2[q] = d[2];
    return t;
  };
  // one vector loop over the whole run, its end cells taking the neighbours beside it by a
  // select. (It began at the first cell whose state starts a 64-byte line, the cells before
  // it and the two end cells peeled off: with the loop's tail up to 16 scalar cells a row,
  // most of 725 ns a row; one loop is 1.2x faster at 64², 1.1x at 256², docs/performance.md.)
  double worst = 0;
  const double left = in.left, right = in.right;
  const long last = len - 1;
#pragma omp simd reduction(max : worst)
  for (long q = 0; q < len; ++q) {
    const double dl = dev_x(q > 0 ? q - 1 : 0), dr = dev_x(q < last ? q + 1 : last);
    worst = std::max(worst, cell(q, q > 0 ? dl : left, q < last ? dr : right));
  }
  return worst;
}

}  // namespace ty

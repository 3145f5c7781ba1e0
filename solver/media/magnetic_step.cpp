/// \file magnetic_step.cpp
/// \brief The magnetic cells of a Simulation: building the compact list and the time step
/// of a scene that holds magnets (H sweep, magnetic cells, scatter, E sweep); their energy
/// and output values are in magnetic_values.cpp. Placement and time centring: magnetic_cells.h.
#include <fmt/format.h>
#include <omp.h>

#include <algorithm>
#include <cassert>
#include <cmath>

#include "io/scene/medium_lookup.h"
#include "io/scene/units.h"
#include "materials/dielectric.h"
#include "materials/magnetic/linear_response.h"
#include "solver/blocking/wavefront.h"
#include "solver/media/magnet_slots.h"
#include "solver/media/magnetic_run.h"
#include "solver/media/magnetic_row_memory.h"
#include "solver/parallel/ranks.h"
#include "solver/parallel/slabs.h"
#include "solver/simulation.h"

namespace ty {

using constants::c0;

namespace {
// per cell of a row: b(n-1/2) and b(n+1/2) of the step, the tilt, b(n-1/2) as gathered
// before Faraday's law for three rows (two in turn, and the block's last), the y neighbours'
// deviations, and the change of mu0 M along x and z (what only the row's own Hx and Hz
// nodes take: magnetic_cells.h)
constexpr long kRowScratch = 19, kDMx = 17, kDMz = 18;
}  // namespace

namespace {

/// The magnetic cells row by row, left to right, with a run per stretch of one medium;
/// slot_at(i, j): the grid cell's medium slot (-1: not magnetic), asked once per cell.
template <class SlotAt>
void list_cells_by_row(MagneticCells& M, SlotAt&& slot_at, int nx, int ny) {
  for (int j = 0; j < ny; ++j) {
    M.row_runs[j] = static_cast<int>(M.runs.size());
    int prev = -1;
    for (int i = 0; i < nx; ++i) {
      const int st = slot_at(i, j);
      if (st >= 0) {
        if (st != prev) M.runs.push_back({i, i, M.count(), st});
        M.runs.back().i1 = i + 1;
        M.ci.push_back(i);
        M.cj.push_back(j);
        M.medium.push_back(st);
      }
      prev = st;
    }
  }
  M.row_runs[ny] = static_cast<int>(M.runs.size());
  M.run_tilted.assign(M.runs.size(), 0);
  for (int j = 0; j < ny; ++j)
    if (M.row_runs[j + 1] > M.row_runs[j]) {
      const auto& a = M.runs[M.row_runs[j]];
      const auto& b = M.runs[M.row_runs[j + 1] - 1];
      M.longest_row = std::max(M.longest_row, static_cast<int>(b.k0 + (b.i1 - b.i0) - a.k0));
    }
}

}  // namespace

template <class R>
void Simulation<R>::build_magnets() {
  const Scene& s = scene_;
  MagneticCells& M = mag_;
  const int nx = g_.nx, ny = g_.ny;
  std::vector<double> f_max_of;
  const std::vector<int> slot_of_body = magnet_slots(s, g_.dt, M, f_max_of, notes_);
  M.row_runs.assign(static_cast<size_t>(ny) + 1, 0);
  if (M.models.empty()) return;
  // The cell's field is G B / mu0 - mu0 dM (magnetic_cells.h): along x and y its own M is a
  // self field of 1, along z (G P = 1) its own reaction; one step per medium, whatever the
  // cell's neighbours (a surface cell needs no term of its own). The absorbing layers need no
  // change to the magnets: a side whose layer holds magnetic cells takes the graded loss, in
  // which nothing amplifies (solver/grid/graded_loss.h).
  for (size_t med = 0; med < M.models.size(); ++med)
    M.steps.push_back(CellStep::from(M.models[med], M.ground[med], g_.dt, f_max_of[med], {0.0, 0.0, 1.0},
                                     {1.0, 1.0, 0.0}));
  // a cell's slot: the body holding its centre decides (none on a magnetic wall, where
  // tangential H is held at zero)
  list_cells_by_row(
      M,
      [&](int i, int j) {
        if (!walls_.cell_allowed(i, j, nx, ny)) return -1;
        const int b = body_at(s, {g_.x(Component::Hz, i), g_.y(Component::Hz, j)});
        return b >= 0 ? slot_of_body[b] : -1;
      },
      nx, ny);
  const long n = M.count();
  auto cell = [&](int i, int j) -> int {  // neighbouring cell, wrapped on periodic sides; n if none
    if (!walls_.neighbour(i, j, nx, ny)) return static_cast<int>(n);
    const long c = M.cell_at(i, j);
    return c < 0 ? static_cast<int>(n) : static_cast<int>(c);
  };
  // sized for every cell, written only for the rows this rank reads (magnetic_cells.h):
  // mapped pages stay zero, and not resident, elsewhere
  for (auto* v : {&M.left, &M.right, &M.down, &M.up}) v->resize(n);
  for (int c = 0; c < 6; ++c) M.m[0][c].resize(n), M.m[1][c].resize(n);
  M.dMy[0].resize(n + 1), M.dMy[1].resize(n + 1);  // zero
  for (int j = 0; j < ny; ++j) {
    if (!parallel::reads_row(j, ny, parallel::rank(), parallel::size(), walls_.periodic_y)) continue;
    for (long k = M.first_cell(j); k < M.first_cell(j + 1); ++k) {
      const int i = M.ci[k];
      M.left[k] = cell(i - 1, j), M.right[k] = cell(i + 1, j), M.down[k] = cell(i, j - 1), M.up[k] = cell(i, j + 1);
      const MagneticState& g0 = M.ground[M.medium[k]];
      const bool two = M.models[M.medium[k]].n == 2;
      for (int p = 0; p < 2; ++p)
        for (int c = 0; c < 3; ++c) M.m[p][c][k] = g0.m[0][c], M.m[p][3 + c][k] = two ? g0.m[1][c] : 0.0;
    }
  }
  mag_scratch_.assign(static_cast<size_t>(threads_),
                      std::vector<double>(kRowScratch * static_cast<size_t>(M.longest_row)));
  row_work_ = M.row_work(nx);  // the threads' rows cut by work (threads/block_rows.h)
  mag_tilted_.assign(static_cast<size_t>(threads_) * 8, 0);  // a cache line per thread
  // the state and neighbours divided over ranks (resident where written), the list whole
  bytes_ += static_cast<std::size_t>(n) * ((12 + 2) * sizeof(double) + 4 * sizeof(int)) / parallel::size() +
            n * 3 * sizeof(int) + M.runs.size() * sizeof(MagneticCells::Run) +
            threads_ * kRowScratch * M.longest_row * sizeof(double);
}

template <class R>
const R* Simulation<R>::hy_above(int j) const {
  // Hy(i, j+1): the next row, row 0 across a periodic top, else the zero ghost row
  return f_[4].data() + (j + 1 < g_.ny ? g_.at(0, j + 1) : walls_.periodic_y ? g_.at(0, 0) : g_.at(0, g_.ny));
}

template <class R>
void Simulation<R>::gather_row(int j, double* b) const {
  const MagneticCells& M = mag_;
  const int r0 = M.row_runs[j], r1 = M.row_runs[j + 1];
  if (r0 == r1) return;
  const long w = M.longest_row, first = M.runs[r0].k0;
  const long o = g_.at(0, j);
  const R* hx = f_[3].data() + o;  // its ghost column nx holds Hx(0) on periodic sides, else 0
  const R* hy = f_[4].data() + o;
  const R* hz = f_[5].data() + o;
  const R* hy_up = hy_above(j);
  for (int r = r0; r < r1; ++r) {
    const MagneticCells::Run& run = M.runs[r];
    double *b0 = b + (run.k0 - first), *b1 = b0 + w, *b2 = b1 + w;
#pragma omp simd
    for (int i = run.i0; i < run.i1; ++i) {
      const int q = i - run.i0;
      gather(hx, hy, hy_up, hz, i, b0[q], b1[q], b2[q]);
    }
  }
}

template <class R>
void Simulation<R>::magnetic_row(int j, long n, const double* old, double* scratch, long& tilted) {
  MagneticCells& M = mag_;
  const int r0 = M.row_runs[j], r1 = M.row_runs[j + 1];
  if (r0 == r1) return;
  const int cur = static_cast<int>(n & 1), prev = 1 - cur;
  const long w = M.longest_row, none = M.count(), first = M.runs[r0].k0;
  double* b0[3] = {scratch, scratch + w, scratch + 2 * w};
  double* b1[3] = {scratch + 3 * w, scratch + 4 * w, scratch + 5 * w};
  double* x2 = scratch + 6 * w;
  const long o = g_.at(0, j);
  R* hx = f_[3].data() + o;  // its ghost column nx holds Hx(0) on periodic sides, else 0
  const R* hy = f_[4].data() + o;
  R* hz = f_[5].data() + o;
  const R* hy_up = hy_above(j);
  // mu0 dM_x(n-1/2) of the cell beside a run's end; across the Bloch seam, the pair's
  // phase-shifted value of that cell (seam_value), else the cell's own
  auto beside = [&](long k, bool seam, bool left) {
    const double own = M.deviation(prev, 0, k);
    return seam && partner_ && k < none ? seam_value(own, partner_->mag_.deviation(prev, 0, k), left) : own;
  };
  double* vert = scratch + 16 * w;
  for (int r = r0; r < r1; ++r) {
    const MagneticCells::Run& run = M.runs[r];
    const long k0 = run.k0, len = run.i1 - run.i0;
    const int i0 = run.i0;
    // b(n-1/2) = G H(n-1/2) as gathered before Faraday's law, b(n+1/2) = G h*, each plus
    // G P (mu0 dM(n-1/2)): G B / mu0 at the step's ends (B is what Faraday's law moves); the
    // cell's own M comes off whole inside the step (magnetic_cells.h). Left and right
    // neighbours inside a run are k -+ 1, at its ends they come from the list.
    const int *D = M.down.data() + k0, *U = M.up.data() + k0, *L = M.left.data() + k0, *Rt = M.right.data() + k0;
    vertical_pair(M, prev, D, U, len, vert);
    RunInput<R> in{{}, {}, vert, hx + i0, hy + i0, hy_up + i0, hz + i0,
                   beside(L[0], i0 == 0, true), beside(Rt[len - 1], run.i1 == g_.nx, false), M.net[run.slot]};
    RunOutput out{{}, {}, x2, {b0[0], b0[1], b0[2]}, {b1[0], b1[1], b1[2]}};
    for (int c = 0; c < 6; ++c) in.m[c] = M.m[prev][c].data() + k0, out.m[c] = M.m[cur][c].data() + k0;
    for (int c = 0; c < 3; ++c) in.old[c] = old + c * w + (k0 - first);
    out.dM[0] = scratch + kDMx * w + (k0 - first), out.dM[1] = M.dMy[cur].data() + k0;
    out.dM[2] = scratch + kDMz * w + (k0 - first);
    const CellStep& step = M.steps[run.slot];
    // the pass that keeps each cell's field and tilt for the large-tilt paths where the run
    // held a tilted cell last step, else the lighter one, and where that finds one the other
    const bool two = step.linear.n == 2;
    auto pass = [&](bool all) {
      const LinearStep& p = step.linear;
      if (two) return all ? linear_run<2, true>(p, in, len, out) : linear_run<2, false>(p, in, len, out);
      return all ? linear_run<1, true>(p, in, len, out) : linear_run<1, false>(p, in, len, out);
    };
    const bool was = M.run_tilted[r];
    const double worst = pass(was);
    M.run_tilted[r] = worst > step.tilt2;
    if (worst > step.tilt2) {
      if (!was) pass(true);
      const double* mi[6];
      for (int c = 0; c < 6; ++c) mi[c] = in.m[c];
      const double* bo[3] = {b0[0], b0[1], b0[2]};
      const double* bn[3] = {b1[0], b1[1], b1[2]};
      tilted += tilted_cells(step, len, mi, out.m, bo, bn, out.dM, x2);
    }
    // H = h* - P dM for Hz and for the Hx nodes inside the run
    const double *ex = out.dM[0], *ez = out.dM[2];
#pragma omp simd
    for (long q = 0; q < len; ++q) hz[i0 + q] -= static_cast<R>(c0 * ez[q]);
#pragma omp simd
    for (long q = 1; q < len; ++q) hx[i0 + q] -= static_cast<R>(c0 * 0.5 * (ex[q] + ex[q - 1]));
  }
}

template <class R>
void Simulation<R>::scatter_run_ends(int j, const double* scratch, const double* partner_scratch) {
  // the Hx nodes at the runs' ends, each once: the left face of every run (with the cell
  // on its left, if any), the right face of a run with no magnetic cell after it. Across a
  // Bloch seam the node Hx(0) takes the change of cell nx-1 moved by -L_x (bloch.h): the
  // phase-shifted change of both copies, so the partner's cells of row j must have stepped.
  // A cell's left neighbour is in its own row (wrapped across a periodic or Bloch seam), so
  // every change read here is in the row's scratch, where magnetic_row(j) left it.
  assert(!partner_ == !partner_scratch && "a Bloch pair's seam needs the partner's changes");
  const MagneticCells& M = mag_;
  const int r0 = M.row_runs[j], r1 = M.row_runs[j + 1];
  if (r0 == r1) return;
  const long none = M.count(), first = M.runs[r0].k0, w = M.longest_row;
  const double* row = scratch + kDMx * w;
  const double* other = partner_scratch ? partner_scratch + kDMx * w : nullptr;
  auto dx = [&](const double* d, long k) { return k < none ? d[k - first] : 0.0; };
  R* hx = f_[3].data() + g_.at(0, j);
  for (int r = r0; r < r1; ++r) {
    const MagneticCells::Run& run = M.runs[r];
    const long first_k = run.k0, last = run.k0 + (run.i1 - run.i0) - 1;
    const long lk = M.left[first_k];
    const double left = other && run.i0 == 0 && lk < none ? seam_value(dx(row, lk), dx(other, lk), true) : dx(row, lk);
    hx[run.i0] -= static_cast<R>(c0 * 0.5 * (dx(row, first_k) + left));
    if (M.right[last] < none) continue;  // the next magnetic cell writes the shared node
    // the node's other side has no magnetic cell: only this run's last cell's share
    if (run.i1 < g_.nx) hx[run.i1] -= static_cast<R>(c0 * 0.5 * dx(row, last));
    else if (walls_.periodic_x) hx[0] -= static_cast<R>(c0 * 0.5 * dx(row, last));
    else if (other) hx[0] -= static_cast<R>(c0 * 0.5 * seam_value(dx(row, last), dx(other, last), true));
  }
}

template <class R>
void Simulation<R>::scatter_hy(int j, long n) {
  // each Hy node of row j once: -c (dM_y(i, j) + dM_y(i, j-1)) / 2, from the cells of row j
  // (with the cell below, or none) and the cells of the row below that have none above
  const MagneticCells& M = mag_;
  const int cur = static_cast<int>(n & 1);
  const double* dy = M.dMy[cur].data();
  const long zero = M.count();
  R* hy = f_[4].data() + g_.at(0, j);
  for (int r = M.row_runs[j]; r < M.row_runs[j + 1]; ++r) {
    const MagneticCells::Run& run = M.runs[r];
    const long len = run.i1 - run.i0;
    const int* D = M.down.data() + run.k0;
    const double* own = dy + run.k0;
    R* h = hy + run.i0;
    int slot;
    const long d0 = contiguous_neighbours(M, D, len, slot);  // the row below by contiguous loads
    if (d0 >= 0) {
      const double* below = dy + d0;
#pragma omp simd
      for (long q = 0; q < len; ++q) h[q] -= static_cast<R>(c0 * 0.5 * (own[q] + below[q]));
    } else {
#pragma omp simd
      for (long q = 0; q < len; ++q) h[q] -= static_cast<R>(c0 * 0.5 * (own[q] + dy[D[q]]));
    }
  }
  const int below = j > 0 ? j - 1 : walls_.periodic_y ? g_.ny - 1 : -1;
  if (below < 0) return;
  for (int r = M.row_runs[below]; r < M.row_runs[below + 1]; ++r) {
    const MagneticCells::Run& run = M.runs[r];
    int slot;
    const int* U = M.up.data() + run.k0;
    if (contiguous_neighbours(M, U, run.i1 - run.i0, slot) >= 0) continue;  // every cell has one above
    for (int i = run.i0; i < run.i1; ++i) {
      const long k = run.k0 + (i - run.i0);
      if (M.up[k] == zero) hy[i] -= static_cast<R>(c0 * 0.5 * (dy[k] + dy[zero]));
    }
  }
}

template <class R>
void Simulation<R>::step_magnetic() {
  // Rows in one sweep, as step_fused does, with the magnetic cells of each row moved between
  // its H and E updates. Per thread, over its rows j0 .. j1-1:
  //   A  b(n-1/2) of its first and last cell rows (they read H rows that other threads
  //      move next), then Faraday's law for its first row (the cell row below reads it);
  //   B  for each row j: b(n-1/2) of row j+1 and Faraday's law for row j+1, the cells of
  //      row j (gather h*, step, scatter Hx and Hz), then Hy of row j (it takes the changes
  //      of cell rows j and j-1, so it waits until row j's cells have gathered), E of row j;
  //   C  after all threads: Hy and E of its first row, whose Hy takes the cell row below.
  // Every value is computed the same way whatever the thread count (same bits).
  compute_emitters();
  const int ny = g_.ny;
  MagneticCells& M = mag_;
  const auto F = fields();
  walls_.before_sweep(F.data(), g_);
#pragma omp parallel num_threads(threads_)
  {
    int j0, j1;
    const int t = omp_get_thread_num();
    work_rows(row_work_, 0, ny, t, omp_get_num_threads(), j0, j1);
    double* scratch = mag_scratch_[t].data();
    const long w = M.longest_row;
    double* ring[2] = {scratch + 7 * w, scratch + 10 * w};  // b(n-1/2) of rows j and j+1
    double* top = scratch + 13 * w;                         // b(n-1/2) of the last row
    if (j1 > j0) {
      gather_row(j0, ring[j0 & 1]);
      if (j1 - 1 > j0) gather_row(j1 - 1, top);
    }
#pragma omp barrier
    if (j1 > j0) h_row(j0);
#pragma omp barrier
    for (int j = j0; j < j1; ++j) {
      if (j + 1 < j1 - 1) gather_row(j + 1, ring[(j + 1) & 1]);
      if (j + 1 < j1) h_row(j + 1);
      magnetic_row(j, n_, j == j1 - 1 && j > j0 ? top : ring[j & 1], scratch, mag_tilted_[t * 8]);
      scatter_run_ends(j, scratch);
      if (in_absorber(j)) graded_decay(j, false, 5);  // the graded loss on the row's final Hx, Hz
      if (j > j0) {
        scatter_hy(j, n_);
        if (in_absorber(j)) graded_decay(j, false, 2);  // and on its final Hy
        h_boundaries(j);
        e_row(j);
      }
    }
#pragma omp barrier
    if (j1 > j0) {
      scatter_hy(j0, n_);
      if (in_absorber(j0)) graded_decay(j0, false, 2);
      h_boundaries(j0);
    }
#pragma omp barrier
    if (j0 == 0 && j1 > 0) walls_.before_first_e_row(F.data(), g_);
    if (j1 > j0) e_row(j0);
  }
  if (!tensor_.empty()) tensor_.step(F.data(), threads_);  // tensor_cells.h
  ++n_;
  M.latest = MagneticCells::newest(n_);
}

template <class R>
void Simulation<R>::magnetic_unit(int j, long n, const double* ev, double* const* ring, double* scratch,
                                  long& tilted) {
  // Unit (j, t) of the wavefront (solver/blocking/wavefront.h, magnetic_lead): step_magnetic's
  // work on rows j and j + 1, in the order one thread does it, with H one row ahead of the cells
  // and E (the cells of row j gather H* of row j + 1). ring[j & 1] holds b(n-1/2) of row j,
  // gathered by the unit before (by this one for row 0) before H of row j moved.
  static_assert(blocking::MagneticReach{}.gather_above == 1, "the ring holds two rows");
  if (j == 0) {
    gather_row(0, ring[0]);
    h_row(0, ev);
  }
  if (j + 1 < g_.ny) {
    gather_row(j + 1, ring[(j + 1) & 1]);
    h_row(j + 1, ev);
  }
  magnetic_row(j, n, ring[j & 1], scratch, tilted);
  scatter_run_ends(j, scratch);
  if (in_absorber(j)) graded_decay(j, false, 5);  // the graded loss on the row's final Hx, Hz
  scatter_hy(j, n);
  if (in_absorber(j)) graded_decay(j, false, 2);  // and on its final Hy
  h_boundaries(j);
  e_row(j, ev);
}

#define TY_INSTANTIATE(R)                                                     \
  template void Simulation<R>::build_magnets();                               \
  template void Simulation<R>::magnetic_row(int, long, const double*, double*, long&); \
  template void Simulation<R>::magnetic_unit(int, long, const double*, double* const*, double*, long&); \
  template void Simulation<R>::gather_row(int, double*) const;                \
  template const R* Simulation<R>::hy_above(int) const;                       \
  template void Simulation<R>::scatter_run_ends(int, const double*, const double*); \
  template void Simulation<R>::scatter_hy(int, long);                         \
  template void Simulation<R>::step_magnetic();
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

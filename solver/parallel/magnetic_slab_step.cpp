/// \file magnetic_slab_step.cpp
/// \brief The step of a scene with magnetic cells over P ranks: step_magnetic's phases
/// (magnetic_step.cpp) on this rank's rows [lo, hi), with the halo exchanges that
/// magnet_halo.h derives from the cells' gather table between them; and the cells of the
/// rows the magnetic probes read gathered for them. Every value is computed by the
/// same row functions in the same order per row as in one process, so the bits agree.
///
/// One step on a rank (each exchange: the main thread sends, then waits, between barriers):
///   0  send below E(lo) and the gather's H rows of lo as they are; receive those of hi
///   A  b(n-1/2) of each thread's first and last rows, Faraday's law for its first row;
///      send below h*(lo) of the gather's H components, receive h*(hi)
///   B  step_magnetic's loop over each thread's rows; the new state of the cell rows lo
///      (down) and hi-1 (up, with their dM), received into the rows hi and lo-1
///   C  Hy and the edges' hook of each thread's first row (row lo's Hy takes row lo-1's dM);
///      send H(hi-1) up (the E halo, slabs.h)
///   D  E of each thread's first row; the main thread's row lo after H(lo-1) has come.
/// A periodic y edge is one more cut (rank P-1 above is rank 0), as in slab_step.cpp.
#include <omp.h>

#include <cstring>

#include "solver/grid/boundaries/periodic.h"
#include "solver/parallel/slabs.h"
#include "solver/simulation.h"

namespace ty {

namespace {
constexpr int kTagOld = 21, kTagStar = 22, kTagCellsUp = 23, kTagCellsDown = 24, kTagH = 25;
constexpr int kTagCopy = 10;  // a Bloch pair's sine copy: its own messages, the tags moved by this
enum ExchangePoint : int { kBeforeStep, kAfterFaraday, kAfterCells, kAfterH };
constexpr auto kHaloE = parallel::halo_list(true), kHaloH = parallel::halo_list(false);
constexpr auto kCellH = parallel::list_of(parallel::cell_h_above_mask());
constexpr auto kAxesM = parallel::list_of(parallel::cell_m_axes());
constexpr auto kAxesDM = parallel::list_of(parallel::cell_dm_axes());
constexpr int kRowsE = parallel::halo_components(true), kRowsH = parallel::halo_components(false);
constexpr int kRowsCellH = parallel::bits(parallel::cell_h_above_mask());

/// Rows of the listed components (whole rows of s values) into / out of a buffer.
template <class R, class F>
void pack_rows(const F& f, const std::array<int, 3>& list, long at, long s, R* to) {
  for (int q = 0; q < 3 && list[q] >= 0; ++q) std::memcpy(to + q * s, f[list[q]].data() + at, s * sizeof(R));
}
template <class R, class F>
void unpack_rows(F& f, const std::array<int, 3>& list, long at, long s, const R* from) {
  for (int q = 0; q < 3 && list[q] >= 0; ++q) std::memcpy(f[list[q]].data() + at, from + q * s, s * sizeof(R));
}
}  // namespace

template <class R>
void Simulation<R>::build_magnetic_slabs() {
  if (ranks_ == 1 || mag_.empty()) return;
  parallel::MagnetHalo<R>& X = mhalo_;
  const size_t s = g_.stride, w = static_cast<size_t>(mag_.longest_row) * parallel::kCellValues + 1;
  X.old_out.assign((kRowsE + kRowsCellH) * s, R(0)), X.old_in.assign(X.old_out.size(), R(0));
  X.star_out.assign(kRowsCellH * s, R(0)), X.star_in.assign(X.star_out.size(), R(0));
  X.h_out.assign(kRowsH * s, R(0)), X.h_in.assign(X.h_out.size(), R(0));
  for (int d = 0; d < 2; ++d) X.cells_out[d].assign(w, 0), X.cells_in[d].assign(w, 0);
  // each rank's cells are one block of the list (cells are listed row by row)
  X.recorder_cell_counts.assign(ranks_, 0);
  for (int r = 0; r < ranks_; ++r) {
    int lo, hi;
    parallel::slab_rows(g_.ny, r, ranks_, lo, hi);
    for (int j : rgather_.cell_rows)
      if (j >= lo && j < hi) {
        X.recorder_cells.push_back(mag_.first_cell(j)), X.recorder_cells.push_back(mag_.first_cell(j + 1));
        X.recorder_cell_counts[r] +=
            static_cast<int>(6 * (mag_.first_cell(j + 1) - mag_.first_cell(j)) * sizeof(double));
      }
  }
  long n = 0;
  for (int c : X.recorder_cell_counts) n += c / sizeof(double);
  X.recorder_buf.assign(static_cast<size_t>(n) + 1, 0);
  bytes_ += (2 * (X.old_out.size() + X.star_out.size() + X.h_out.size())) * sizeof(R) +
            (4 * w + X.recorder_buf.size()) * sizeof(double);
}

template <class R>
void Simulation<R>::pack_cell_row(int j, double* to) const {
  const MagneticCells& M = mag_;
  const int cur = static_cast<int>(n_ & 1);  // the step's new state
  const long k0 = M.first_cell(j), n = M.first_cell(j + 1) - k0;
  for (int a = 0; a < 3 && kAxesM[a] >= 0; ++a)
    for (int sub = 0; sub < 2; ++sub, to += n)
      std::memcpy(to, M.m[cur][3 * sub + kAxesM[a]].data() + k0, n * sizeof(double));
  static_assert(kAxesDM[0] == 1 && kAxesDM[1] < 0, "the cells' changes cross rows along y only (magnet_halo.h)");
  std::memcpy(to, M.dMy[cur].data() + k0, n * sizeof(double));
}

template <class R>
void Simulation<R>::unpack_cell_row(int j, const double* from) {
  MagneticCells& M = mag_;
  const int cur = static_cast<int>(n_ & 1);
  const long k0 = M.first_cell(j), n = M.first_cell(j + 1) - k0;
  for (int a = 0; a < 3 && kAxesM[a] >= 0; ++a)
    for (int sub = 0; sub < 2; ++sub, from += n)
      std::memcpy(M.m[cur][3 * sub + kAxesM[a]].data() + k0, from, n * sizeof(double));
  std::memcpy(M.dMy[cur].data() + k0, from, n * sizeof(double));  // y only, as pack_cell_row
}

template <class R>
void Simulation<R>::magnet_exchange(int point) {
  // the main thread only (MPI is funneled, ranks.h); each point sends before it waits
  parallel::MagnetHalo<R>& X = mhalo_;
  const MagneticCells& M = mag_;
  const long s = g_.stride;
  const int t = kTagCopy * copy_;
  const int lo = row0_, hi = row1_, ny = g_.ny;
  // the gather's H rows above land where the gather reads them (hy_above: row 0 across a
  // periodic top); E rows in row hi (the ghost row ny at a periodic top, slabs.h)
  const long above = g_.row_begin(hi < ny ? hi : 0);
  const int cells_below = periodic::wrap(lo - 1, ny), cells_above = periodic::wrap(hi, ny);
  auto cell_bytes = [&](int j) {
    return (M.first_cell(j + 1) - M.first_cell(j)) * parallel::kCellValues * sizeof(double);
  };
  parallel::Request* q = X.req;  // receives 0-4, sends 5-9
  if (point == kBeforeStep) {    // every receive of the step; E and the gather's H rows as they are
    if (up_ >= 0) {
      parallel::receive_bytes(X.old_in.data(), X.old_in.size() * sizeof(R), up_, kTagOld + t, q[0]);
      parallel::receive_bytes(X.star_in.data(), X.star_in.size() * sizeof(R), up_, kTagStar + t, q[1]);
      parallel::receive_bytes(X.cells_in[1].data(), cell_bytes(cells_above), up_, kTagCellsDown + t, q[2]);
    }
    if (down_ >= 0) {
      parallel::receive_bytes(X.cells_in[0].data(), cell_bytes(cells_below), down_, kTagCellsUp + t, q[3]);
      parallel::receive_bytes(X.h_in.data(), X.h_in.size() * sizeof(R), down_, kTagH + t, q[4]);
      pack_rows(f_, kHaloE, g_.row_begin(lo), s, X.old_out.data());
      pack_rows(f_, kCellH, g_.row_begin(lo), s, X.old_out.data() + kRowsE * s);
      parallel::send_bytes(X.old_out.data(), X.old_out.size() * sizeof(R), down_, kTagOld + t, q[5]);
    }
    if (up_ >= 0) {
      q[0].wait();
      unpack_rows(f_, kHaloE, g_.row_begin(hi), s, X.old_in.data());
      unpack_rows(f_, kCellH, above, s, X.old_in.data() + kRowsE * s);
    }
  } else if (point == kAfterFaraday) {  // h* of the gather's H rows
    if (down_ >= 0) {
      pack_rows(f_, kCellH, g_.row_begin(lo), s, X.star_out.data());
      parallel::send_bytes(X.star_out.data(), X.star_out.size() * sizeof(R), down_, kTagStar + t, q[6]);
    }
    if (up_ >= 0) q[1].wait(), unpack_rows(f_, kCellH, above, s, X.star_in.data());
  } else if (point == kAfterCells) {  // the cell rows' new state and dM
    if (up_ >= 0) {
      pack_cell_row(hi - 1, X.cells_out[0].data());
      parallel::send_bytes(X.cells_out[0].data(), cell_bytes(hi - 1), up_, kTagCellsUp + t, q[7]);
    }
    if (down_ >= 0) {
      pack_cell_row(lo, X.cells_out[1].data());
      parallel::send_bytes(X.cells_out[1].data(), cell_bytes(lo), down_, kTagCellsDown + t, q[8]);
      q[3].wait(), unpack_cell_row(cells_below, X.cells_in[0].data());
    }
    if (up_ >= 0) q[2].wait(), unpack_cell_row(cells_above, X.cells_in[1].data());
  } else {  // kAfterH: the H rows the E update reads (slabs.h)
    if (up_ >= 0) {
      pack_rows(f_, kHaloH, g_.row_begin(hi - 1), s, X.h_out.data());
      parallel::send_bytes(X.h_out.data(), X.h_out.size() * sizeof(R), up_, kTagH + t, q[9]);
    }
    if (down_ >= 0) q[4].wait(), unpack_rows(f_, kHaloH, g_.row_begin(lo - 1), s, X.h_in.data());
  }
}

template <class R>
void Simulation<R>::step_magnetic_slab() {
  compute_emitters();
  MagneticCells& M = mag_;
  magnet_exchange(kBeforeStep);
#pragma omp parallel num_threads(threads_)
  {
    int j0, j1;
    const int t = omp_get_thread_num();
    work_rows(row_work_, row0_, row1_, t, omp_get_num_threads(), j0, j1);
    double* scratch = mag_scratch_[t].data();
    const long w = M.longest_row;
    double* ring[2] = {scratch + 7 * w, scratch + 10 * w};  // as in step_magnetic
    double* top = scratch + 13 * w;
    if (j1 > j0) {  // A
      gather_row(j0, ring[j0 & 1]);
      if (j1 - 1 > j0) gather_row(j1 - 1, top);
    }
#pragma omp barrier
    if (j1 > j0) h_row(j0);
#pragma omp barrier
#pragma omp master
    magnet_exchange(kAfterFaraday);
#pragma omp barrier
    for (int j = j0; j < j1; ++j) {  // B: step_magnetic's loop
      if (j + 1 < j1 - 1) gather_row(j + 1, ring[(j + 1) & 1]);
      if (j + 1 < j1) h_row(j + 1);
      magnetic_row(j, n_, j == j1 - 1 && j > j0 ? top : ring[j & 1], scratch, mag_tilted_[t * 8]);
      scatter_run_ends(j, scratch);
      if (in_absorber(j)) graded_decay(j, false, 5);
      if (j > j0) {
        scatter_hy(j, n_);
        if (in_absorber(j)) graded_decay(j, false, 2);
        h_boundaries(j);
        e_row(j);
      }
    }
#pragma omp barrier
#pragma omp master
    magnet_exchange(kAfterCells);
#pragma omp barrier
    if (j1 > j0) {  // C
      scatter_hy(j0, n_);
      if (in_absorber(j0)) graded_decay(j0, false, 2);
      h_boundaries(j0);
    }
#pragma omp barrier
#pragma omp master
    magnet_exchange(kAfterH);  // D: the main thread's row lo after H(lo-1) has come
    if (j1 > j0) e_row(j0);
  }
  for (int k = 5; k < 10; ++k) mhalo_.req[k].wait();
  tensor_step_slab();  // as step_magnetic: the rotated tensors after the sweep (slab_step.cpp)
  ++n_;
  M.latest = MagneticCells::newest(n_);
}

/// step_magnetic_slab for both copies of a Bloch pair, row by row as step_pair_magnetic does
/// it in one process (bloch_magnets.cpp): the seam joins the copies inside each row, so the
/// cut between ranks needs only each copy's own exchanges (its own tags).
template <class R>
void Simulation<R>::step_magnetic_slab_pair() {
  Simulation& b = *twin_;
  compute_emitters();
  b.compute_emitters();
  magnet_exchange(kBeforeStep), b.magnet_exchange(kBeforeStep);
  const long w = mag_.longest_row;
#pragma omp parallel num_threads(threads_)
  {
    int j0, j1;
    const int t = omp_get_thread_num();
    work_rows(row_work_, row0_, row1_, t, omp_get_num_threads(), j0, j1);
    double* sa = mag_scratch_[t].data();
    double* sb = b.mag_scratch_[t].data();
    double* ring_a[2] = {sa + 7 * w, sa + 10 * w};  // as in step_magnetic
    double* ring_b[2] = {sb + 7 * w, sb + 10 * w};
    double *top_a = sa + 13 * w, *top_b = sb + 13 * w;
    if (j1 > j0) {  // A
      gather_row(j0, ring_a[j0 & 1]), b.gather_row(j0, ring_b[j0 & 1]);
      if (j1 - 1 > j0) gather_row(j1 - 1, top_a), b.gather_row(j1 - 1, top_b);
    }
#pragma omp barrier
    if (j1 > j0) pair_h_row(j0);
#pragma omp barrier
#pragma omp master
    magnet_exchange(kAfterFaraday), b.magnet_exchange(kAfterFaraday);
#pragma omp barrier
    for (int j = j0; j < j1; ++j) {  // B: step_pair_magnetic's loop
      if (j + 1 < j1 - 1) gather_row(j + 1, ring_a[(j + 1) & 1]), b.gather_row(j + 1, ring_b[(j + 1) & 1]);
      if (j + 1 < j1) pair_h_row(j + 1);
      const bool last = j == j1 - 1 && j > j0;
      magnetic_row(j, n_, last ? top_a : ring_a[j & 1], sa, mag_tilted_[t * 8]);
      b.magnetic_row(j, b.n_, last ? top_b : ring_b[j & 1], sb, b.mag_tilted_[t * 8]);
      scatter_run_ends(j, sa, sb), b.scatter_run_ends(j, sb, sa);
      if (in_absorber(j)) graded_decay(j, false, 5), b.graded_decay(j, false, 5);
      if (j > j0) {
        scatter_hy(j, n_), b.scatter_hy(j, b.n_);
        if (in_absorber(j)) graded_decay(j, false, 2), b.graded_decay(j, false, 2);
        pair_h_ghosts(j);
        e_row(j), b.e_row(j);
      }
    }
#pragma omp barrier
#pragma omp master
    magnet_exchange(kAfterCells), b.magnet_exchange(kAfterCells);
#pragma omp barrier
    if (j1 > j0) {  // C
      scatter_hy(j0, n_), b.scatter_hy(j0, b.n_);
      if (in_absorber(j0)) graded_decay(j0, false, 2), b.graded_decay(j0, false, 2);
      pair_h_ghosts(j0);
    }
#pragma omp barrier
#pragma omp master
    magnet_exchange(kAfterH), b.magnet_exchange(kAfterH);  // D
    if (j1 > j0) e_row(j0), b.e_row(j0);
  }
  for (int k = 5; k < 10; ++k) mhalo_.req[k].wait(), b.mhalo_.req[k].wait();
  ++n_, ++b.n_;
  mag_.latest = MagneticCells::newest(n_), b.mag_.latest = MagneticCells::newest(b.n_);
}

/// The other ranks' midpoint cell-steps (integers, summed in rank order), for the summary.
template <class R>
void Simulation<R>::gather_tilted_count() {
  if (mag_.empty() || ranks_ == 1) return;
  std::vector<long> tilted(ranks_, 0);
  for (size_t t = 0; t < mag_tilted_.size(); t += 8) tilted[rank_] += mag_tilted_[t];
  parallel::allgather_bytes(tilted.data(), std::vector<int>(ranks_, static_cast<int>(sizeof(long))));
  mhalo_.tilted_elsewhere = 0;
  for (int r = 0; r < ranks_; ++r)
    if (r != rank_) mhalo_.tilted_elsewhere += tilted[r];
}

template <class R>
void Simulation<R>::gather_recorder_cells() {
  parallel::MagnetHalo<R>& X = mhalo_;
  if (mag_.empty() || X.recorder_cells.empty()) return;
  // the recorders read the state now, m[latest]; each rank's rows are one block in order
  const int p = mag_.latest;
  long first = 0;
  for (int r = 0; r < rank_; ++r) first += X.recorder_cell_counts[r] / static_cast<long>(sizeof(double));
  auto each = [&](auto&& f) {  // f(cell range, offset in the buffer), over every rank's rows
    long at = 0;
    for (size_t b = 0; b < X.recorder_cells.size(); b += 2) {
      const long k0 = X.recorder_cells[b], n = X.recorder_cells[b + 1] - k0;
      f(k0, n, at, at >= first && at < first + X.recorder_cell_counts[rank_] / static_cast<long>(sizeof(double)));
      at += 6 * n;
    }
  };
  each([&](long k0, long n, long at, bool mine) {
    if (mine)
      for (int c = 0; c < 6; ++c)
        std::memcpy(X.recorder_buf.data() + at + c * n, mag_.m[p][c].data() + k0, n * sizeof(double));
  });
  parallel::allgather_bytes(X.recorder_buf.data(), X.recorder_cell_counts);
  each([&](long k0, long n, long at, bool mine) {
    if (!mine)
      for (int c = 0; c < 6; ++c)
        std::memcpy(mag_.m[p][c].data() + k0, X.recorder_buf.data() + at + c * n, n * sizeof(double));
  });
}

#define TY_MAGNETIC_SLAB(R)                                         \
  template void Simulation<R>::build_magnetic_slabs();              \
  template void Simulation<R>::pack_cell_row(int, double*) const;   \
  template void Simulation<R>::unpack_cell_row(int, const double*); \
  template void Simulation<R>::magnet_exchange(int);                \
  template void Simulation<R>::step_magnetic_slab();                \
  template void Simulation<R>::step_magnetic_slab_pair();           \
  template void Simulation<R>::gather_tilted_count();                      \
  template void Simulation<R>::gather_recorder_cells();
TY_MAGNETIC_SLAB(float)
TY_MAGNETIC_SLAB(double)
#undef TY_MAGNETIC_SLAB

}  // namespace ty

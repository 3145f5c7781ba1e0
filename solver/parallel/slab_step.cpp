/// \file slab_step.cpp
/// \brief The row sweep over P ranks (slabs.h): each rank steps its own rows with the row
/// kernels of simulation.cpp, trading halo rows with the ranks above and below, and gathers
/// the nodes and rows its recorders read before they record (recorder_gather.cpp), so every
/// rank's recorders (and rank 0's output) see exactly the fields a one-process run holds: the same bits. Snapshot
/// frames are taken by each rank from its own rows and written together (run_folder.cpp).
///
/// One step on rank r (rows [lo, hi)), the halos derived from the curl stencil table:
///   post: receive E(hi) from above, send E(lo) below, receive H(lo-1) from below
///   wait for E(hi); every thread: H of its block's last row (the rank's last row first)
///   main thread: send H(hi-1) above; threads sweep their blocks, the first block leaving
///   E(lo) to the end; main thread: wait for H(lo-1), then E(lo)
/// so the H halo travels while the interior is updated. A periodic y edge is one more cut,
/// between rank P-1 and rank 0: the halo rows land in the ghost rows ny and -1, where the
/// one-process sweep copies them (boundaries/periodic.h).
#include <omp.h>

#include <algorithm>
#include <cstring>

#include "solver/parallel/slabs.h"
#include "solver/simulation.h"

namespace ty {

namespace {
constexpr int kTagE = 11, kTagH = 12;
constexpr auto kHaloE = parallel::halo_list(true), kHaloH = parallel::halo_list(false);

}  // namespace

template <class R>
void Simulation<R>::build_slabs() {
  ranks_ = parallel::size();
  rank_ = parallel::rank();
  parallel::slab_rows(g_.ny, rank_, ranks_, row0_, row1_);
  if (ranks_ == 1) return;
  const bool wrap = walls_.periodic_y;
  up_ = rank_ + 1 < ranks_ ? rank_ + 1 : (wrap ? 0 : -1);
  down_ = rank_ > 0 ? rank_ - 1 : (wrap ? ranks_ - 1 : -1);
  const size_t n = static_cast<size_t>(parallel::halo_components(true)) * g_.stride;
  halo_e_out_.assign(n, R(0)), halo_e_in_.assign(n, R(0)), halo_h_out_.assign(n, R(0)), halo_h_in_.assign(n, R(0));
  row_held_.assign(g_.ny, 0.0), row_fields_.assign(g_.ny, 0.0);  // gather_sums (guard/held_energy.cpp)
  bytes_ += 2 * g_.ny * sizeof(double);
  build_recorder_gather();  // recorder_gather.cpp
  // gather_sums' blocks: a double for each of each rank's rows
  work_counts_.assign(ranks_, 0);
  for (int r = 0; r < ranks_; ++r) {
    int lo, hi;
    parallel::slab_rows(g_.ny, r, ranks_, lo, hi);
    work_counts_[r] = (hi - lo) * static_cast<int>(sizeof(double));
  }
  build_magnetic_slabs();
  if (tensor_.empty()) return;
  // the tensor list is sorted by component, then by index (row-major): each rank's nodes are
  // one run of Ex nodes and one of Ey nodes
  tensor_counts_.assign(ranks_, 0), tensor_runs_.assign(4 * ranks_, 0);
  for (int r = 0; r < ranks_; ++r) {
    long a[2], b[2];
    tensor_rows(r, a, b);
    tensor_counts_[r] = static_cast<int>((b[0] - a[0] + b[1] - a[1]) * sizeof(R));
    for (int c = 0; c < 2; ++c) tensor_runs_[4 * r + 2 * c] = a[c], tensor_runs_[4 * r + 2 * c + 1] = b[c];
  }
  tensor_buf_.assign(tensor_.index.size(), R(0));
  bytes_ += tensor_buf_.size() * sizeof(R);
}

namespace {
template <class R>
void pack_rows(R* const* f, const std::array<int, 3>& list, long at, long s, R* to) {
  for (int q = 0; q < 3 && list[q] >= 0; ++q) std::memcpy(to + q * s, f[list[q]] + at, s * sizeof(R));
}
template <class R>
void unpack_rows(R* const* f, const std::array<int, 3>& list, long at, long s, const R* from) {
  for (int q = 0; q < 3 && list[q] >= 0; ++q) std::memcpy(f[list[q]] + at, from + q * s, s * sizeof(R));
}
}  // namespace

// The copies of a Bloch pair (copy_ 0 and 1) exchange their own rows under their own tags.
template <class R>
void Simulation<R>::halo_post() {
  const size_t bytes = halo_e_in_.size() * sizeof(R);
  const int tag = 2 * copy_;
  if (up_ >= 0) parallel::receive_bytes(halo_e_in_.data(), bytes, up_, kTagE + tag, halo_req_[0]);
  if (down_ >= 0) {
    pack_rows(fields().data(), kHaloE, g_.row_begin(row0_), g_.stride, halo_e_out_.data());
    parallel::send_bytes(halo_e_out_.data(), bytes, down_, kTagE + tag, halo_req_[1]);
    parallel::receive_bytes(halo_h_in_.data(), bytes, down_, kTagH + tag, halo_req_[2]);
  }
}

template <class R>
void Simulation<R>::halo_take_e() {
  if (up_ < 0) return;
  halo_req_[0].wait();
  // row ny: the ghost row of a periodic seam
  unpack_rows(fields().data(), kHaloE, g_.row_begin(row1_), g_.stride, halo_e_in_.data());
}

template <class R>
void Simulation<R>::halo_send_h() {
  if (up_ < 0) return;
  pack_rows(fields().data(), kHaloH, g_.row_begin(row1_ - 1), g_.stride, halo_h_out_.data());
  parallel::send_bytes(halo_h_out_.data(), halo_h_out_.size() * sizeof(R), up_, kTagH + 2 * copy_, halo_req_[3]);
}

template <class R>
void Simulation<R>::halo_take_h() {
  if (down_ < 0) return;
  halo_req_[2].wait();
  // row -1: the ghost row of a periodic seam
  unpack_rows(fields().data(), kHaloH, g_.row_begin(row0_ - 1), g_.stride, halo_h_in_.data());
}

template <class R>
void Simulation<R>::halo_done() {
  halo_req_[1].wait();
  halo_req_[3].wait();
}

namespace {
/// A rank's sweep of rows [lo, hi) over the threads, the order of the header: every thread
/// H of its block's last row; the main thread sends the H halo; the first block leaves E(lo)
/// to the end, after the H halo has come (take_h). h(j), e(j): row j's updates (of one copy,
/// or of both copies of a Bloch pair).
template <class H, class E, class SendH, class TakeH>
void sweep_slab(int lo, int hi, int threads, H&& h, E&& e, SendH&& send_h, TakeH&& take_h) {
#pragma omp parallel num_threads(threads)
  {
    int a, b;
    block_rows(hi - lo, omp_get_thread_num(), omp_get_num_threads(), a, b);
    a += lo, b += lo;
    if (b > a) h(b - 1);
#pragma omp barrier
#pragma omp master
    send_h();
    const bool first = a == lo && b > a;  // the main thread's block
    for (int j = a; j < b - 1; ++j) {
      h(j);
      if (!first || j > a) e(j);
    }
    if (b - 1 > a || (!first && b > a)) e(b - 1);
    if (first) {
      take_h();
      e(a);
    }
  }
}
}  // namespace

template <class R>
void Simulation<R>::step_slab() {
  compute_emitters();
  halo_post();
  halo_take_e();
  sweep_slab(
      row0_, row1_, threads_, [&](int j) { h_row(j); }, [&](int j) { e_row(j); }, [&] { halo_send_h(); },
      [&] { halo_take_h(); });
  halo_done();
  tensor_step_slab();
  ++n_;
}

/// step_slab with each row done for both copies of a Bloch pair, as step_pair does it in one
/// process (bloch_pair.cpp): the x seam's ghosts are written inside a row (pair_h_row), so
/// the cut between ranks, along x, needs only each copy's own halo rows.
template <class R>
void Simulation<R>::step_slab_pair() {
  Simulation& t = *twin_;
  compute_emitters();
  t.compute_emitters();
  halo_post(), t.halo_post();
  halo_take_e(), t.halo_take_e();
  sweep_slab(
      row0_, row1_, threads_, [&](int j) { pair_h_row(j); }, [&](int j) { e_row(j), t.e_row(j); },
      [&] { halo_send_h(), t.halo_send_h(); }, [&] { halo_take_h(), t.halo_take_h(); });
  halo_done(), t.halo_done();
  ++n_;
  ++t.n_;
}

template <class R>
void Simulation<R>::tensor_rows(int r, long* a, long* b) const {
  int lo, hi;
  parallel::slab_rows(g_.ny, r, ranks_, lo, hi);
  const auto& I = tensor_.index;
  const auto mid = I.begin() + std::count(tensor_.comp.begin(), tensor_.comp.end(), 0);  // the first Ey node
  for (int c = 0; c < 2; ++c) {
    const auto first = c == 0 ? I.begin() : mid, last = c == 0 ? mid : I.end();
    a[c] = std::lower_bound(first, last, g_.row_begin(lo)) - I.begin();
    b[c] = std::lower_bound(first, last, g_.row_begin(hi)) - I.begin();
  }
}

/// The list of rotated-tensor nodes (tensor_cells.h) reads its nodes' neighbours across rows
/// in each of its three passes; rather than trade each pass's values across the cuts, every
/// rank gathers the E its rows' sweep left at every node of the list (one allgather of the
/// list's values) and steps the whole list, so the list's state is the same on every rank
/// (rank 0 writes it to a checkpoint) and every value is computed as in one process. The
/// list's work is repeated on every rank, not split: cheap while the rotated bodies are a
/// small part of the grid.
template <class R>
void Simulation<R>::tensor_step_slab() {
  if (tensor_.empty()) return;
  const auto F = fields();
  auto each = [&](auto&& f) {  // f(list node, buffer slot, mine)
    long at = 0;
    for (int r = 0; r < ranks_; ++r)  // the runs build_slabs found (tensor_rows)
      for (int c = 0; c < 2; ++c)
        for (long q = tensor_runs_[4 * r + 2 * c]; q < tensor_runs_[4 * r + 2 * c + 1]; ++q) f(q, at++, r == rank_);
  };
  each([&](long q, long at, bool mine) {
    if (mine) tensor_buf_[at] = F[tensor_.comp[q]][tensor_.index[q]];
  });
  parallel::allgather_bytes(tensor_buf_.data(), tensor_counts_);
  each([&](long q, long at, bool mine) {
    if (!mine) F[tensor_.comp[q]][tensor_.index[q]] = tensor_buf_[at];
  });
  tensor_.step(F.data(), threads_);
}

#define TY_SLAB_STEP(R)                                    \
  template void Simulation<R>::build_slabs();              \
  template void Simulation<R>::step_slab();                \
  template void Simulation<R>::step_slab_pair();           \
  template void Simulation<R>::halo_post();                \
  template void Simulation<R>::halo_take_e();              \
  template void Simulation<R>::halo_send_h();              \
  template void Simulation<R>::halo_take_h();              \
  template void Simulation<R>::halo_done();                \
  template void Simulation<R>::tensor_step_slab();         \
  template void Simulation<R>::tensor_rows(int, long*, long*) const;
TY_SLAB_STEP(float)
TY_SLAB_STEP(double)
#undef TY_SLAB_STEP

}  // namespace ty

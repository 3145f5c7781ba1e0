/// \file block_step.cpp
/// \brief Several time steps per pass over the rows (wavefront.h): which scenes may take
/// them and at what depth, the blocked step itself, and advancing a run by blocks that end
/// where a recorder reads the fields.
#include <fmt/format.h>
#include <omp.h>

#include <algorithm>
#include <climits>

#include "solver/blocking/wavefront.h"
#include "solver/simulation.h"

namespace ty {

namespace {
// the bytes a block's band of rows should fit: about two cores' L2 (1 MiB each here); at
// 1024^2 double it allows 16 steps, at 4096^2 4 (docs/performance.md: measured)
constexpr std::size_t kBandBytes = std::size_t(2) << 20;
}  // namespace

template <class R>
blocking::DepthChoice Simulation<R>::block_choice(int requested) const {
  if (requested == 1) return {1, "one pass per step (as asked)"};
  std::string why;
  if (!mag_.empty()) why = "magnetic cells (their step gathers H across rows after the H sweep)";
  else if (!tensor_.empty()) why = "rotated in-plane permittivity (its nodes are stepped after the whole sweep)";
  else if (walls_.bloch_x) why = "Bloch sides (two copies stepped in lock-step)";
  else if (walls_.periodic_y) why = "periodic y sides (row 0 reads row ny-1 of the same step)";
  else if (ranks_ > 1) why = "rows split over ranks (a halo exchange every step)";
  else if (!probes_.empty()) why = "probes (they read the fields after every step)";
  if (!why.empty()) return {1, "one pass per step: " + why};
  const int d = requested > 0 ? requested : blocking::auto_depth(g_.nx, g_.ny, sizeof(R), kBandBytes);
  if (d <= 1) return {1, "one pass per step (the grid's rows are too long for a band of rows in cache)"};
  std::string note = fmt::format("{} steps per pass over the rows ({})", d, requested > 0 ? "as asked" : "auto");
  if (!power_spectra_.empty() || !maps_.empty() || !snaps_.plan.steps.empty())
    note += "; blocks end at the steps the power spectra, maps and snapshots sample";
  return {d, note};
}

template <class R>
void Simulation<R>::set_block_depth(int requested) {
  const blocking::DepthChoice c = block_choice(requested);
  block_depth_ = c.depth;
  block_why_ = c.why;
  emitter_block_.assign(static_cast<std::size_t>(block_depth_) * emitters_.size(), 0.0);
  progress_.resize(block_depth_);
}

template <class R>
void Simulation<R>::step_block(int depth) {
  const std::size_t nem = emitters_.size();
  for (int t = 0; t < depth; ++t) emitters_at(n_ + t, emitter_block_.data() + t * nem);
  progress_.reset(depth);
  const int ny = g_.ny;
  const double* ev0 = emitter_block_.data();
#pragma omp parallel num_threads(threads_)
  {
    int t0, t1;  // this thread's steps of the block
    block_rows(depth, omp_get_thread_num(), omp_get_num_threads(), t0, t1);
    blocking::sweep_steps(ny, t0, t1, progress_, [this, ev0, nem](int j, int t) {
      h_row(j, ev0 + t * nem);
      e_row(j, ev0 + t * nem);
    });
  }
  n_ += depth;
}

template <class R>
long Simulation<R>::next_read_step() const {
  if (!probes_.empty()) return n_;
  long next = LONG_MAX;
  auto sampled_from = [this](const DftWindows& w, long from) {
    const long e = w.every, r = ((total_steps_ - 1 - from) % e + e) % e;
    long k = from + r;
    if (w.block > 0) k = std::min(k, std::max(from, (from + w.block - 1) / w.block * w.block));
    return k;
  };
  for (const auto& fl : power_spectra_) next = std::min(next, sampled_from(fl.win, n_));
  for (const auto& m : maps_) {
    next = std::min(next, sampled_from(m.win, std::max(n_, m.start)));
    if (m.win.block > 0) next = std::min(next, sampled_from(m.win, n_));
  }
  if (const long s = snaps_.next_read(n_); s >= 0) next = std::min(next, s);
  return next;
}

template <class R>
long Simulation<R>::advance_up_to(long most) {
  long depth = std::min<long>(block_depth_, most);
  if (depth > 1) depth = std::min(depth, next_read_step() - n_ + 1);
  if (depth <= 1) {
    advance();
    return 1;
  }
  step_block(static_cast<int>(depth));
  record();  // the block's last step; the steps before it are read by nobody
  return depth;
}

#define TY_INSTANTIATE(R)                                                      \
  template blocking::DepthChoice Simulation<R>::block_choice(int) const;       \
  template void Simulation<R>::set_block_depth(int);                           \
  template void Simulation<R>::step_block(int);                                \
  template long Simulation<R>::next_read_step() const;                         \
  template long Simulation<R>::advance_up_to(long);
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

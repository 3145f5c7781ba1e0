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

template <class R>
blocking::DepthChoice Simulation<R>::block_choice(int requested) const {
  if (requested == 1) return {1, "one pass per step (as asked)"};
  std::string why;
  if (!tensor_.empty()) why = "rotated in-plane permittivity (its nodes are stepped after the whole sweep)";
  else if (walls_.bloch_x) why = "Bloch sides (two copies stepped in lock-step)";
  else if (walls_.periodic_y) why = "periodic y sides (row 0 reads row ny-1 of the same step)";
  else if (ranks_ > 1) why = "rows split over ranks (a halo exchange every step)";
  if (!why.empty()) return {1, "one pass per step: " + why};
  // a magnetic row also carries its cells' state: m twice (12), dM twice (6), the neighbour
  // lists (4 ints) and the gathers, about 180 bytes a cell
  const std::size_t cell_bytes = mag_.empty() ? 0 : 180 * (mag_.count() / std::max(1, g_.ny) + 1);
  const int lead = mag_.empty() ? blocking::kLead : blocking::kMagneticLead;
  // past the last-level cache a sweep streams from memory, and deeper blocks (to 64 steps, in
  // a band of up to 32 MiB) pay; within it they cost the wavefront's longer start and end
  const std::size_t llc = blocking::last_level_cache(), row = 6 * (g_.nx + 2) * sizeof(R) + cell_bytes;
  const bool past = llc > 0 && static_cast<std::size_t>(g_.ny) * row > llc;
  const int d = requested > 0 ? requested
                              : blocking::auto_depth(g_.nx, g_.ny, sizeof(R), blocking::band_bytes(past), lead + 1,
                                                     cell_bytes, past ? 64 : 16);
  if (d <= 1) return {1, "one pass per step (the grid's rows are too long for a band of rows in cache)"};
  std::string note = fmt::format("{} steps per pass over the rows ({})", d, requested > 0 ? "as asked" : "auto");
  if (!probes_.empty() || !power_spectra_.empty()) note += "; probes and power spectra record inside the blocks";
  if (!maps_.empty() || !snaps_.plan.steps.empty()) note += "; blocks end at the steps the maps and snapshots sample";
  return {d, note};
}

template <class R>
void Simulation<R>::set_block_depth(int requested) {
  const blocking::DepthChoice c = block_choice(requested);
  block_depth_ = c.depth;
  block_why_ = c.why;
  emitter_block_.assign(static_cast<std::size_t>(block_depth_) * emitters_.size(), 0.0);
  progress_.resize(block_depth_);
  if (block_depth_ > 1) {
    taps_.build(probes_, power_spectra_, g_.ny, g_.stride, mag_.cj, block_depth_);
    mag_ring_.assign(static_cast<std::size_t>(block_depth_) * 6 * mag_.longest_row, 0.0);
  }
}

template <class R>
void Simulation<R>::step_block(int depth) {
  const std::size_t nem = emitters_.size();
  const long n0 = n_;
  for (int t = 0; t < depth; ++t) emitters_at(n0 + t, emitter_block_.data() + t * nem);
  const int groups = taps_.groups();
  for (int t = 0; t < depth; ++t) {  // which recorders read step n0 + t
    char* on = taps_.active.data() + static_cast<std::size_t>(t) * groups;
    for (size_t p = 0; p < probes_.size(); ++p) on[p] = 1;
    for (size_t r = 0; r < power_spectra_.size(); ++r) on[probes_.size() + r] = power_spectra_[r].win.sampled(n0 + t, total_steps_);
  }
  progress_.reset(depth);
  const int ny = g_.ny;
  const double* ev0 = emitter_block_.data();
  const auto Fm = fields();
  const R* const F[6] = {Fm[0], Fm[1], Fm[2], Fm[3], Fm[4], Fm[5]};
  const bool magnets = !mag_.empty(), taps = !taps_.empty();
  const long w = mag_.longest_row;
#pragma omp parallel num_threads(threads_)
  {
    const int th = omp_get_thread_num();
    int t0, t1;  // this thread's steps of the block
    block_rows(depth, th, omp_get_num_threads(), t0, t1);
    double* scratch = magnets ? mag_scratch_[th].data() : nullptr;
    long no_cells = 0;
    long& tilted = magnets ? mag_tilted_[th * 8] : no_cells;
    blocking::sweep_steps(
        ny, t0, t1, progress_,
        [&](int j, int t) {
          const double* ev = ev0 + t * nem;
          if (magnets) {
            double* ring[2] = {mag_ring_.data() + t * 6 * w, mag_ring_.data() + (t * 6 + 3) * w};
            magnetic_unit(j, n0 + t, ev, ring, scratch, tilted);
          } else {
            he_row(j, ev);
          }
          if (taps) {  // the recorders read the state after step n0 + t: the copy that step wrote
            const int p = MagneticCells::newest(n0 + t + 1);
            taps_.take(j, t, F, [this, p](const std::string& f, long k) { return magnetic_value(f, k, p); });
          }
        },
        magnets ? blocking::kMagneticLead : blocking::kLead);
  }
  n_ += depth;
  mag_.latest = MagneticCells::newest(n_);
  if (taps) record_taps(n0, depth);
}

template <class R>
void Simulation<R>::record_taps(long n0, int depth) {
  for (int t = 0; t < depth; ++t) {
    const double* v = taps_.values.data() + static_cast<std::size_t>(t) * taps_.slots;
    const int* s0 = taps_.slot0.data();
    for (size_t p = 0; p < probes_.size(); ++p) probes_[p].record_values(n0 + t, v + s0[p]);
    for (size_t r = 0; r < power_spectra_.size(); ++r)
      power_spectra_[r].record_values(n0 + t, total_steps_, v + s0[probes_.size() + r], threads_);
  }
}

template <class R>
long Simulation<R>::next_read_step() const {
  long next = LONG_MAX;  // probes and power-spectrum lines record inside the blocks (recorder_taps.h)
  auto sampled_from = [this](const DftWindows& w, long from) {
    const long e = w.every, r = ((total_steps_ - 1 - from) % e + e) % e;
    long k = from + r;
    if (w.block > 0) k = std::min(k, std::max(from, (from + w.block - 1) / w.block * w.block));
    return k;
  };
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
  // steps up to the next one something reads whole (LONG_MAX when nothing does: no + 1 on it)
  if (const long gap = next_read_step() - n_; depth > 1 && gap < depth - 1) depth = gap + 1;
  if (depth <= 1) {
    advance();
    return 1;
  }
  step_block(static_cast<int>(depth));  // with its probes and power-spectrum lines
  record_whole();  // maps and snapshots of the block's last step; the steps before it are read by nobody
  return depth;
}

#define TY_INSTANTIATE(R)                                                      \
  template blocking::DepthChoice Simulation<R>::block_choice(int) const;       \
  template void Simulation<R>::set_block_depth(int);                           \
  template void Simulation<R>::step_block(int);                                \
  template void Simulation<R>::record_taps(long, int);                         \
  template long Simulation<R>::next_read_step() const;                         \
  template long Simulation<R>::advance_up_to(long);
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

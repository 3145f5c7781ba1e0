/// \file bloch_pair.cpp
/// \brief A Simulation with Bloch x sides (bloch.h): building its sine copy, the step of the
/// two copies in lock-step, and their power-spectrum lines joined into the complex field's.
///
/// The cosine copy (this) owns the sine copy (twin_): the same scene, its sources multiplied
/// by sin(k_x x) where this copy's are by cos(k_x x) (build_sources.cpp), its outputs only
/// the power-spectrum lines. One step is step_fused's sweep with each row done for both
/// copies before the next: the E ghosts of row j are written from both copies' column 0 at
/// step n just before the row's H updates, the H ghosts from both copies' final H row j just
/// after, and each copy's E row j reads its own. Every other part of a copy's step (media,
/// dispersive nodes, the absorber along y, sources) is the ordinary one, so each copy is an
/// exact real solution and F = A + iB the Bloch-periodic complex one.
///
/// Magnetic cells: each copy carries its own cells (their deviation from the shared ground
/// state, the same coefficients), stepped from its own fields; across the seam a cell's
/// neighbour and the node Hx(0) take the phase-shifted values of both copies (seam_value), and
/// the pair's sweep is step_magnetic's (bloch_magnets.cpp). That is exact while every cell takes
/// the small-signal step, which is linear; a cell tilted past it (cell_step.h) breaks the
/// superposition, and the run stops (bloch_superposition_broken).
#include <fmt/format.h>
#include <omp.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "io/scene/units.h"
#include "solver/simulation.h"

namespace ty {

template <class R>
void Simulation<R>::build_bloch_pair() {
  const double kl = scene_.grid.bloch_kx * g_.nx * g_.dx;  // k_x L_x, the phase across the cell
  phase_ = {std::cos(kl), std::sin(kl)};
  if (copy_ != 0) return;
  Scene sine = scene_;
  std::erase_if(sine.outputs, [](const Output& o) { return o.kind != Output::Kind::power_spectrum; });
  twin_.reset(new Simulation(sine, threads_, 1));
  partner_ = twin_.get();
  twin_->partner_ = this;
  bytes_ += twin_->bytes_;
  notes_.push_back(
      fmt::format("bloch sides: k_x = {:.6g} rad/m (phase {:.6g} rad across the {:.6g} m cell); "
                  "a second (sine) copy of the fields doubles the work",
                  scene_.grid.bloch_kx, kl, g_.nx * g_.dx));
}

template <class R>
void Simulation<R>::pair_h_row(int j) {
  Simulation& b = *twin_;
  const long o = g_.at(0, j);
  bloch::e_ghosts_x(f_[1].data() + o, f_[2].data() + o, b.f_[1].data() + o, b.f_[2].data() + o, g_.nx, phase_);
  h_row(j);
  b.h_row(j);
  bloch::h_ghosts_x(f_[3].data() + o, f_[4].data() + o, f_[5].data() + o, b.f_[3].data() + o, b.f_[4].data() + o,
                    b.f_[5].data() + o, g_.nx, phase_);
}

template <class R>
void Simulation<R>::pair_h_ghosts(int j) {
  Simulation& b = *twin_;
  h_boundaries(j);
  b.h_boundaries(j);
  const long o = g_.at(0, j);
  bloch::h_ghosts_x(f_[3].data() + o, f_[4].data() + o, f_[5].data() + o, b.f_[3].data() + o, b.f_[4].data() + o,
                    b.f_[5].data() + o, g_.nx, phase_);
}

template <class R>
double Simulation<R>::seam_value(double own, double other, bool left) const {
  if (!partner_) return own;
  const double a = copy_ == 0 ? own : other, b = copy_ == 0 ? other : own;
  double ag, bg;
  if (left) bloch::left_ghost(ag, bg, a, b, phase_);
  else bloch::right_ghost(ag, bg, a, b, phase_);
  return copy_ == 0 ? ag : bg;
}

template <class R>
std::string Simulation<R>::bloch_superposition_broken() const {
  if (!twin_ || mag_.empty()) return {};
  // the copies' midpoint cell-steps on this rank's rows; over ranks (collective, every step a
  // pair with magnets takes) whether any rank has one, then their sum in rank order
  const auto own = [](const Simulation& s) {
    long k = 0;
    for (size_t t = 0; t < s.mag_tilted_.size(); t += 8) k += s.mag_tilted_[t];
    return k;
  };
  long n = own(*this) + own(*twin_);
  if (ranks_ > 1 && parallel::max_over_ranks(n) > 0) {
    long total = 0;
    for (const parallel::Pick& p : parallel::picks_over_ranks({0.0, n})) total += p.where;
    n = total;
  }
  if (n == 0) return {};
  return fmt::format(
      "bloch sides: {} magnetic cell-step{} tilted past the small-signal limit ({:g} rad) by step {}; the "
      "nonlinear step of such cells does not superpose, so the sine and cosine copies no longer add up to one "
      "Bloch wave. Lower the sources' amplitude (the linear response scales with it), or use periodic sides at "
      "normal incidence for a nonlinear study",
      n, n == 1 ? "" : "s", CellStep::kTilt, n_);
}

template <class R>
void Simulation<R>::pair_before_sweep() {
  Simulation& b = *twin_;
  compute_emitters();
  b.compute_emitters();
  walls_.before_sweep(fields().data(), g_);
  b.walls_.before_sweep(b.fields().data(), g_);
}

template <class R>
void Simulation<R>::pair_before_first_e_row() {
  walls_.before_first_e_row(fields().data(), g_);
  twin_->walls_.before_first_e_row(twin_->fields().data(), g_);
}

template <class R>
void Simulation<R>::step_pair() {
  Simulation& b = *twin_;
  pair_before_sweep();
#pragma omp parallel num_threads(threads_)
  {
    int j0, j1;
    block_rows(g_.ny, omp_get_thread_num(), omp_get_num_threads(), j0, j1);
    if (j1 > j0) pair_h_row(j1 - 1);
#pragma omp barrier
    if (j0 == 0 && j1 > 0) pair_before_first_e_row();
    for (int j = j0; j < j1 - 1; ++j) {
      pair_h_row(j);
      e_row(j);
      b.e_row(j);
    }
    if (j1 > j0) {
      e_row(j1 - 1);
      b.e_row(j1 - 1);
    }
  }
  ++n_;
  ++b.n_;
}

template <class R>
const std::vector<PowerSpectrumRecorder>& Simulation<R>::power_spectra() const {
  if (!twin_) return power_spectra_;
  joined_ = power_spectra_;
  const std::complex<double> i(0, 1);
  for (size_t q = 0; q < joined_.size(); ++q) {
    const auto& sine = twin_->power_spectra_[q].acc;
    for (size_t k = 0; k < sine.size(); ++k) joined_[q].acc[k] += i * sine[k];
  }
  return joined_;
}

#define TY_BLOCH_PAIR(R)                           \
  template void Simulation<R>::build_bloch_pair(); \
  template void Simulation<R>::pair_h_row(int);    \
  template void Simulation<R>::pair_h_ghosts(int); \
  template void Simulation<R>::pair_before_sweep(); \
  template void Simulation<R>::pair_before_first_e_row(); \
  template double Simulation<R>::seam_value(double, double, bool) const; \
  template std::string Simulation<R>::bloch_superposition_broken() const; \
  template void Simulation<R>::step_pair();        \
  template const std::vector<PowerSpectrumRecorder>& Simulation<R>::power_spectra() const;
TY_BLOCH_PAIR(float)
TY_BLOCH_PAIR(double)
#undef TY_BLOCH_PAIR

}  // namespace ty

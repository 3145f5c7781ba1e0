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
/// Magnetic cells are refused (io/scene/validation.cpp): the cells' gather and scatter reach
/// across the seam in their own copy, and the midpoint step of tilted cells is not linear, so
/// the copies would no longer combine into one complex solution.
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
  if (!mag_.empty())  // validate_scene refuses these first
    throw std::invalid_argument("bloch sides with magnetic cells reached the solver");
  Scene sine = scene_;
  std::erase_if(sine.outputs, [](const Output& o) { return o.kind != Output::Kind::power_spectrum; });
  twin_.reset(new Simulation(sine, threads_, 1));
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
void Simulation<R>::step_pair() {
  Simulation& b = *twin_;
  compute_emitters();
  b.compute_emitters();
  const auto F = fields();
  const auto G = b.fields();
  walls_.before_sweep(F.data(), g_);
  b.walls_.before_sweep(G.data(), g_);
#pragma omp parallel num_threads(threads_)
  {
    int j0, j1;
    block_rows(g_.ny, omp_get_thread_num(), omp_get_num_threads(), j0, j1);
    if (j1 > j0) pair_h_row(j1 - 1);
#pragma omp barrier
    if (j0 == 0 && j1 > 0) {
      walls_.before_first_e_row(F.data(), g_);
      b.walls_.before_first_e_row(G.data(), g_);
    }
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
  template void Simulation<R>::step_pair();        \
  template const std::vector<PowerSpectrumRecorder>& Simulation<R>::power_spectra() const;
TY_BLOCH_PAIR(float)
TY_BLOCH_PAIR(double)
#undef TY_BLOCH_PAIR

}  // namespace ty

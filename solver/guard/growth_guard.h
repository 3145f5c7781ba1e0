/// \file growth_guard.h
/// \brief The run's guard against growth: stops a run whose energy grows past what its
/// sources have put in, or whose magnets tilt far past what the linear response of its
/// sources allows, saying where, instead of finishing hours later with garbage.
///
/// Energy: in a passive scene (the graded loss is passive, solver/grid/graded_loss.h; the
/// media and the Gilbert damping lose energy; the leapfrog step conserves a discrete energy
/// close to the field energy) the energy held, field plus magnetic, cannot exceed the work
/// the sources have done. The guard compares W = field_energy + magnetic_energy with the
/// sources' gross work on the leapfrog's conserved energy so far (Simulation::injected_energy,
/// an upper bound of that energy) and stops the run once W exceeds energy_factor_ times it
/// plus a floor, 10^-12 of the sources' energy scale eps0 e0^2 lambda^2. The factor covers
/// the measured W (E at n, H at n-1/2) against the conserved one: W <= conserved / (1 - S)
/// at S = c dt sqrt(dx^-2 + dy^-2) < 1 (growth_guard.cpp); it is twice that, at least
/// kEnergyFactor.
///
/// Tilt: a source of field amplitude E0 (a launch line's peak; a line current's field one
/// cell away) drives a medium of susceptibility chi to a tilt of about |chi| (E0/c) / (mu0
/// Ms) (linear response, materials/magnetic/linear_response.h), the largest |chi| over the
/// source's band taken. A cell tilted past max(kTiltMargin times that, kTiltFloor) rad means
/// growth; the check is off when that limit passes kTiltOff (the sources themselves ask for
/// large angles, or an undamped line lies inside their band).
///
/// Slow growth (an absorber that amplifies a little each pass, far below both limits above):
/// - after every source has stopped (source_end) nothing may gain energy: the energy is
///   conserved or lost (the leapfrog step, the graded loss, Gilbert damping), and the PML
///   loses it for every wave it is stable for. The guard keeps the lowest W seen since, and
///   stops the run once W has risen above it by kEnergyRise or by w dt at the sources' band
///   centre, whichever is larger, and kept rising over the last two windows of
///   kWindow checks: W as measured (E at n, H at n-1/2) swings about the leapfrog's conserved
///   energy by up to (w dt / 2) W each way, tens of percent in a closed lossless box at a few
///   cells a wavelength (growth_guard.cpp). Rises below kEnergyFloor of the largest W seen
///   are not counted (round-off in a domain the field has left).
/// - the magnets of the absorbing layers tilt no more than the waves that enter it from the
///   interior: a layer whose largest tilt exceeds kTiltRatio times the largest ever seen
///   outside it and has grown by kTiltGrowth over the last kWindow checks (rising at each
///   of them) is amplifying.
/// The guard is checked every 1% of the run, so either stops a slow growth within a few
/// windows (a few percent of the run) of its becoming visible.
#pragma once
#include <array>
#include <string>

#include "solver/simulation.h"

namespace ty {

template <class R>
class GrowthGuard {
 public:
  static constexpr double kEnergyFactor = 3.0;
  static constexpr double kTiltMargin = 100.0;
  static constexpr double kTiltFloor = 0.01;  ///< rad
  static constexpr double kTiltOff = 0.3;     ///< rad: sources asking for more are nonlinear studies
  static constexpr double kEnergyRise = 0.05;
  static constexpr double kEnergyFloor = 1e-3;
  static constexpr double kTiltRatio = 3.0;
  static constexpr double kTiltGrowth = 1.5;
  static constexpr int kWindow = 4;  ///< checks

  explicit GrowthGuard(const Simulation<R>& sim);

  /// The tilt (rad) past which the run stops; 0: the tilt check is off.
  double tilt_limit() const { return tilt_limit_; }
  /// The linear-response estimate of the largest tilt (rad); infinite for an undamped line in the band.
  double linear_tilt() const { return linear_tilt_; }

  /// Checks the simulation now; empty when all is well, else the error message (what grew,
  /// when it was last seen well, the cell (x, y), its medium, inside or outside the absorber).
  std::string check(const Simulation<R>& sim);

 private:
  double tilt_limit_ = 0, linear_tilt_ = 0;
  double most_injected_ = 0;
  long last_good_ = 0;
  double sources_end_ = 0;          ///< s; infinity with a cw source
  double w_peak_ = 0, w_low_ = -1;  ///< the largest W; the lowest since the sources stopped (-1: not yet)
  double rise_ = kEnergyRise;       ///< the slow check's rise: kEnergyRise, or w dt at the band centre if larger
  double energy_factor_ = kEnergyFactor;  ///< W may reach this times the sources' work
  double w_scale_ = 0;                    ///< J/m: the sources' energy scale (the check's floor is 1e-12 of it)
  static constexpr int kHistory = 2 * kWindow + 1;
  std::array<double, kHistory> w_seen_{}, tilt_seen_{};  ///< W after the sources stopped; the absorber's largest tilt
  int ws_ = 0, tilts_ = 0;                               ///< how many of each seen
  double interior_peak_ = 0;                             ///< the largest tilt ever seen outside the absorbing layers
  std::string where(const Simulation<R>& sim, int i, int j) const;
  std::string slow_energy(const Simulation<R>& sim, double w);
  std::string slow_tilt(const Simulation<R>& sim, double in, long at_in, double out);
};

extern template class GrowthGuard<float>;
extern template class GrowthGuard<double>;

}  // namespace ty

/// \file growth_guard.h
/// \brief The run's guard against growth: stops a run whose energy grows past what its
/// sources have put in, or whose magnets tilt far past what the linear response of its
/// sources allows, saying where, instead of finishing hours later with garbage.
///
/// Energy: in a passive scene (the graded loss is passive, solver/grid/graded_loss.h; the
/// media and the Gilbert damping lose energy; the leapfrog step conserves a discrete energy
/// close to the field energy) the energy held, field plus magnetic, cannot exceed the work
/// the sources have done. The guard compares W = field_energy + magnetic_energy with the
/// sources' gross work so far (Simulation::injected_energy, an upper bound of their work)
/// and stops the run once W > kEnergyFactor times that (plus a floor of round-off size).
/// The margin covers the difference between the measured W (E at n, H at n-1/2) and the
/// conserved one.
///
/// Tilt: a source of field amplitude E0 (a launch line's peak; a line current's field one
/// cell away) drives a medium of susceptibility chi to a tilt of about |chi| (E0/c) / (mu0
/// Ms) (linear response, materials/magnetic/linear_response.h), the largest |chi| over the
/// source's band taken. A cell tilted past max(kTiltMargin times that, kTiltFloor) rad means
/// growth; the check is off when that limit passes kTiltOff (the sources themselves ask for
/// large angles, or an undamped line lies inside their band).
#pragma once
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
  std::string where(const Simulation<R>& sim, int i, int j) const;
};

extern template class GrowthGuard<float>;
extern template class GrowthGuard<double>;

}  // namespace ty

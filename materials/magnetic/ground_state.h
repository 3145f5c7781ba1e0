/// \file ground_state.h
/// \brief Stationary states of a sublattice magnet under its bias, and the lowest one.
///
/// The energy of magnet.h is minimised from a fixed, deterministic list of starts
/// (collinear along the bias, the anisotropy axes, the order direction and the scene
/// axes; spin-flop starts perpendicular to the bias; parallel starts; each tilted by
/// 1e-3 rad so that no start sits on a zero-torque saddle) by a damped Newton method in
/// the tangent planes of the sublattice spheres (Levenberg-Marquardt; Nocedal & Wright,
/// Numerical Optimization, 2nd ed., ch. 4 and 10) to a torque below 1e-12 of the field
/// scale. Every distinct local minimum is kept: between the spin-flop field and the
/// collinear instability field both the collinear and the spin-flop state are minima. Among
/// states of equal energy (a degenerate spin-flop plane) the one whose sublattice 1 points
/// most along `order`, then the first found, is taken, so the choice is deterministic.
#pragma once
#include <string>
#include <vector>

#include "materials/magnetic/magnet.h"

namespace ty {

struct MagneticState {
  std::array<Vec3, 2> m{Vec3::UnitZ(), -Vec3::UnitZ()};
  double energy = 0;    ///< mu0 * energy density, T^2
  std::string kind;     ///< collinear, spin-flop, canted, aligned
  bool soft = false;    ///< has a zero-stiffness direction (continuously degenerate)
};

struct GroundStates {
  MagneticState ground;
  std::vector<MagneticState> degenerate;  ///< other minima of the ground state's energy (other branches)
  std::vector<MagneticState> metastable;  ///< other local minima, by energy
};

GroundStates find_ground_states(const MagnetModel& model);

/// Every state found, numbered as `check` lists them from 1: the ground state, the
/// degenerate ones, then the metastable ones.
std::vector<MagneticState> listed_states(const GroundStates& g);

/// The local minimum reached from `start` (continuation): the start is tilted by 1e-3 rad
/// as in find_ground_states, so that a state past its stability limit (a saddle with zero
/// torque) slides off to the minimum a sample would fall into.
MagneticState relax(const MagnetModel& model, const std::array<Vec3, 2>& start);

/// Largest torque |m_s x B_eff,s| of a state, T (zero at a stationary state).
double torque(const MagnetModel& model, const MagneticState& s);

}  // namespace ty

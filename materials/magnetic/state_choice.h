/// \file state_choice.h
/// \brief The state a magnet starts from: the lowest one (default), any state `check`
/// lists (by number or kind), or the end of a bias history followed by continuation.
///
/// History: the state starts as the lowest one (by `order` among equal ones) at the first
/// bias of the path and follows the path through straight segments, the last one ending at
/// the scene's bias, in steps of at most 5 mT; at each step it relaxes from where it was
/// (ground_state.h, `relax`), so it stays on its branch until that branch stops being a
/// minimum and then falls into the minimum below: the spin-flop hysteresis of a lab sweep,
/// or a hard ferrite held against a reversed bias below its switching field.
#pragma once
#include <string>

#include "materials/magnetic/ground_state.h"

namespace ty {

struct ChosenState {
  MagneticState state;
  std::string how;  ///< which state and why, for the run log, summary.json and `check`
};

/// Throws BadInput (at the `state` key) when the asked-for state does not exist under this bias.
ChosenState choose_state(const Magnet& magnet, const std::array<double, 3>& bias);

}  // namespace ty

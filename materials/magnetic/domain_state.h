/// \file domain_state.h
/// \brief The state one body of a magnetic medium starts from: the medium's own (state_choice.h),
/// or the body's (`order`, `state`, `order: reversed` on the body: an antiferromagnetic domain).
///
/// `order: [x, y, z]` and `state: ...` act as the magnet block's keys, for this body only (a
/// body's `state` replaces the medium's `state` or `history`). `order: reversed` takes the
/// state of the same energy whose sublattice 1 points most against that of the state the body
/// would otherwise take: among the states the ground-state search lists, and the two images
/// of the state itself (both sublattices turned over, m_s -> -m_s; and the sublattices
/// exchanged), each relaxed under the bias. With no bias, -m is the time-reversed state and
/// always has the same energy (every term of magnet.h is even in m, the Dzyaloshinskii term
/// too); under a bias it may not exist, and then it is an error at the body's key.
#pragma once
#include "materials/magnetic/state_choice.h"

namespace ty {

/// The state of a body of this magnet (the medium's state when `o` gives nothing). Throws
/// BadInput at the body's key when the asked-for state does not exist under this bias.
ChosenState choose_body_state(const Magnet& magnet, const BodyOrder& o, const std::array<double, 3>& bias);

}  // namespace ty

/// \file bloch_rules.h
/// \brief What a scene with Bloch x sides (solver/grid/boundaries/bloch.h) may hold; called
/// by validate_scene with the other whole-scene rules.
#pragma once
#include "io/scene/diagnostics.h"
#include "io/scene/scene.h"

namespace ty {

/// Media with rotated in-plane axes are refused (their coupled Ex-Ey step is not paired across
/// the seam); plane sources must travel along +y or -y (the sides set k_x). Magnetic bodies are
/// allowed: a run stops if a cell leaves the small-signal step (bloch_magnets.cpp).
void check_bloch(const Scene& s, Diagnostics& d);

}  // namespace ty

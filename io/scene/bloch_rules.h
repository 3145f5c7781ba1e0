/// \file bloch_rules.h
/// \brief What a scene with Bloch x sides (solver/grid/boundaries/bloch.h) may hold; called
/// by validate_scene with the other whole-scene rules.
#pragma once
#include "io/scene/diagnostics.h"
#include "io/scene/scene.h"

namespace ty {

/// Magnetic bodies are refused (the sine-cosine copies combine into one complex solution only
/// for a linear medium stepped the same way in both, and the magnetic cells' seam coupling is
/// not paired yet); plane sources must travel along +y or -y (the sides set k_x).
void check_bloch(const Scene& s, Diagnostics& d);

}  // namespace ty

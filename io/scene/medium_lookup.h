/// \file medium_lookup.h
/// \brief Which medium holds a point of a scene: the one lookup that the validation, the
/// E-update coefficients, the magnetic cells, the sources and the face planes all use.
#pragma once
#include "io/scene/scene.h"

namespace ty {

/// The medium index at internal position p (-1: vacuum). Bodies later in the list lie
/// on top. Positions outside the extent are moved to its nearest edge first, so bodies
/// continue straight through the absorbing layers.
int medium_at(const Scene& s, Vec2 p);
/// The body holding p (the last in the list; -1: vacuum), with the same clamping: a body
/// may carry its own magnetic order (Body::magnetic).
int body_at(const Scene& s, Vec2 p);

}  // namespace ty

/// \file crystal_permittivity.h
/// \brief A library crystal's permittivity in the scene frame: per crystal axis the library's
/// static value with its phonons (Lorentz terms) taken out of the background, so eps(0) stays
/// the recorded static value (eps_inf = eps(0) - sum of the axis's phonon strengths), turned by
/// the crystal's orientation. The grid holds tensors whose z axis is a principal axis, so one
/// crystal axis must lie along z (a cut, then any turn about z); the other two become u and v,
/// with u (the first of them in a, b, c order) at angle `rotate` from x.
#pragma once
#include "io/scene/crystals/crystal_axes.h"
#include "io/scene/crystals/crystal_table.h"
#include "io/scene/permittivity_model.h"

namespace ty {

/// Per crystal axis (0 a, 1 b, 2 c) the dispersive model of crystal c.
PermittivityModel crystal_axis_model(const Crystal& c, int axis);

/// The tensor of crystal c oriented by r; also where no crystal axis lies along z but the
/// turned tensor still has z as a principal axis (two axes alike, the third in the plane; or
/// all alike); false otherwise (to 1e-9).
bool crystal_permittivity(const Crystal& c, const Rot3& r, PermittivityTensor& out);

}  // namespace ty

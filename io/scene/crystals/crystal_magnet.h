/// \file crystal_magnet.h
/// \brief A library crystal's `magnet` block in scene axes (turned by R, crystal_axes.h),
/// with its thermal data at its reference temperature.
#pragma once
#include "io/scene/crystals/crystal_axes.h"
#include "io/scene/crystals/crystal_table.h"
#include "io/scene/scene.h"

namespace ty {

Magnet crystal_magnet(const Crystal& c, const Rot3& r = cut_rotation('c'));

}  // namespace ty

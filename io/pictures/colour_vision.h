/// \file colour_vision.h
/// \brief How a colour looks to a viewer with a colour-vision deficiency: the dichromat
/// simulation of Machado, Oliveira & Fernandes, "A Physiologically-based Model for
/// Simulation of Color Vision Deficiency", IEEE TVCG 15(6), 1291-1298 (2009), at severity
/// 1.0 (protanopia, deuteranopia, tritanopia): one 3x3 matrix per deficiency applied to
/// linear-light sRGB (the matrices of the paper's supplementary table), then clamped to
/// the gamut. Used to check that the colour maps stay readable (tests/io/pictures).
#pragma once
#include "io/pictures/colour_space.h"

namespace ty {

enum class Deficiency { protanopia, deuteranopia, tritanopia };

/// The colour `c` as the dichromat sees it, in sRGB.
Rgb simulate_deficiency(Rgb c, Deficiency d);

const char* to_string(Deficiency d);

}  // namespace ty

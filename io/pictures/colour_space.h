/// \file colour_space.h
/// \brief sRGB <-> CIE XYZ <-> CIELAB, the colour space terayee's colour maps are designed
/// and checked in: the sRGB transfer curve and primaries of IEC 61966-2-1:1999, CIE 1976
/// L*a*b* (CIE 15:2004, sec. 8.2.1) with the D65 white point, and the CIE 1976 colour
/// difference Delta E*ab (the Euclidean distance in L*a*b*).
#pragma once
#include <array>

namespace ty {

struct Rgb {
  double r = 0, g = 0, b = 0;  ///< sRGB, 0..1
};

using Lab = std::array<double, 3>;  ///< L*, a*, b*

/// The sRGB transfer curve (IEC 61966-2-1, sec. 5.2): encoded value <-> linear light.
double srgb_to_linear(double c);
double linear_to_srgb(double c);

/// CIELAB (D65 white) of a colour given as linear-light sRGB components.
Lab linear_rgb_to_lab(const std::array<double, 3>& rgb);
/// CIELAB (D65 white) of an sRGB colour, and back (out-of-gamut values are clamped; in_gamut
/// says whether they had to be).
Lab rgb_to_lab(Rgb c);
Rgb lab_to_rgb(const Lab& lab, bool* in_gamut = nullptr);

/// CIE 1976 Delta E*ab.
double delta_e(const Lab& a, const Lab& b);

}  // namespace ty

/// \file colour_space.cpp
/// \brief sRGB (IEC 61966-2-1) <-> XYZ <-> CIELAB (CIE 15:2004), see colour_space.h.
#include "io/pictures/colour_space.h"

#include <algorithm>
#include <cmath>

namespace ty {
namespace {

constexpr double kWhite[3] = {0.95047, 1.0, 1.08883};  // D65, Y = 1 (CIE 15, table T.3)
// CIE 15:2004 eq. 8.3-8.5: f(t) = t^(1/3) above (6/29)^3, else a line through 4/29
double lab_f(double t) { return t > 216.0 / 24389 ? std::cbrt(t) : (24389.0 / 27 * t + 16) / 116; }
double lab_finv(double f) { return f * f * f > 216.0 / 24389 ? f * f * f : (116 * f - 16) * 27 / 24389; }

}  // namespace

double srgb_to_linear(double c) { return c <= 0.04045 ? c / 12.92 : std::pow((c + 0.055) / 1.055, 2.4); }
double linear_to_srgb(double c) { return c <= 0.0031308 ? 12.92 * c : 1.055 * std::pow(c, 1 / 2.4) - 0.055; }

Lab linear_rgb_to_lab(const std::array<double, 3>& rgb) {
  const double r = rgb[0], g = rgb[1], b = rgb[2];
  // IEC 61966-2-1 sec. 5.2: linear sRGB to XYZ (D65)
  const double X = 0.4124564 * r + 0.3575761 * g + 0.1804375 * b;
  const double Y = 0.2126729 * r + 0.7151522 * g + 0.0721750 * b;
  const double Z = 0.0193339 * r + 0.1191920 * g + 0.9503041 * b;
  const double fx = lab_f(X / kWhite[0]), fy = lab_f(Y / kWhite[1]), fz = lab_f(Z / kWhite[2]);
  return {116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)};
}

Lab rgb_to_lab(Rgb c) { return linear_rgb_to_lab({srgb_to_linear(c.r), srgb_to_linear(c.g), srgb_to_linear(c.b)}); }

Rgb lab_to_rgb(const Lab& lab, bool* in_gamut) {
  const double fy = (lab[0] + 16) / 116, fx = fy + lab[1] / 500, fz = fy - lab[2] / 200;
  const double X = kWhite[0] * lab_finv(fx), Y = kWhite[1] * lab_finv(fy), Z = kWhite[2] * lab_finv(fz);
  double rgb[3] = {3.2404542 * X - 1.5371385 * Y - 0.4985314 * Z, -0.9692660 * X + 1.8760108 * Y + 0.0415560 * Z,
                   0.0556434 * X - 0.2040259 * Y + 1.0572252 * Z};
  bool ok = true;
  for (double& v : rgb) {
    if (v < -1e-4 || v > 1 + 1e-4) ok = false;
    v = linear_to_srgb(std::clamp(v, 0.0, 1.0));
  }
  if (in_gamut) *in_gamut = ok;
  return {rgb[0], rgb[1], rgb[2]};
}

double delta_e(const Lab& a, const Lab& b) { return std::hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]); }

}  // namespace ty

/// \file colour_vision.cpp
/// \brief The severity-1.0 matrices of Machado, Oliveira & Fernandes (IEEE TVCG 15, 1291,
/// 2009), on linear sRGB (see colour_vision.h).
#include "io/pictures/colour_vision.h"

#include <algorithm>

namespace ty {
namespace {

using Matrix = double[3][3];
constexpr Matrix kProtanopia = {
    {0.152286, 1.052583, -0.204868}, {0.114503, 0.786281, 0.099216}, {-0.003882, -0.048116, 1.051998}};
constexpr Matrix kDeuteranopia = {
    {0.367322, 0.860646, -0.227968}, {0.280085, 0.672501, 0.047413}, {-0.011820, 0.042940, 0.968881}};
constexpr Matrix kTritanopia = {
    {1.255528, -0.076749, -0.178779}, {-0.078411, 0.930809, 0.147602}, {0.004733, 0.691367, 0.303900}};

}  // namespace

Rgb simulate_deficiency(Rgb c, Deficiency d) {
  const Matrix& m = d == Deficiency::protanopia     ? kProtanopia
                    : d == Deficiency::deuteranopia ? kDeuteranopia
                                                    : kTritanopia;
  const double lin[3] = {srgb_to_linear(c.r), srgb_to_linear(c.g), srgb_to_linear(c.b)};
  double out[3];
  for (int i = 0; i < 3; ++i)
    out[i] = linear_to_srgb(std::clamp(m[i][0] * lin[0] + m[i][1] * lin[1] + m[i][2] * lin[2], 0.0, 1.0));
  return {out[0], out[1], out[2]};
}

const char* to_string(Deficiency d) {
  return d == Deficiency::protanopia ? "protanopia" : d == Deficiency::deuteranopia ? "deuteranopia" : "tritanopia";
}

}  // namespace ty

/// \file colour_map.cpp
/// \brief The "tide" and "dusk" colour maps (see colour_map.h) and the sRGB <-> CIELAB
/// conversions they are built in (IEC 61966-2-1 sRGB transfer curve and primaries, CIE 1976
/// L*a*b* with the D65 white point).
#include "io/pictures/colour_map.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>

namespace ty {
namespace {

constexpr double kPi = 3.14159265358979323846;
constexpr double kWhite[3] = {0.95047, 1.0, 1.08883};  // D65, Y = 1

double to_linear(double c) { return c <= 0.04045 ? c / 12.92 : std::pow((c + 0.055) / 1.055, 2.4); }
double to_srgb(double c) { return c <= 0.0031308 ? 12.92 * c : 1.055 * std::pow(c, 1 / 2.4) - 0.055; }
double lab_f(double t) { return t > 216.0 / 24389 ? std::cbrt(t) : (24389.0 / 27 * t + 16) / 116; }
double lab_finv(double f) { return f * f * f > 216.0 / 24389 ? f * f * f : (116 * f - 16) * 27 / 24389; }

using Lab = std::array<double, 3>;
double distance(const Lab& a, const Lab& b) { return std::hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]); }

// --- "tide": Moreland's diverging interpolation in Msh (M = |Lab|, s = acos(L/M), h = atan2(b, a)) ---
struct Msh {
  double M, s, h;
};
Msh to_msh(Rgb c) {
  const Lab l = rgb_to_lab(c);
  const double M = std::hypot(l[0], l[1], l[2]);
  return {M, std::acos(l[0] / M), std::atan2(l[2], l[1])};
}
Rgb from_msh(const Msh& m) {
  return lab_to_rgb({m.M * std::cos(m.s), m.M * std::sin(m.s) * std::cos(m.h), m.M * std::sin(m.s) * std::sin(m.h)});
}
// Moreland 2009, eq. of sec. 4: the hue to use where one end is unsaturated
double adjust_hue(const Msh& sat, double M_unsat) {
  if (sat.M >= M_unsat) return sat.h;
  const double spin = sat.s * std::sqrt(M_unsat * M_unsat - sat.M * sat.M) / (sat.M * std::sin(sat.s));
  return sat.h > -kPi / 3 ? sat.h + spin : sat.h - spin;
}
Rgb diverging(Rgb c1, Rgb c2, double t) {
  Msh a = to_msh(c1), b = to_msh(c2);
  double dh = std::abs(a.h - b.h);
  if (dh > kPi) dh = 2 * kPi - dh;
  if (a.s > 0.05 && b.s > 0.05 && dh > kPi / 3) {  // through white
    const double mid = std::max({a.M, b.M, 88.0});
    if (t < 0.5) {
      b = {mid, 0, 0};
      t = 2 * t;
    } else {
      a = {mid, 0, 0};
      t = 2 * t - 1;
    }
  }
  if (a.s < 0.05 && b.s > 0.05) a.h = adjust_hue(b, a.M);
  else if (b.s < 0.05 && a.s > 0.05) b.h = adjust_hue(a, b.M);
  return from_msh({(1 - t) * a.M + t * b.M, (1 - t) * a.s + t * b.s, (1 - t) * a.h + t * b.h});
}

// --- "dusk": L* linear, hue turning from violet through blue, teal and green to yellow ---
Lab dusk_path(double u) {
  const double L = 10 + 86 * u;
  const double h = (300 - 205 * u) * kPi / 180;
  // the wanted chroma, or the largest inside the sRGB gamut where that is less (found by
  // bisection, so that the path stays smooth and its arc length means what it says)
  auto inside = [&](double C) {
    bool ok = false;
    lab_to_rgb({L, C * std::cos(h), C * std::sin(h)}, &ok);
    return ok;
  };
  double C = 32 + 38 * u;
  if (!inside(C)) {
    double lo = 0, hi = C;
    for (int k = 0; k < 50; ++k) (inside(0.5 * (lo + hi)) ? lo : hi) = 0.5 * (lo + hi);
    C = lo;
  }
  return {L, C * std::cos(h), C * std::sin(h)};
}

}  // namespace

std::array<double, 3> rgb_to_lab(Rgb c) {
  const double r = to_linear(c.r), g = to_linear(c.g), b = to_linear(c.b);
  const double X = 0.4124564 * r + 0.3575761 * g + 0.1804375 * b;
  const double Y = 0.2126729 * r + 0.7151522 * g + 0.0721750 * b;
  const double Z = 0.0193339 * r + 0.1191920 * g + 0.9503041 * b;
  const double fx = lab_f(X / kWhite[0]), fy = lab_f(Y / kWhite[1]), fz = lab_f(Z / kWhite[2]);
  return {116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)};
}

Rgb lab_to_rgb(const std::array<double, 3>& lab, bool* in_gamut) {
  const double fy = (lab[0] + 16) / 116, fx = fy + lab[1] / 500, fz = fy - lab[2] / 200;
  const double X = kWhite[0] * lab_finv(fx), Y = kWhite[1] * lab_finv(fy), Z = kWhite[2] * lab_finv(fz);
  double rgb[3] = {3.2404542 * X - 1.5371385 * Y - 0.4985314 * Z, -0.9692660 * X + 1.8760108 * Y + 0.0415560 * Z,
                   0.0556434 * X - 0.2040259 * Y + 1.0572252 * Z};
  bool ok = true;
  for (double& v : rgb) {
    if (v < -1e-4 || v > 1 + 1e-4) ok = false;
    v = to_srgb(std::clamp(v, 0.0, 1.0));
  }
  if (in_gamut) *in_gamut = ok;
  return {rgb[0], rgb[1], rgb[2]};
}

ColourMap::ColourMap(std::string name, Kind kind) : name_(std::move(name)), kind_(kind) {
  if (kind == Kind::diverging) {
    const Rgb blue{0.230, 0.299, 0.754}, red{0.706, 0.016, 0.150};  // Moreland 2009, table of end points
    for (int k = 0; k < kSize; ++k) table_[k] = diverging(blue, red, (k + 0.5) / kSize);
  } else {
    // sample the path finely, then take kSize points at equal CIELAB arc length
    const int n = 4096;
    std::vector<Lab> path(n);
    std::vector<double> arc(n, 0.0);
    for (int q = 0; q < n; ++q) path[q] = dusk_path(q / (n - 1.0));
    for (int q = 1; q < n; ++q) arc[q] = arc[q - 1] + distance(path[q], path[q - 1]);
    int q = 0;
    for (int k = 0; k < kSize; ++k) {
      const double s = arc.back() * (k + 0.5) / kSize;
      while (q < n - 2 && arc[q + 1] < s) ++q;
      const double w = (s - arc[q]) / std::max(arc[q + 1] - arc[q], 1e-12);
      Lab l;
      for (int c = 0; c < 3; ++c) l[c] = (1 - w) * path[q][c] + w * path[q + 1][c];
      table_[k] = lab_to_rgb(l);
    }
  }
  for (int k = 0; k < kSize; ++k) {
    auto byte = [](double v) { return static_cast<uint32_t>(std::lround(std::clamp(v, 0.0, 1.0) * 255)); };
    packed_[k] = 0xff000000u | byte(table_[k].r) << 16 | byte(table_[k].g) << 8 | byte(table_[k].b);
  }
}

const ColourMap& ColourMap::tide() {
  static const ColourMap m("tide", Kind::diverging);
  return m;
}

const ColourMap& ColourMap::dusk() {
  static const ColourMap m("dusk", Kind::sequential);
  return m;
}

Rgb ColourMap::at(double t) const {
  if (!(t == t)) return {0.5, 0.5, 0.5};
  const int k = t <= 0 ? 0 : t >= 1 ? kSize - 1 : static_cast<int>(t * kSize);
  return table_[k];
}

double ColourMap::invert(Rgb c) const {
  const Lab target = rgb_to_lab(c);
  double best = std::numeric_limits<double>::max();
  int at = 0;
  for (int k = 0; k < kSize; ++k) {
    const double d = distance(rgb_to_lab(table_[k]), target);
    if (d < best) best = d, at = k;
  }
  return (at + 0.5) / kSize;
}

}  // namespace ty

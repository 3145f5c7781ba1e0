/// \file colour_map.cpp
/// \brief The "diverging" and "sequential" colour maps (see colour_map.h), designed in
/// CIELAB (colour_space.h).
#include "io/pictures/colour_map.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <limits>
#include <vector>

#include "io/scene/constants.h"
#include "io/scene/diagnostics.h"

namespace ty {
namespace {

constexpr double kDeg = constants::pi / 180;

// --- "diverging": one straight-lightness, bowed-chroma path per side, same (L*, C*) on both ---
constexpr double kCentreL = 95, kEndL = 38;  // L* at zero and at the ends
constexpr double kEndC = 24;                 // C* at the ends: the largest the teal hue holds in sRGB at L* = 38
constexpr double kBulge = 50;                // C*(u) = kBulge u (1 - u) + kEndC u: more colour mid-side, in gamut
constexpr double kNegativeHue = 200 * kDeg, kPositiveHue = 55 * kDeg;  // teal, copper orange

// --- "sequential": L* linear, hue turning from violet through blue, teal and green to yellow ---
Lab sequential_path(double u) {
  const double L = 10 + 86 * u;
  const double h = (300 - 205 * u) * kDeg;
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

/// kSize colours at equal CIELAB arc length along path(v), v in [0, 1].
std::array<Rgb, ColourMap::kSize> equal_steps(const std::function<Lab(double)>& path) {
  const int n = 8192;
  std::vector<Lab> p(n);
  std::vector<double> arc(n, 0.0);
  for (int q = 0; q < n; ++q) p[q] = path(q / (n - 1.0));
  for (int q = 1; q < n; ++q) arc[q] = arc[q - 1] + delta_e(p[q], p[q - 1]);
  std::array<Rgb, ColourMap::kSize> out;
  int q = 0;
  for (int k = 0; k < ColourMap::kSize; ++k) {
    const double s = arc.back() * (k + 0.5) / ColourMap::kSize;
    while (q < n - 2 && arc[q + 1] < s) ++q;
    const double w = (s - arc[q]) / std::max(arc[q + 1] - arc[q], 1e-12);
    Lab l;
    for (int c = 0; c < 3; ++c) l[c] = (1 - w) * p[q][c] + w * p[q + 1][c];
    out[k] = lab_to_rgb(l);
  }
  return out;
}

}  // namespace

Lab diverging_path(double s) {
  const double u = std::min(1.0, std::abs(s));
  const double L = kCentreL - (kCentreL - kEndL) * u, C = kBulge * u * (1 - u) + kEndC * u;
  const double h = s < 0 ? kNegativeHue : kPositiveHue;
  return {L, C * std::cos(h), C * std::sin(h)};
}

ColourMap::ColourMap(Kind kind) : name_(kind == Kind::diverging ? "diverging" : "sequential"), kind_(kind) {
  if (kind == Kind::diverging)
    table_ = equal_steps([](double v) { return diverging_path(2 * v - 1); });
  else
    table_ = equal_steps(sequential_path);
  for (int k = 0; k < kSize; ++k) {
    auto byte = [](double v) { return static_cast<uint32_t>(std::lround(std::clamp(v, 0.0, 1.0) * 255)); };
    packed_[k] = 0xff000000u | byte(table_[k].r) << 16 | byte(table_[k].g) << 8 | byte(table_[k].b);
  }
}

const ColourMap& ColourMap::diverging() {
  static const ColourMap m(Kind::diverging);
  return m;
}

const ColourMap& ColourMap::sequential() {
  static const ColourMap m(Kind::sequential);
  return m;
}

ColourMap::Kind ColourMap::kind_named(const std::string& name) {
  if (name == "diverging") return Kind::diverging;
  if (name == "sequential") return Kind::sequential;
  if (name == "tide")
    throw BadInput("terayee render: error: --colours: the map 'tide' is now called 'diverging' (and is redrawn)");
  if (name == "dusk") throw BadInput("terayee render: error: --colours: the map 'dusk' is now called 'sequential'");
  throw BadInput(fmt::format("terayee render: error: --colours: no colour map '{}' (diverging or sequential)", name));
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
    const double d = delta_e(rgb_to_lab(table_[k]), target);
    if (d < best) best = d, at = k;
  }
  return (at + 0.5) / kSize;
}

}  // namespace ty

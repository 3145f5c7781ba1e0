/// \file test_colour_map.cpp
/// \brief The colour maps against the colour science they are built on: the sRGB and CIELAB
/// formulas (IEC 61966-2-1, CIE 15:2004) at known values; the sequential map's monotonic
/// lightness at an even pace (Kindlmann, Reinhard & Creem, IEEE Vis 2002); the diverging map's
/// equal Delta E*ab steps, symmetric lightness, and its two signs kept apart under the
/// dichromat simulations of Machado, Oliveira & Fernandes (IEEE TVCG 15, 1291, 2009).
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <vector>

#include "io/pictures/colour_map.h"
#include "io/pictures/colour_vision.h"
#include "io/scene/diagnostics.h"

using namespace ty;

namespace {

Lab lab_at(const ColourMap& m, int k) { return rgb_to_lab(m.at((k + 0.5) / ColourMap::kSize)); }

}  // namespace

TEST_CASE("colour space: sRGB to CIELAB at known values (IEC 61966-2-1, CIE 15)") {
  // white is L* = 100, a* = b* = 0 (the D65 white point of sRGB is the CIELAB reference white)
  const Lab white = rgb_to_lab({1, 1, 1});
  CHECK(white[0] == doctest::Approx(100).epsilon(1e-4));
  CHECK(std::abs(white[1]) < 0.01);
  CHECK(std::abs(white[2]) < 0.01);
  // sRGB red (1, 0, 0): Y = 0.2126729, so L* = 116 Y^(1/3) - 16 = 53.24; a* = 80.09, b* = 67.20
  const Lab red = rgb_to_lab({1, 0, 0});
  CHECK(red[0] == doctest::Approx(116 * std::cbrt(0.2126729) - 16).epsilon(1e-9));
  CHECK(red[1] == doctest::Approx(80.09).epsilon(2e-4));
  CHECK(red[2] == doctest::Approx(67.20).epsilon(2e-4));
  // the sRGB curve: 0.5 encoded is ((0.5 + 0.055) / 1.055)^2.4 = 0.21404 linear
  CHECK(srgb_to_linear(0.5) == doctest::Approx(0.21404).epsilon(1e-4));
  const Rgb back = lab_to_rgb(rgb_to_lab({0.3, 0.6, 0.9}));
  CHECK(back.r == doctest::Approx(0.3).epsilon(1e-6));
  CHECK(back.g == doctest::Approx(0.6).epsilon(1e-6));
  CHECK(back.b == doctest::Approx(0.9).epsilon(1e-6));
}

TEST_CASE("colour maps: the sequential map rises in lightness at an even perceptual pace") {
  const ColourMap& seq = ColourMap::sequential();
  std::vector<double> steps;
  bool monotone = true;
  for (int k = 1; k < ColourMap::kSize; ++k) {
    monotone = monotone && lab_at(seq, k)[0] > lab_at(seq, k - 1)[0];
    steps.push_back(delta_e(lab_at(seq, k), lab_at(seq, k - 1)));
  }
  CHECK(monotone);
  double lo = 1e9, hi = 0, mean = 0;
  for (double d : steps) lo = std::min(lo, d), hi = std::max(hi, d), mean += d / steps.size();
  MESSAGE("sequential: CIELAB step between entries ", mean, " (", lo, " to ", hi, ")");
  // equal steps but where the sRGB gamut bends the path (a corner cut by the interpolation)
  CHECK(hi < 1.15 * mean);
  CHECK(lo > 0.7 * mean);
  CHECK(lab_at(seq, 0)[0] < 15);
  CHECK(lab_at(seq, ColourMap::kSize - 1)[0] > 90);
  CHECK(seq.name() == "sequential");
}

TEST_CASE("colour maps: the diverging map has equal Delta E steps and the same lightness on both sides") {
  const ColourMap& div = ColourMap::diverging();
  CHECK(div.name() == "diverging");
  const int n = ColourMap::kSize, mid = n / 2;  // entries mid - 1 and mid straddle zero
  std::vector<double> steps;
  for (int k = 1; k < n; ++k)
    if (k != mid) steps.push_back(delta_e(lab_at(div, k), lab_at(div, k - 1)));
  double lo = 1e9, hi = 0, mean = 0;
  for (double d : steps) lo = std::min(lo, d), hi = std::max(hi, d), mean += d / steps.size();
  const double centre = delta_e(lab_at(div, mid), lab_at(div, mid - 1));
  MESSAGE("diverging: Delta E*ab between entries ", mean, " (", lo, " to ", hi, "), across zero ", centre);
  // the path is re-spaced to equal arc length and stays inside the sRGB gamut: the steps
  // agree to 1% (a clipped or unspaced path misses this by tens of percent)
  CHECK(hi < 1.01 * mean);
  CHECK(lo > 0.99 * mean);
  // the two entries beside zero have the same L* (the lightness turns there) and differ by
  // hue only: their chord is shorter than the arc, but not by more than a quarter
  CHECK(centre > 0.7 * mean);
  CHECK(centre < 1.01 * mean);
  // lightness: symmetric about zero, falling monotonically towards both ends, light centre
  // and dark ends; the hue says the sign (teal below zero, orange above)
  for (int k = 0; k < mid; ++k) {
    const Lab neg = lab_at(div, k), pos = lab_at(div, n - 1 - k);
    CHECK(neg[0] == doctest::Approx(pos[0]).epsilon(1e-3));
    CHECK(std::hypot(neg[1], neg[2]) == doctest::Approx(std::hypot(pos[1], pos[2])).epsilon(1e-3));
    if (k > 0) CHECK(neg[0] > lab_at(div, k - 1)[0]);
    CHECK(neg[1] < 0);  // teal: green-blue quadrant
    CHECK(neg[2] < 0);
    CHECK(pos[1] > 0);  // orange: red-yellow quadrant
    CHECK(pos[2] > 0);
  }
  CHECK(lab_at(div, mid)[0] > 94);
  CHECK(lab_at(div, 0)[0] < 39);
  // nothing like a blue-to-red map: the ends' hues (200 and 55 deg) are 145 deg apart and
  // neither is a blue (~ 270-310 deg) or a red (~ 20-40 deg)
  const Lab a = lab_at(div, 0), b = lab_at(div, n - 1);
  const double ha = std::atan2(a[2], a[1]) * 180 / 3.14159265358979,
               hb = std::atan2(b[2], b[1]) * 180 / 3.14159265358979;
  CHECK(ha + 360 == doctest::Approx(200).epsilon(0.005));
  CHECK(hb == doctest::Approx(55).epsilon(0.005));
}

TEST_CASE("colour vision: the Machado 2009 matrices, and the diverging map read by dichromats") {
  // the matrices applied by hand: sRGB red (linear 1, 0, 0) becomes each matrix's first column
  const Rgb pr = simulate_deficiency({1, 0, 0}, Deficiency::protanopia);
  CHECK(pr.r == doctest::Approx(linear_to_srgb(0.152286)).epsilon(1e-9));
  CHECK(pr.g == doctest::Approx(linear_to_srgb(0.114503)).epsilon(1e-9));
  CHECK(pr.b == 0);                                                       // -0.003882, clamped
  const Rgb tb = simulate_deficiency({0, 0, 1}, Deficiency::tritanopia);  // the third column
  CHECK(tb.g == doctest::Approx(linear_to_srgb(0.147602)).epsilon(1e-9));
  CHECK(tb.b == doctest::Approx(linear_to_srgb(0.303900)).epsilon(1e-9));
  const ColourMap& div = ColourMap::diverging();
  const int n = ColourMap::kSize, mid = n / 2;
  for (Deficiency d : {Deficiency::protanopia, Deficiency::deuteranopia, Deficiency::tritanopia}) {
    // the rows of each matrix sum to one: white and greys are seen unchanged
    const Rgb w = simulate_deficiency({1, 1, 1}, d);
    CHECK(w.r == doctest::Approx(1).epsilon(1e-5));
    CHECK(w.b == doctest::Approx(1).epsilon(1e-5));
    auto seen = [&](int k) { return rgb_to_lab(simulate_deficiency(div.at((k + 0.5) / n), d)); };
    // the two ends stay apart (Delta E*ab; about 2.3 is a just-noticeable difference,
    // Sharma, Digital Color Imaging Handbook, sec. 1.7), and so do the two sides at half scale
    const double ends = delta_e(seen(0), seen(n - 1)), half = delta_e(seen(n / 4), seen(n - 1 - n / 4));
    bool monotone = true;
    for (int k = 1; k < mid; ++k)
      monotone = monotone && seen(k)[0] > seen(k - 1)[0] && seen(n - 1 - k)[0] > seen(n - k)[0];
    MESSAGE(std::string(to_string(d)), ": the ends ", ends, " apart, the quarter points ", half,
            "; L* monotonic on each side: ", monotone);
    CHECK(ends > 20);
    CHECK(half > 10);
    CHECK(monotone);
  }
}

TEST_CASE("colour maps: the old names are refused, naming the new ones") {
  CHECK(ColourMap::kind_named("diverging") == ColourMap::Kind::diverging);
  CHECK(ColourMap::kind_named("sequential") == ColourMap::Kind::sequential);
  auto message = [](const std::string& name) {
    try {
      ColourMap::kind_named(name);
    } catch (const BadInput& e) {
      return std::string(e.what());
    }
    return std::string();
  };
  CHECK(message("tide").find("'diverging'") != std::string::npos);
  CHECK(message("dusk").find("'sequential'") != std::string::npos);
  CHECK(message("rainbow").find("diverging or sequential") != std::string::npos);
}

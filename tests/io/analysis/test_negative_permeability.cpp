/// \file test_negative_permeability.cpp
/// \brief The shaded bands of spectrum plots against the Polder tensor of a saturated ferrite
/// (Pozar, Microwave Engineering, 4th ed., sec. 9.3): across the bias the wave that carries the
/// gyrotropy sees mu_perp = (mu^2 - kappa^2) / mu < 0 for sqrt(f0 (f0 + fm)) < f < f0 + fm.
/// BaFe12O19 of the crystal library, 0.3 T along c: f0 = 55.985 GHz, fm = 13.157 GHz.
#include <doctest/doctest.h>

#include <cmath>

#include "io/analysis/negative_permeability.h"
#include "io/scene/scene_reader.h"

namespace {

constexpr double kGamma = 2 * 13.99624493;  // GHz/T, g muB / h (CODATA 2018)
constexpr double kF0 = kGamma * 2.0, kFm = kGamma * 0.47;

}  // namespace

TEST_CASE("negative bands of the plots: the Ez wave with the bias along z, the Hz wave with it in the plane") {
  const std::string path = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/hexaferrite-voigt.yaml";
  // bias along z: the Ez wave has the band, the Hz wave (mu_zz = 1) none
  ty::Scene s = ty::read_scene(path, {});
  auto b = ty::negative_mu_bands(s, 50e9, 75e9, 0, ty::Component::Ez);
  REQUIRE(b.size() == 1);
  CHECK(b[0].first == doctest::Approx(std::sqrt(kF0 * (kF0 + kFm))).epsilon(1e-5));
  CHECK(b[0].second == doctest::Approx(kF0 + kFm).epsilon(1e-5));
  CHECK(ty::negative_mu_bands(s, 50e9, 75e9, 0, ty::Component::Hz).empty());
  // c axis and bias along y, waves along x: the gyrotropy moves to the Hz wave (it had no band shaded)
  s = ty::read_scene(path, {"bias=[0, 0.3 T, 0]", "media.hexa.cut=a"});
  CHECK(ty::negative_mu_bands(s, 50e9, 75e9, 0, ty::Component::Ez).empty());
  b = ty::negative_mu_bands(s, 50e9, 75e9, 0, ty::Component::Hz);
  REQUIRE(b.size() == 1);
  CHECK(b[0].first == doctest::Approx(std::sqrt(kF0 * (kF0 + kFm))).epsilon(1e-5));
  CHECK(b[0].second == doctest::Approx(kF0 + kFm).epsilon(1e-5));
}

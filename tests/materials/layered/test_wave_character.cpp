/// \file test_wave_character.cpp
/// \brief Iso-frequency curves and normal-incidence waves against the Polder tensor of a
/// saturated ferrite (Pozar, Microwave Engineering, 4th ed., sec. 9.1-9.3; Gurevich & Melkov,
/// Magnetization Oscillations and Waves, sec. 1.6): mu = 1 + w0 wm / (w0^2 - w^2),
/// kappa = w wm / (w0^2 - w^2), mu_zz = 1 for a bias along z. Across the bias the wave sees
/// mu_perp = (mu^2 - kappa^2) / mu (a circle of radius^2 eps mu_perp; no real k where
/// mu_perp < 0), along it the two circular waves see mu -+ kappa (Faraday rotation), and a
/// diagonal tensor of mixed signs gives the hyperbola of Smith & Schurig, Phys. Rev. Lett.
/// 90, 077405 (2003).
#include <doctest/doctest.h>

#include <cmath>

#include "materials/layered/wave_character.h"

using namespace ty;
using cd = std::complex<double>;

namespace {

struct Polder {
  double mu, kappa;
};
Polder polder(double w0, double wm, double w) { return {1 + w0 * wm / (w0 * w0 - w * w), w * wm / (w0 * w0 - w * w)}; }

/// The Polder tensor with the bias along axis b (0: x, 1: y, 2: z), exp(-i w t) convention.
Mat3c polder_tensor(const Polder& p, int b) {
  const int u = (b + 1) % 3, v = (b + 2) % 3;  // (u, v, b) right-handed
  Mat3c m = Mat3c::Identity();
  m(u, u) = m(v, v) = p.mu;
  m(u, v) = cd(0, p.kappa), m(v, u) = cd(0, -p.kappa);
  return m;
}

}  // namespace

TEST_CASE("wave character: a gyrotropic medium is labelled by mu_perp, not by the sign of mu (Polder)") {
  const double w0 = 1.0, wm = 0.25, eps = 17;  // mu_perp < 0 for sqrt(w0 (w0 + wm)) < w < w0 + wm
  // just above the line: mu < 0 but mu_perp > 0 (the wave propagates); the old diagonal rule said "evanescent"
  Polder p = polder(w0, wm, 1.05);
  double mu_perp = (p.mu * p.mu - p.kappa * p.kappa) / p.mu;
  REQUIRE(p.mu < 0);
  REQUIRE(mu_perp > 0);
  Mat3c mu = polder_tensor(p, 2);
  CHECK(ez_iso_curve(eps, mu) == IsoCurve::ellipse);
  for (double kt : {0.0, 0.3, 0.9}) {  // a circle: kn^2 + kt^2 = eps mu_perp, real kn
    const Refraction r = ez_refraction(eps, mu, 1, kt);
    CHECK(is_propagating(r));
    CHECK((r.kn * r.kn).real() + kt * kt == doctest::Approx(eps * mu_perp).epsilon(1e-9));
  }
  // inside the band: mu > 0 but mu_perp < 0 (no real k at all); the old rule said "ellipse"
  p = polder(w0, wm, 1.2);
  mu_perp = (p.mu * p.mu - p.kappa * p.kappa) / p.mu;
  REQUIRE(p.mu > 0);
  REQUIRE(mu_perp < 0);
  mu = polder_tensor(p, 2);
  CHECK(ez_iso_curve(eps, mu) == IsoCurve::none);
  const Refraction r = ez_refraction(eps, mu, 1, 0.5);
  CHECK_FALSE(is_propagating(r));
  CHECK(decay_length(r) == doctest::Approx(1 / std::sqrt(0.25 - eps * mu_perp)).epsilon(1e-9));
  // the Hz wave of the same medium sees mu_zz = 1 and eps: a circle
  CHECK(hz_iso_curve(eps * Mat3c::Identity(), 1.0) == IsoCurve::ellipse);
  // Smith & Schurig: mu_xx < 0 < mu_yy is a hyperbola, both negative no branch
  Mat3c d = Mat3c::Identity();
  d(0, 0) = -2, d(1, 1) = 3;
  CHECK(ez_iso_curve(1.0, d) == IsoCurve::hyperbola);
  d(1, 1) = -3;
  CHECK(ez_iso_curve(1.0, d) == IsoCurve::none);
}

TEST_CASE("normal-incidence waves: Voigt gives eps mu_perp and eps mu_zz, Faraday gives eps (mu -+ kappa)") {
  const double w0 = 1.0, wm = 0.25, eps = 17;
  for (double w : {0.5, 1.05, 1.2, 1.4}) {
    const Polder p = polder(w0, wm, w);
    const double mu_perp = (p.mu * p.mu - p.kappa * p.kappa) / p.mu;
    for (int normal : {0, 1}) {
      // bias along z, across the normal: the Ez wave (mu_perp) and the Hz wave (mu_zz = 1) apart
      NormalModes v = normal_modes(eps * Mat3c::Identity(), polder_tensor(p, 2), normal);
      CHECK_FALSE(v.coupled);
      CHECK(v.n2[0].real() == doctest::Approx(eps * mu_perp).epsilon(1e-9));
      CHECK(v.n2[1].real() == doctest::Approx(eps).epsilon(1e-9));
      // bias along the normal (Faraday): circular waves, (k/k0)^2 = eps (mu -+ kappa) (Pozar sec. 9.2)
      const NormalModes f = normal_modes(eps * Mat3c::Identity(), polder_tensor(p, normal), normal);
      CHECK(f.coupled);
      const double a = eps * (p.mu - p.kappa), b = eps * (p.mu + p.kappa);
      CHECK(f.n2[0].real() == doctest::Approx(std::min(a, b)).epsilon(1e-9));
      CHECK(f.n2[1].real() == doctest::Approx(std::max(a, b)).epsilon(1e-9));
      // bias in the plane across the normal: the Hz wave sees mu_perp (H_n removed), the Ez wave mu_tt = 1
      const NormalModes h = normal_modes(eps * Mat3c::Identity(), polder_tensor(p, 1 - normal), normal);
      CHECK_FALSE(h.coupled);
      CHECK(h.n2[0].real() == doctest::Approx(eps).epsilon(1e-9));
      CHECK(h.n2[1].real() == doctest::Approx(eps * mu_perp).epsilon(1e-9));
    }
  }
}

/// \file test_angular_spectrum.cpp
/// \brief Sums over plane-wave spectra and the refraction of the Ez wave, against closed forms:
///  - a line source seen through a vacuum layer is the free-space field |H0^(1)(k0 r)|
///    (the Sommerfeld-Weyl integral; Chew, Waves and Fields in Inhomogeneous Media, sec. 2.2;
///    H0 from the standard library's Bessel functions);
///  - a thick layer at a large evanescent wavenumber transmits exp(-kappa d), the transfer
///    matrix staying well conditioned where exp(+kappa d) would overflow a plain product;
///  - Snell's law for an isotropic dielectric (Born & Wolf sec. 1.5.1), and for a lossless
///    hyperbolic medium mu = diag(mu_xx, mu_yy) the power flow S ~ (k_x/mu_yy, k_y/mu_xx)
///    with k_x^2/mu_yy + k_y^2/mu_xx = eps k0^2 (Smith & Schurig, Phys. Rev. Lett. 90,
///    077405 (2003)): negative refraction when mu_yy < 0 < mu_xx.
#include <doctest/doctest.h>

#include <cmath>

#include "io/scene/units.h"
#include "materials/layered/angular_spectrum.h"
#include "materials/layered/refraction.h"

using namespace ty;

TEST_CASE("a line source through a vacuum layer is the free-space Hankel field") {
  const double f = 262.75e9, w = 2 * constants::pi * f, k0 = w / constants::c0;
  LayerStack st;
  st.layers = {{Mat3c::Identity(), Mat3c::Identity(), 1e-3}};
  const double a = 0.5e-3;
  const LineImage im = line_source_image(st, w, a, 0.0, 4e-3);
  double worst = 0;
  for (size_t q = 0; q < im.s.size(); ++q) {
    const double r = a + 1e-3 + im.s[q];
    const double h2 = std::pow(std::cyl_bessel_j(0.0, k0 * r), 2) + std::pow(std::cyl_neumann(0.0, k0 * r), 2);
    worst = std::max(worst, std::abs(im.intensity[q] / (constants::pi * constants::pi * h2) - 1));  // the sum omits H0's 1/pi
  }
  MESSAGE("worst relative error against |H0|^2: " << worst);
  CHECK(worst < 1e-4);
  CHECK(im.peak == doctest::Approx(0.0));  // no focus: the intensity falls from the face on
}

TEST_CASE("transfer matrix: a thick layer passes an evanescent wave as exp(-kappa d)") {
  const double f = 262.75e9, w = 2 * constants::pi * f, k0 = w / constants::c0;
  LayerStack st;
  const double d = 3e-3, eps = 2.0, kt = 6.0;  // kappa d k0 ~ 95: exp(+95) would swamp a plain product
  st.layers = {{eps * Mat3c::Identity(), Mat3c::Identity(), d}};
  const StackResponse r = stack_response_kt(st, w, kt);
  // single interface pair, Ez wave: t = t12 t23 exp(-kappa d) / (1 - r21 r23 exp(-2 kappa d)) ~ t12 t23 exp(-kappa d)
  const double k1 = std::sqrt(kt * kt - 1), k2 = std::sqrt(kt * kt - eps);
  const std::complex<double> q1(0, k1), q2(0, k2);  // normal wavenumbers (units of k0), i kappa
  const std::complex<double> t12 = 2.0 * q1 / (q1 + q2), t23 = 2.0 * q2 / (q2 + q1);
  const std::complex<double> expected = t12 * t23 * std::exp(-k2 * k0 * d);
  MESSAGE("|t| = " << std::abs(r.t[0][0]) << ", expected " << std::abs(expected));
  CHECK(std::abs(r.t[0][0] / expected - 1.0) < 1e-6);
}

TEST_CASE("refraction of the Ez wave: Snell's law and negative refraction in a hyperbolic medium") {
  const double th = 30 * constants::pi / 180, kt = std::sin(th);
  const Refraction d = ez_refraction(4.0, Mat3c::Identity(), 1, kt);
  CHECK(d.propagates);
  CHECK(std::sin(d.angle) == doctest::Approx(kt / 2.0).epsilon(1e-12));
  CHECK(d.kn.real() == doctest::Approx(std::sqrt(4.0 - kt * kt)).epsilon(1e-12));
  // hyperbolic: mu_xx = 1 along the interface, mu_yy = -0.5 along its normal y
  Mat3c mu = Mat3c::Identity();
  mu(1, 1) = -0.5;
  const Refraction h = ez_refraction(5.5, mu, 1, kt);
  const double ky = std::sqrt(1.0 * (5.5 - kt * kt / -0.5));
  // t = -x for the normal y: k_x = -kt, S_x ~ k_x / mu_yy, S_t = -S_x
  const double expected = std::atan2(-(-kt / -0.5), ky / 1.0);
  MESSAGE("hyperbolic: refraction " << h.angle * 180 / constants::pi << " deg, Smith-Schurig " << expected * 180 / constants::pi);
  CHECK(h.angle == doctest::Approx(expected).epsilon(1e-12));
  CHECK(h.angle < 0);  // opposite side of the normal
  // the same with the normal along x (t = +y): the roles of the components swap
  Mat3c mx = Mat3c::Identity();
  mx(0, 0) = -0.5;
  const Refraction hx = ez_refraction(5.5, mx, 0, kt);
  CHECK(hx.angle == doctest::Approx(expected).epsilon(1e-12));
}

TEST_CASE("beam shift: a diverging beam off a near-perfect conductor is not shifted, on the face or on a line before it") {
  // a conductor of sigma = 1e9 S/m at 1 THz: r = -1 to 1e-3 at every angle (image theory), so
  // the reflected beam is the specular image itself; the old zero point (the incident
  // centroid + 2 h tan(theta)) read 2 h (<tan>_i - tan(theta)), 55 um here
  const double f = 1e12, w = 2 * constants::pi * f, th = 30 * constants::pi / 180;
  LayerStack st;
  st.eps_out = Mat3c::Identity() * std::complex<double>(1.0, 1e9 / (constants::eps0 * w));
  st.mu_out = Mat3c::Identity();
  for (double h : {0.0, 1.5e-3}) {
    const double d = beam_shift(st, w, th, 0, 450e-6, h);
    MESSAGE("conductor, line " << h * 1e3 << " mm before the face: " << d * 1e6 << " um");
    CHECK(std::abs(d) < 0.1e-6);  // the skin depth gives a few nm
  }
  // glass (a real Fresnel r, Born & Wolf sec. 1.5.2): no spatial shift at the face
  LayerStack g;
  g.eps_out = Mat3c::Identity() * 2.25;
  g.mu_out = Mat3c::Identity();
  CHECK(std::abs(beam_shift(g, w, th, 0, 450e-6, 0.0)) < 1e-12);
}

/// \file test_transfer_matrix.cpp
/// \brief The 4x4 transfer matrix against closed forms: the Airy slab formula (Born &
/// Wolf, Principles of Optics, sec. 7.6; check values of shared/references.md: eps = 5.5,
/// d = 100 um: T_min = 0.52071 at 319.58 GHz, T = 1 at 639.16 GHz), Fresnel at oblique
/// incidence for both polarizations (Born & Wolf sec. 1.5.2), the magnetic half-space
/// r = (mu_V k1 - k2 - (mu_xy/mu_xx) k_x) / (mu_V k1 + k2 + (mu_xy/mu_xx) k_x) (shared/
/// references.md, derived; vacuum y < 0, magnet y > 0) and its exact symmetry
/// r(k_x, B0) = r(-k_x, -B0), and energy conservation with cross-polarization in a canted state.
#include <doctest/doctest.h>

#include <cmath>

#include "io/scene/units.h"
#include "materials/layered/transfer_matrix.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

Mat3c iso(double v) { return v * Mat3c::Identity(); }

using test::mnf2;

Mat3c mu_of(const Magnet& mag, std::array<double, 3> bias, double f) {
  const MagnetModel M(mag, bias);
  return Mat3c::Identity() + susceptibility(M, find_ground_states(M).ground, 2 * constants::pi * f);
}

}  // namespace

TEST_CASE("transfer matrix: a dielectric slab follows the Airy formula") {
  LayerStack s;
  s.layers = {{iso(5.5), iso(1), 100e-6}};
  const double n = std::sqrt(5.5), d = 100e-6;
  for (double f : {100e9, 319.58e9, 500e9, 639.16e9, 800e9})
    for (int normal : {0, 1}) {
      s.normal = normal;
      const auto r = stack_response(s, 2 * constants::pi * f, 0.0);
      const double k0 = 2 * constants::pi * f / constants::c0;
      const std::complex<double> I(0, 1);
      const std::complex<double> t = 1.0 / (std::cos(n * k0 * d) - 0.5 * I * (n + 1 / n) * std::sin(n * k0 * d));
      for (int p = 0; p < 2; ++p) {
        CHECK(r.T[p] == doctest::Approx(std::norm(t)).epsilon(1e-9));
        CHECK(r.R[p][p] + r.T[p] == doctest::Approx(1.0).epsilon(1e-12));
        CHECK(std::abs(r.r[p][1 - p]) < 1e-12);
      }
    }
  LayerStack s2;
  s2.layers = {{iso(5.5), iso(1), 100e-6}};
  CHECK(stack_response(s2, 2 * constants::pi * 319.58e9, 0).T[0] == doctest::Approx(0.52071).epsilon(2e-5));
  CHECK(stack_response(s2, 2 * constants::pi * 639.16e9, 0).T[0] == doctest::Approx(1.0).epsilon(1e-6));
}

TEST_CASE("transfer matrix: Fresnel coefficients at oblique incidence, both polarizations") {
  LayerStack s;
  s.n_in = 1.5;
  s.eps_out = iso(4.0);
  const double n1 = 1.5, n2 = 2.0;
  for (double deg : {0.0, 20.0, 45.0, -35.0}) {
    const double th = deg * constants::pi / 180, ct = std::cos(th), st = std::sin(th);
    const double ct2 = std::sqrt(1 - std::pow(n1 * st / n2, 2));
    const double rs = (n1 * ct - n2 * ct2) / (n1 * ct + n2 * ct2);  // E along z (the Ez wave)
    const double rp = (n2 * ct - n1 * ct2) / (n2 * ct + n1 * ct2);  // H along z, for H (Hz wave)
    const auto r = stack_response(s, 2 * constants::pi * 1e12, th);
    INFO(deg << " deg");
    CHECK(r.r[0][0].real() == doctest::Approx(rs).epsilon(1e-10));
    CHECK(r.r[1][1].real() == doctest::Approx(rp).epsilon(1e-10));
    CHECK(r.R[0][0] + r.T[0] == doctest::Approx(1.0).epsilon(1e-12));
    CHECK(r.R[1][1] + r.T[1] == doctest::Approx(1.0).epsilon(1e-12));
  }
  // beyond the critical angle from the denser side: total reflection
  LayerStack t;
  t.n_in = std::sqrt(5.5);
  const auto r = stack_response(t, 2 * constants::pi * 1e12, 45 * constants::pi / 180);
  CHECK(std::abs(r.r[0][0]) == doctest::Approx(1.0).epsilon(1e-12));
  CHECK(std::abs(r.T[0]) < 1e-12);
}

TEST_CASE("transfer matrix: magnetic half-space against the closed form, non-reciprocal phase") {
  const Magnet mag = mnf2(1e-4);
  for (double b0 : {0.0, 1.0, -1.0})
    for (double f : {233.0e9, 234.7e9, 250e9, 290.7e9})
      for (double deg : {0.0, 30.0, -30.0}) {
        const Mat3c mu = mu_of(mag, {0, 0, b0}, f);
        LayerStack s;  // vacuum y < 0, magnet y > 0
        s.normal = 1;
        s.eps_out = iso(5.5);
        s.mu_out = mu;
        const double th = deg * constants::pi / 180;
        const auto r = stack_response(s, 2 * constants::pi * f, th);
        // closed form, k in units of k0; the frame's tangential axis is -x, so kx = -sin(theta)
        const double kx = -std::sin(th);
        const std::complex<double> muv = voigt_permeability(mu, 1);
        std::complex<double> k2 = std::sqrt(5.5 * muv - kx * kx);
        const double tiny = 1e-12 * std::abs(k2);  // decaying, or lossless and carrying power away
        if (k2.imag() < -tiny || (std::abs(k2.imag()) <= tiny && (k2 / muv).real() < 0)) k2 = -k2;
        const double k1 = std::cos(th);
        const std::complex<double> g = mu(0, 1) / mu(0, 0) * kx;
        // the formula's mu_xy / mu_xx term is written for an interface normal along y with
        // mu_nn = mu_yy; with the easy axis along z, mu_xx = mu_yy
        const std::complex<double> rc = (muv * k1 - k2 - g) / (muv * k1 + k2 + g);
        INFO("B0 " << b0 << " f " << f << " angle " << deg);
        CHECK(std::abs(r.r[0][0] - rc) < 1e-6);
        CHECK(std::abs(r.r[0][1]) < 1e-9);  // no coupling to the Hz wave for this geometry
      }
  // r(kx, B0) = r(-kx, -B0), and |r| is reciprocal when lossless while the phase is not
  const Magnet lossless = mnf2(0);
  for (double f : {233.0e9, 250e9, 300e9}) {
    LayerStack a, b;
    a.eps_out = b.eps_out = iso(5.5);
    a.mu_out = mu_of(lossless, {0, 0, 1.0}, f);
    b.mu_out = mu_of(lossless, {0, 0, -1.0}, f);
    const double th = 0.5;
    const auto p = stack_response(a, 2 * constants::pi * f, th), m = stack_response(b, 2 * constants::pi * f, -th);
    const auto q = stack_response(a, 2 * constants::pi * f, -th);
    CHECK(std::abs(p.r[0][0] - m.r[0][0]) < 1e-9);
    CHECK(std::abs(std::abs(p.r[0][0]) - std::abs(q.r[0][0])) < 1e-9);
  }
}

TEST_CASE("transfer matrix: a canted slab converts polarization and conserves energy when lossless") {
  const Magnet mag = mnf2(0);
  LayerStack s;
  s.normal = 0;
  const Mat3c mu = mu_of(mag, {0, 1.0, 0}, 262.5e9);  // transverse bias along y: canted
  s.layers = {{iso(5.5), mu, 300e-6}};
  for (double deg : {0.0, 25.0}) {
    const auto r = stack_response(s, 2 * constants::pi * 262.5e9, deg * constants::pi / 180);
    for (int p = 0; p < 2; ++p) CHECK(r.R[p][0] + r.R[p][1] + r.T[p] == doctest::Approx(1.0).epsilon(1e-9));
    MESSAGE(deg << " deg: cross-polarized reflectance Ez->Hz " << r.R[0][1] << ", Hz->Ez " << r.R[1][0]);
    // the canted state's mu_xz couples h_x, which only an oblique wave has, to h_z
    if (deg == 0) CHECK(r.R[0][1] < 1e-20);
    else CHECK(r.R[0][1] > 1e-6);
    CHECK(std::abs(mu(0, 2)) > 1e-6);
  }
}

TEST_CASE("transfer matrix: frustrated total reflection through a vacuum gap between two glass half-spaces") {
  // Glass n = 1.5 on both sides of a vacuum gap d, incidence past the critical angle (41.8 deg):
  // the gap's field decays as exp(-kappa y), kappa = k0 sqrt(n^2 sin^2 theta - 1), and the
  // transmittance is the barrier formula 1/T = 1 + ((q1^2 + kappa^2) / (2 q1 kappa))^2
  // sinh^2(kappa d), q1 = n k0 cos(theta) for the Ez (TE) wave and q1 / n^2 (with kappa / 1)
  // for the Hz (TM) wave (Born & Wolf, Principles of Optics, sec. 1.6.4; Zhu et al., Am. J.
  // Phys. 54, 601 (1986), from memory); R = 1 - T, lossless.
  const double n = 1.5, f = 1e12, k0 = 2 * constants::pi * f / constants::c0;
  LayerStack s;
  s.n_in = n;
  s.eps_out = iso(n * n);
  double worst = 0;
  int checked = 0;
  for (double d : {20e-6, 60e-6, 150e-6})
    for (double deg : {45.0, 60.0, 80.0}) {
      s.layers = {{iso(1), iso(1), d}};
      const double th = deg * constants::pi / 180, kappa = k0 * std::sqrt(n * n * std::sin(th) * std::sin(th) - 1);
      const auto r = stack_response(s, 2 * constants::pi * f, th);
      for (int p = 0; p < 2; ++p) {
        const double q1 = n * k0 * std::cos(th) / (p == 0 ? 1.0 : n * n);
        const double a = (q1 * q1 + kappa * kappa) / (2 * q1 * kappa), sh = std::sinh(kappa * d);
        const double T = 1 / (1 + a * a * sh * sh);
        INFO("d " << d << " angle " << deg << " polarization " << p);
        CHECK(r.T[p] == doctest::Approx(T).epsilon(1e-9));
        CHECK(r.R[p][p] == doctest::Approx(1 - T).epsilon(1e-9));
        worst = std::max(worst, std::abs(r.T[p] - T));
        ++checked;
      }
    }
  MESSAGE("frustrated total reflection: worst |T - T_barrier| " << worst << " over " << checked << " cases");
  // a gap of 0 is no interface at all; a wide gap is total reflection
  s.layers = {{iso(1), iso(1), 0.0}};
  CHECK(stack_response(s, 2 * constants::pi * f, 1.0).T[0] == doctest::Approx(1.0).epsilon(1e-12));
  s.layers = {{iso(1), iso(1), 2e-3}};
  CHECK(stack_response(s, 2 * constants::pi * f, 1.0).R[0][0] == doctest::Approx(1.0).epsilon(1e-9));
}

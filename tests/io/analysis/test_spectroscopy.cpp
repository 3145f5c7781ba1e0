/// \file test_spectroscopy.cpp
/// \brief The spectroscopy numerics against outside references: the Airy formula in its two
/// published forms (Born & Wolf sec. 7.6; Duvillaret, Garet & Coutaz 1996, eq. 1-3) and the
/// Fresnel limit of a thick lossy slab; the Fourier transform of a Gaussian; the extraction of
/// n from a synthetic time trace built from the Airy echo series; the r-and-t retrieval of
/// eps and mu (Smith et al., PRB 65, 195104 (2002)); rotation and ellipticity of Jones
/// vectors of known polarization.
#include <doctest/doctest.h>

#include <cmath>

#include "io/analysis/spectroscopy/polarization.h"
#include "io/analysis/spectroscopy/slab_retrieval.h"
#include "io/analysis/spectroscopy/slab_transfer.h"
#include "io/analysis/spectroscopy/trace_spectrum.h"
#include "io/scene/constants.h"

using namespace ty;
using constants::c0;
using constants::pi;

namespace {
const cplx I(0, 1);
double k0_of(double f) { return 2 * pi * f / c0; }
}  // namespace

TEST_CASE("slab optics: the Airy formula's two forms agree, and a thick lossy slab reflects as Fresnel") {
  // shared/references.md (Born & Wolf sec. 7.6): eps = 5.5, d = 100 um: T_min = 0.52071 at
  // 319.58 GHz and T = 1 at 639.16 GHz.
  const cplx n = std::sqrt(5.5), z = 1.0 / n;
  CHECK(std::norm(slab_t(n, z, k0_of(319.58e9), 100e-6)) == doctest::Approx(0.52071).epsilon(2e-5));
  CHECK(std::norm(slab_t(n, z, k0_of(639.16e9), 100e-6)) == doctest::Approx(1.0).epsilon(1e-8));
  // The echo series (Duvillaret et al.) against the cos/sin form, lossy and magnetic (invented values).
  for (double f : {0.1e12, 0.37e12, 1.3e12}) {
    const cplx nn(2.1, 0.07), zz(0.8, -0.05);
    CHECK(std::abs(slab_t_echoes(nn, zz, k0_of(f), 80e-6, true) - slab_t(nn, zz, k0_of(f), 80e-6)) < 1e-13);
  }
  // A slab so lossy that no echo returns reflects like its half-space: r = (z-1)/(z+1) =
  // (1-n)/(1+n) (Fresnel, normal incidence, Born & Wolf sec. 1.5.2).
  const cplx nl(3.0, 0.5);
  CHECK(std::abs(slab_r(nl, 1.0 / nl, k0_of(2e12), 1e-3) - (1.0 - nl) / (1.0 + nl)) < 1e-12);
  CHECK(std::abs(fresnel_r(1.0 / nl) - (1.0 - nl) / (1.0 + nl)) < 1e-15);
}

TEST_CASE("trace spectrum: a delayed Gaussian's transform, and the phase unwrapped from zero frequency") {
  // x(t) = exp(-(t-tau)^2 / (2 s^2)) -> X = s sqrt(2 pi) exp(-w^2 s^2 / 2) exp(+i w tau)
  // (the Gaussian integral; exp(-i w t) convention).
  const double s = 0.2e-12, tau = 3e-12, dt = 5e-15;
  std::vector<double> t, x, freq;
  for (int k = 0; k < 2000; ++k) t.push_back(k * dt), x.push_back(std::exp(-0.5 * std::pow((k * dt - tau) / s, 2)));
  for (int m = 1; m <= 60; ++m) freq.push_back(m * 0.05e12);
  const auto X = fourier(t, x, freq, {});
  const auto phi = unwrapped_phase(freq, X);
  for (size_t m = 0; m < freq.size(); ++m) {
    const double w = 2 * pi * freq[m];
    const cplx exact = s * std::sqrt(2 * pi) * std::exp(-0.5 * w * w * s * s) * std::exp(I * w * tau);
    CHECK(std::abs(X[m] - exact) < 1e-9 * s);
    CHECK(phi[m] == doctest::Approx(w * tau).epsilon(1e-9));  // w tau reaches 57 rad: 9 turns unwrapped
  }
  // The window: Tukey edges, zero outside, flat inside.
  const TimeWindow w{1e-12, 5e-12, 1e-12};
  CHECK(w(0.5e-12) == 0.0);
  CHECK(w(1.5e-12) == doctest::Approx(0.5));
  CHECK(w(3e-12) == 1.0);
}

TEST_CASE("slab retrieval: n from a time trace built from the Airy echo series") {
  // A lossless non-dispersive slab (n = 2.345, invented) turns a reference pulse p(t) into
  // sum_m a_m p(t - tau_m): a_m = t12 t21 r21^(2m), tau_m = ((2m+1) n - 1) d / c (the echo
  // series of Duvillaret et al., eq. 1-3, back in the time domain). The pulse is a
  // derivative of a Gaussian (a single cycle) centred near 0.8 THz.
  const double n = 2.345, d = 150e-6, s = 0.2e-12, t0 = 2e-12, dt = 4e-15;
  auto pulse = [&](double t) { return -(t - t0) / s * std::exp(-0.5 * std::pow((t - t0) / s, 2)); };
  const double t12 = 2 / (1 + n), t21 = 2 * n / (1 + n), r21 = (n - 1) / (n + 1);
  std::vector<double> t, ref, sam, freq;
  for (int k = 0; k < 30000; ++k) {
    const double tk = k * dt;
    t.push_back(tk), ref.push_back(pulse(tk));
    double v = 0;
    for (int m = 0; m < 25; ++m) v += t12 * t21 * std::pow(r21, 2 * m) * pulse(tk - ((2 * m + 1) * n - 1) * d / c0);
    sam.push_back(v);
  }
  for (int m = 0; m < 40; ++m) freq.push_back(0.1e12 + m * 0.05e12);
  const auto R = fourier(t, ref, freq, {}), S = fourier(t, sam, freq, {});
  std::vector<cplx> H;
  for (size_t m = 0; m < freq.size(); ++m) H.push_back(S[m] / R[m]);
  const auto got = retrieve_index(freq, H, d, true);
  double worst = 0;
  for (size_t m = 0; m < freq.size(); ++m) {
    CHECK(got.iterations[m] >= 0);
    worst = std::max(worst, std::abs(got.n[m] - n));
  }
  MESSAGE("worst |n - 2.345| over 0.1-2.05 THz: " << worst);
  CHECK(worst < 1e-10);
  // Cut to the first pass by a window, the same trace gives n with echoes = false; the
  // window ends before the first echo at tau_0 + 2 n d / c.
  const double tau0 = (n - 1) * d / c0;
  const TimeWindow main{0, t0 + tau0 + n * d / c0, 0.3e-12};
  const auto R1 = fourier(t, ref, freq, main), S1 = fourier(t, sam, freq, main);
  std::vector<cplx> H1;
  for (size_t m = 0; m < freq.size(); ++m) H1.push_back(S1[m] / R1[m]);
  const auto got1 = retrieve_index(freq, H1, d, false);
  for (size_t m = 5; m < 30; ++m) CHECK(std::abs(got1.n[m] - n) < 2e-3);  // the window's leakage
}

TEST_CASE("slab retrieval: mu from t with eps known, and eps and mu from r and t") {
  // An invented magnetic slab: eps = 4 + 0.02i, a Lorentz permeability
  // mu = 1 + F w0^2 / (w0^2 - w^2 - i g w) (passive in exp(-i w t): Im mu > 0).
  const cplx eps(4.0, 0.02);
  const double d = 20e-6, w0 = 2 * pi * 1e12, g = 2 * pi * 0.05e12, F = 0.3;
  std::vector<double> freq;
  std::vector<cplx> H, r, t, mu;
  for (int m = 0; m < 200; ++m) {
    const double f = 0.2e12 + m * 0.01e12, w = 2 * pi * f, k0 = k0_of(f);
    freq.push_back(f);
    mu.push_back(1.0 + F * w0 * w0 / (w0 * w0 - w * w - I * g * w));
    const cplx n = std::sqrt(eps * mu.back()), z = std::sqrt(mu.back() / eps);
    H.push_back(slab_transfer(n, z, k0, d, true));
    r.push_back(slab_r(n, z, k0, d));
    t.push_back(slab_t(n, z, k0, d));
  }
  const auto from_t = retrieve_index(freq, H, d, true, eps);
  const auto both = retrieve_eps_mu(freq, r, t, d);
  double worst_t = 0, worst_mu = 0, worst_eps = 0;
  for (size_t m = 0; m < freq.size(); ++m) {
    worst_t = std::max(worst_t, std::abs(from_t.n[m] * from_t.n[m] / eps - mu[m]));
    worst_mu = std::max(worst_mu, std::abs(both.mu[m] - mu[m]));
    worst_eps = std::max(worst_eps, std::abs(both.eps[m] - eps));
  }
  MESSAGE("worst mu error from t: " << worst_t << ", from r and t: " << worst_mu << " (eps " << worst_eps << ")");
  CHECK(worst_t < 1e-8);
  CHECK(worst_mu < 1e-8);
  CHECK(worst_eps < 1e-8);
}

TEST_CASE("polarization: rotation and ellipticity of linear, rotated and circular light") {
  // Transmission through an ideal rotator by +10 degrees (counterclockwise for an observer
  // facing the wave travelling along k): an Ez input comes out as cos a z + sin a (k x z),
  // and k x z = -u (polarization.h), so J[1][0] = -sin a.
  const double a = 10 * pi / 180;
  Jones J{{{std::cos(a), -std::sin(a)}, {-std::sin(a), std::cos(a)}}};
  // The Hz input u turns to cos a u + sin a (k x u) = cos a u + sin a z: J[0][1] = +sin a.
  J[0][1] = std::sin(a);
  CHECK(jones_rotation(J, 0).theta == doctest::Approx(a));
  CHECK(jones_rotation(J, 1).theta == doctest::Approx(a));
  CHECK(jones_rotation(J, 0).eta == doctest::Approx(0.0));
  // Circular: E_b = i E_a turns from a to b (counterclockwise) in exp(-i w t): eta = +45 degrees.
  CHECK(rotation_ellipticity(1.0, I).eta == doctest::Approx(pi / 4));
  CHECK(rotation_ellipticity(1.0, -I).eta == doctest::Approx(-pi / 4));
  // An ellipse with axes ratio 0.2 along a: tan eta = 0.2.
  CHECK(rotation_ellipticity(1.0, 0.2 * I).eta == doctest::Approx(std::atan(0.2)));
}

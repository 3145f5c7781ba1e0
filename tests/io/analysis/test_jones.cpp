/// \file test_jones.cpp
/// \brief The transfer matrix's Jones matrices (io/analysis/spectroscopy/jones_prediction.h)
/// against closed forms of magneto-optics:
/// - a gyrotropic slab in the Faraday geometry (propagation and bias along x; in the (y, z) plane
///   mu = [[mu, -i kappa], [i kappa, mu]]) has circular eigenwaves with n_a^2 = eps (mu + kappa)
///   (E ~ y + i z, which turns counterclockwise for an observer facing the wave) and
///   n_b^2 = eps (mu - kappa) (Landau & Lifshitz, Electrodynamics of Continuous Media, 2nd ed.,
///   sec. 101, gyrotropic media; Zvezdin & Kotov, Modern Magnetooptics and Magnetooptical
///   Materials (1997), ch. 1 -- both from memory). Each eigenwave crosses the slab as through an
///   isotropic slab of index n_m and impedance sqrt(mu_m / eps) (the Airy formula, Born & Wolf
///   sec. 7.6), so J = t_a v_a v_a^H + t_b v_b v_b^H, v_a = (1, -i)/sqrt2, v_b = (1, i)/sqrt2
///   in the (E.z, E.u = E.y) basis. The single-pass rotation is theta_F = (n_b - n_a) omega d /
///   (2 c) in the sign of polarization.h (the faster-phase wave leads: the closed form's
///   magnitude (n_+ - n_-) omega d / 2c of the texts, with + the counterclockwise wave, and the
///   sign of our convention).
/// - A non-magnetic slab: J diagonal, J_zz = J_uu = the Airy t, no rotation.
/// - The Voigt geometry: linear eigenwaves, the Hz wave with the Voigt permeability; a tilted
///   axis: energy conserved per input column (lossless tensors).
#include <doctest/doctest.h>

#include <cmath>

#include "io/analysis/spectroscopy/jones_prediction.h"
#include "io/scene/constants.h"
#include "materials/magnetic/linear_response.h"
#include "tests/helpers.h"
#include "tests/io/analysis/circular_waves.h"

using namespace ty;
using constants::c0;
using constants::pi;
using cd = std::complex<double>;

namespace {

const cd I(0, 1);
using test::airy_t;
using test::circular_jones;

StackResponse gyrotropic_slab(cd eps, cd mu, cd kappa, double f, double d) {
  LayerStack s;
  s.normal = 0;  // propagation along x, the bias along x
  Mat3c m = Mat3c::Identity() * mu;
  m(0, 0) = 1.0;
  m(1, 2) = -I * kappa, m(2, 1) = I * kappa;
  s.layers = {{Mat3c::Identity() * eps, m, d}};
  return stack_response(s, 2 * pi * f, 0.0);
}

}  // namespace

TEST_CASE("Jones: a gyrotropic slab in the Faraday geometry against the circular eigenwaves (Airy per wave)") {
  const double d = 150e-6;
  for (auto [eps, mu, kappa] :
       {std::tuple<cd, cd, cd>{5.5, 1.02, 0.15}, {5.5, cd(0.9, 0.05), cd(0.4, 0.1)}, {12.0, 1.0, -0.3}})
    for (double f : {0.2e12, 0.45e12, 0.9e12}) {
      const Jones want = circular_jones(eps, mu, kappa, f, d);
      const Jones got = transmission_jones(gyrotropic_slab(eps, mu, kappa, f, d));
      double worst = 0;
      for (int a = 0; a < 2; ++a)
        for (int b = 0; b < 2; ++b) worst = std::max(worst, std::abs(got[a][b] - want[a][b]));
      INFO("eps " << eps << " mu " << mu << " kappa " << kappa << " f " << f);
      CHECK(worst < 1e-9);
      for (int in = 0; in < 2; ++in) {
        const auto s = jones_rotation(got, in), w = jones_rotation(want, in);
        CHECK(s.theta == doctest::Approx(w.theta).epsilon(1e-8));
        CHECK(s.eta == doctest::Approx(w.eta).epsilon(1e-8));
      }
    }
}

TEST_CASE("Jones: thin, nearly matched gyrotropic slab: theta_F = (n_b - n_a) omega d / (2c), small ellipticity") {
  // eps = mu = 1 apart from kappa: the impedances differ from vacuum by O(kappa), so the echoes
  // change the rotation only at O(kappa^2).
  const double d = 50e-6, f = 0.5e12;
  for (double kappa : {0.01, -0.02, 0.005}) {
    const Jones J = transmission_jones(gyrotropic_slab(1.0, 1.0, kappa, f, d));
    const double na = std::sqrt(1 + kappa), nb = std::sqrt(1 - kappa);
    const double theta = (nb - na) * 2 * pi * f * d / (2 * c0);
    for (int in = 0; in < 2; ++in) {
      const auto s = jones_rotation(J, in);
      INFO("kappa " << kappa << " input " << in << ": theta " << s.theta << " closed form " << theta);
      CHECK(std::abs(s.theta - theta) < 1e-3 * std::abs(theta) + 1e-6);
      CHECK(std::abs(s.eta) < 1e-3 * std::abs(theta));
    }
  }
}

TEST_CASE("Jones: MnF2 biased along the propagation is gyrotropic, and its slab follows the circular eigenwaves") {
  // The linear response of the crystal (easy axis and 0.3 T along x) gives the Faraday form of mu.
  Magnet mag = test::mnf2(1e-3);
  mag.anisotropy[0].axis = {1, 0, 0}, mag.order = {1, 0, 0};
  Scene scene;
  Medium med;
  med.name = "mnf2", med.magnet = mag, med.permittivity = {5.5, 5.5, 5.5};
  scene.media = {med};
  scene.bias = {0.3, 0, 0};
  const SlabModel model = slab_model(scene, 0, 200e-6, 0);
  for (double f : {240e9, 255e9, 262e9, 275e9, 300e9}) {
    const Mat3c mu = slab_stack(model, f).layers[0].mu;
    CHECK(std::abs(mu(1, 1) - mu(2, 2)) < 1e-9 * std::abs(mu(1, 1)));
    CHECK(std::abs(mu(1, 2) + mu(2, 1)) < 1e-9 * std::abs(mu(1, 2)) + 1e-15);
    const cd kappa = I * mu(1, 2);  // mu_yz = -i kappa
    const Jones want = circular_jones(5.5, mu(1, 1), kappa, f, 200e-6);
    const JonesPrediction p = predict_jones(model, f);
    for (int in = 0; in < 2; ++in) {
      const auto w = jones_rotation(want, in);
      INFO("at " << f / 1e9 << " GHz: theta " << p.faraday[in].theta << " closed form " << w.theta);
      CHECK(p.faraday[in].theta == doctest::Approx(w.theta).epsilon(1e-7));
      CHECK(p.faraday[in].eta == doctest::Approx(w.eta).epsilon(1e-7));
    }
    CHECK(std::abs(kappa) > 1e-3);  // the bias does split the two circular waves
  }
}

TEST_CASE("Jones: a dielectric slab gives a diagonal J, the Airy t on it, and no rotation") {
  Scene scene;
  Medium med;
  med.name = "glass", med.permittivity = {5.5, 5.5, 5.5};
  scene.media = {med};
  const double d = 100e-6;
  for (int normal : {0, 1})
    for (double f : {100e9, 319.58e9, 700e9}) {
      const JonesPrediction p = predict_jones(slab_model(scene, 0, d, normal), f);
      const double k0 = 2 * pi * f / c0;
      const cd t = airy_t(std::sqrt(5.5), 1 / std::sqrt(5.5), k0, d);
      const cd r_face = (1 - std::sqrt(5.5)) / (1 + std::sqrt(5.5));  // Fresnel at the front face ...
      CHECK(std::abs(p.t[0][0] - t) < 1e-10);
      CHECK(std::abs(p.t[1][1] - t) < 1e-10);
      CHECK(std::abs(p.t[0][1]) + std::abs(p.t[1][0]) + std::abs(p.r[0][1]) + std::abs(p.r[1][0]) < 1e-12);
      CHECK(std::abs(p.r[0][0] - p.r[1][1]) < 1e-10);  // ... the same for both inputs at normal incidence
      CHECK(std::abs(p.r[0][0]) <= std::abs(2.0 * r_face / (1.0 + r_face * r_face)) + 1e-12);  // Airy's largest |r|
      for (int in = 0; in < 2; ++in) {
        CHECK(std::abs(p.faraday[in].theta) < 1e-12);
        CHECK(std::abs(p.kerr[in].theta) < 1e-12);
        CHECK(std::abs(p.kerr[in].eta) < 1e-12);
      }
    }
}

TEST_CASE("Jones: Voigt geometry (bias across the path, in the plane): linear eigenwaves, the Hz wave sees mu_V") {
  // propagation along x, gyrotropy about y: in the (z, x) plane mu = [[mu, -i kappa], [i kappa, mu]],
  // mu_yy = 1. The Ez wave (H along y) sees mu_yy; the Hz wave (H in the z-x plane, B_x = 0) the
  // Voigt permeability mu_V = (mu^2 - kappa^2) / mu (Gurevich & Melkov, Magnetization
  // Oscillations and Waves (1996), ch. 1 -- from memory). Each crosses by the Airy formula.
  const double d = 120e-6;
  const cd eps = 5.5, mu = cd(1.3, 0.02), kappa = cd(0.5, 0.01);
  LayerStack s;
  s.normal = 0;
  Mat3c m = Mat3c::Identity();
  m(2, 2) = m(0, 0) = mu;
  m(2, 0) = -I * kappa, m(0, 2) = I * kappa;
  s.layers = {{Mat3c::Identity() * eps, m, d}};
  const cd muV = (mu * mu - kappa * kappa) / mu;
  for (double f : {0.15e12, 0.4e12, 0.8e12}) {
    const Jones J = transmission_jones(stack_response(s, 2 * pi * f, 0.0));
    const double k0 = 2 * pi * f / c0;
    CHECK(std::abs(J[0][0] - airy_t(std::sqrt(eps), 1.0 / std::sqrt(eps), k0, d)) < 1e-10);
    CHECK(std::abs(J[1][1] - airy_t(std::sqrt(eps * muV), std::sqrt(muV / eps), k0, d)) < 1e-10);
    CHECK(std::abs(J[0][1]) + std::abs(J[1][0]) < 1e-12);
  }
}

TEST_CASE("Jones: a lossless slab with a tilted gyrotropy axis conserves energy in each input's column") {
  // The axis between x and y couples the waves; with Hermitian eps and mu no power is lost:
  // sum over outputs |J_t|^2 + |J_r|^2 = 1 per input (Poynting's theorem; vacuum on both sides).
  const double d = 80e-6, c = std::cos(0.6), sn = std::sin(0.6);
  const cd mu = 1.2, kappa = 0.35;
  Mat3c m = Mat3c::Identity() * mu;  // gyrotropic about a = (c, sn, 0): mu (1 - aa) + aa + i kappa [a]x
  const Eigen::Vector3cd a(c, sn, 0);
  m -= (mu - 1.0) * a * a.transpose();
  Mat3c cross;
  cross << 0, -a(2), a(1), a(2), 0, -a(0), -a(1), a(0), 0;
  m += I * kappa * cross;
  CHECK((m - m.adjoint()).norm() < 1e-12);
  LayerStack s;
  s.normal = 0;
  s.layers = {{Mat3c::Identity() * 4.0, m, d}};
  for (double f : {0.2e12, 0.6e12}) {
    const StackResponse r = stack_response(s, 2 * pi * f, 0.0);
    const Jones Jt = transmission_jones(r), Jr = reflection_jones(r);
    double coupled = 0;
    for (int in = 0; in < 2; ++in) {
      const double sum = std::norm(Jt[0][in]) + std::norm(Jt[1][in]) + std::norm(Jr[0][in]) + std::norm(Jr[1][in]);
      CHECK(sum == doctest::Approx(1.0).epsilon(1e-10));
      coupled = std::max(coupled, std::abs(Jt[1 - in][in]));
    }
    CHECK(coupled > 1e-3);  // the tilted axis does couple the waves
  }
}

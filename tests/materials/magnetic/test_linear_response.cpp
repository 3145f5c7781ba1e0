/// \file test_linear_response.cpp
/// \brief Ground states and the linearised response of sublattice magnets against the
/// closed forms of the textbook cases (formulas and worked values: shared/references.md):
///  - uniaxial antiferromagnet, zero field: w_r = gamma sqrt(2 B_E B_A + B_A^2) and
///    chi_perp = 2 w_A w_M / (w_r^2 - w^2) (Keffer & Kittel, Phys. Rev. 85, 329 (1952);
///    Kittel, Phys. Rev. 82, 565 (1951));
///  - bias along the easy axis: chi_+- = 2 w_M w_A / (w_r^2 - (w +- w_0)^2), lines w_r +- w_0;
///  - spin-flop field B_SF = sqrt(2 B_E B_A - B_A^2) and the spin-flop-phase frequency;
///  - transverse bias: canting sin(phi) = B0 / (2 B_E + B_A) and the two lines;
///  - ferrite (one sublattice): the Polder tensor (Polder, Phil. Mag. 40, 99 (1949);
///    Pozar, Microwave Engineering, 4th ed., sec. 9.1; Pozar's exp(+j w t) turned into our
///    exp(-i w t)), with damping w_0 -> w_0 - i alpha w;
///  - thin film biased in its plane: the Kittel resonance sqrt(w_0 (w_0 + w_M)) where the
///    normal component mu_nn vanishes (Kittel, Phys. Rev. 73, 155 (1948)).
#include <doctest/doctest.h>

#include "materials/magnetic/linear_response.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

constexpr double kTwoPi = 2 * constants::pi;

// MnF2 with the values of references.md (from memory there): mu0 H_E = 55 T,
// mu0 H_A = 0.787 T, mu0 Ms = 0.754 T, g = 2.
using test::mnf2;

double rel(double a, double b) { return std::abs(a / b - 1); }

}  // namespace

TEST_CASE("antiferromagnet at zero field: Keffer-Kittel resonance and transverse susceptibility") {
  const MagnetModel M(mnf2(), {0, 0, 0});
  const auto gs = find_ground_states(M);
  CHECK(gs.ground.kind == "collinear");
  CHECK(gs.ground.m[0].z() == doctest::Approx(1.0));  // the order key picks sublattice 1 up
  CHECK(torque(M, gs.ground) < 1e-10);
  const double g = M.gamma[0], BE = 55.0, BA = 0.787, wM = g * 0.754, wA = g * BA;
  const double wr = g * std::sqrt(2 * BE * BA + BA * BA);
  const auto f = resonances(M, gs.ground);
  REQUIRE(f.size() == 2);
  CHECK(rel(f[0], wr / kTwoPi) < 1e-6);
  CHECK(rel(f[1], wr / kTwoPi) < 1e-6);
  CHECK(f[0] / 1e9 == doctest::Approx(261.38).epsilon(2e-5));  // worked value, references.md
  // gamma/2pi = 27.9925 GHz/T for g = 2
  CHECK(g / kTwoPi / 1e9 == doctest::Approx(27.9925).epsilon(1e-5));
  for (double fr : {10e9, 120e9, 250e9, 275e9, 600e9}) {
    const double w = kTwoPi * fr;
    const Mat3c chi = susceptibility(M, gs.ground, w);
    const double expect = 2 * wA * wM / (wr * wr - w * w);
    INFO("f = " << fr);
    CHECK(rel(chi(0, 0).real(), expect) < 1e-6);
    CHECK(rel(chi(1, 1).real(), expect) < 1e-6);
    CHECK(std::abs(chi(2, 2)) < 1e-9);
    CHECK(std::abs(chi(0, 1)) < 1e-9 * std::abs(expect));
  }
  // static permeability 1.01361 (references.md, derived)
  CHECK(1 + susceptibility(M, gs.ground, 1e3).real()(0, 0) == doctest::Approx(1.01361).epsilon(1e-5));
}

TEST_CASE("antiferromagnet biased along the easy axis: lines at w_r +- w_0 and the gyrotropic tensor") {
  for (double alpha : {0.0, 1e-3}) {
    const MagnetModel M(mnf2(alpha), {0, 0, 1.0});
    const auto gs = find_ground_states(M);
    CHECK(gs.ground.kind == "collinear");
    const double g = M.gamma[0], BE = 55.0, BA = 0.787, wM = g * 0.754, wA = g * BA, wE = g * BE, w0 = g * 1.0;
    const double wr = g * std::sqrt(2 * BE * BA + BA * BA);
    if (alpha == 0) {
      const auto f = resonances(M, gs.ground);
      REQUIRE(f.size() == 2);
      CHECK(rel(f[0], (wr - w0) / kTwoPi) < 1e-6);
      CHECK(rel(f[1], (wr + w0) / kTwoPi) < 1e-6);
      CHECK(f[0] / 1e9 == doctest::Approx(233.39).epsilon(3e-5));
      CHECK(f[1] / 1e9 == doctest::Approx(289.37).epsilon(3e-5));
    }
    for (double fr : {100e9, 230e9, 240e9, 300e9}) {
      const double w = kTwoPi * fr;
      const std::complex<double> I(0, 1);
      auto chi_pm = [&](double sgn) {
        return 2.0 * wM * (wA - I * alpha * w) /
               (wr * wr - std::pow(w + sgn * w0, 2) - 2.0 * I * alpha * w * (wE + wA) - alpha * alpha * w * w);
      };
      const std::complex<double> cp = chi_pm(+1), cm = chi_pm(-1);
      const Mat3c chi = susceptibility(M, gs.ground, w);
      INFO("alpha = " << alpha << ", f = " << fr);
      CHECK(std::abs(chi(0, 0) - 0.5 * (cp + cm)) < 1e-6 * std::abs(0.5 * (cp + cm)));
      CHECK(std::abs(chi(0, 1) - 0.5 * I * (cp - cm)) < 1e-6 * std::abs(0.5 * (cp - cm)));
      CHECK(std::abs(chi(1, 0) + chi(0, 1)) < 1e-9 * std::abs(chi(0, 1)));
    }
  }
  // the Ez wave's total-reflection bands, mu_V = (mu_xx^2 + mu_xy^2)/mu_xx < 0 (references.md:
  // 234.26-235.16 and 290.27-291.15 GHz)
  const MagnetModel M(mnf2(), {0, 0, 1.0});
  const auto gs = find_ground_states(M);
  auto muv = [&](double f) {
    Mat3c mu = Mat3c::Identity() + susceptibility(M, gs.ground, kTwoPi * f);
    return voigt_permeability(mu, 1).real();
  };
  const auto bands = negative_bands(muv, 200e9, 320e9, 24000);
  // each line adds a pole to mu_V: count only the bands beside the poles of mu_xx = 0
  std::vector<Band> wide;
  for (const auto& b : bands)
    if (b.to - b.from > 0.1e9) wide.push_back(b);
  REQUIRE(wide.size() == 2);
  CHECK(wide[0].from / 1e9 == doctest::Approx(234.26).epsilon(5e-5));
  CHECK(wide[0].to / 1e9 == doctest::Approx(235.16).epsilon(5e-5));
  CHECK(wide[1].from / 1e9 == doctest::Approx(290.27).epsilon(5e-5));
  CHECK(wide[1].to / 1e9 == doctest::Approx(291.15).epsilon(5e-5));
}

TEST_CASE("spin flop: the field where the two states' energies cross, metastability, the flop-phase line") {
  const double BE = 55.0, BA = 0.787;
  const double b_sf = std::sqrt(2 * BE * BA - BA * BA);  // 9.271 T
  const double b_c = std::sqrt(2 * BE * BA + BA * BA);   // collinear instability, 9.338 T
  CHECK(b_sf == doctest::Approx(9.271).epsilon(1e-4));
  auto ground_kind = [&](double b) { return find_ground_states(MagnetModel(mnf2(), {0, 0, b})).ground.kind; };
  CHECK(ground_kind(0.995 * b_sf) == "collinear");
  CHECK(ground_kind(1.005 * b_sf) == "spin-flop");
  // bisection on the ground state's kind finds the spin-flop field
  double lo = 0.99 * b_sf, hi = 1.01 * b_sf;
  for (int it = 0; it < 30; ++it) {
    const double mid = 0.5 * (lo + hi);
    (ground_kind(mid) == "collinear" ? lo : hi) = mid;
  }
  CHECK(rel(0.5 * (lo + hi), b_sf) < 1e-6);
  // between B_SF and B_c both states are minima: the collinear one is reported as metastable
  const auto both = find_ground_states(MagnetModel(mnf2(), {0, 0, 0.5 * (b_sf + b_c)}));
  CHECK(both.ground.kind == "spin-flop");
  bool collinear_metastable = false;
  for (const auto& s : both.metastable) collinear_metastable |= s.kind == "collinear";
  CHECK(collinear_metastable);
  // the spin-flop plane is degenerate: the choice is the same every time
  CHECK(both.ground.soft);
  const auto again = find_ground_states(MagnetModel(mnf2(), {0, 0, 0.5 * (b_sf + b_c)}));
  CHECK((again.ground.m[0] - both.ground.m[0]).norm() == 0.0);
  // the spin-flop phase at 12 T: w^2 = w0^2 2wE(2wE + wA)/(2wE - wA)^2 - 2 wE wA, the other mode 0
  const MagnetModel M(mnf2(), {0, 0, 12.0});
  const auto gs = find_ground_states(M);
  REQUIRE(gs.ground.kind == "spin-flop");
  const double g = M.gamma[0], wE = g * BE, wA = g * BA, w0 = g * 12.0;
  const double w = std::sqrt(w0 * w0 * 2 * wE * (2 * wE + wA) / std::pow(2 * wE - wA, 2) - 2 * wE * wA);
  const auto f = resonances(M, gs.ground);
  REQUIRE(f.size() == 1);  // the rotation about the axis has zero frequency
  CHECK(rel(f[0], w / kTwoPi) < 1e-6);
}

TEST_CASE("antiferromagnet with a transverse bias: canting and the two lines") {
  const double BE = 55.0, BA = 0.787, B0 = 1.0;
  const MagnetModel M(mnf2(), {B0, 0, 0});
  const auto gs = find_ground_states(M);
  CHECK(gs.ground.kind == "canted");
  const double phi = std::asin(gs.ground.m[0].x());
  CHECK(rel(std::sin(phi), B0 / (2 * BE + BA)) < 1e-6);
  CHECK(phi * 180 / constants::pi == doctest::Approx(0.517).epsilon(1e-3));  // references.md
  const double g = M.gamma[0], wE = g * BE, wA = g * BA, w0 = g * B0;
  const double wr2 = wA * wA + 2 * wE * wA;
  const double w1 = std::sqrt(wr2 + w0 * w0 * (2 * wE - wA) / (2 * wE + wA));
  const double w2 = std::sqrt(wr2 * (1 - w0 * w0 / std::pow(2 * wE + wA, 2)));
  const auto f = resonances(M, gs.ground);
  REQUIRE(f.size() == 2);
  CHECK(rel(f[0], w2 / kTwoPi) < 1e-6);
  CHECK(rel(f[1], w1 / kTwoPi) < 1e-6);
  CHECK(f[0] / 1e9 == doctest::Approx(261.37).epsilon(3e-5));
  CHECK(f[1] / 1e9 == doctest::Approx(262.85).epsilon(3e-5));
  // canted states couple the polarizations: mu_xz or mu_yz no longer vanish
  const Mat3c chi = susceptibility(M, gs.ground, kTwoPi * 250e9);
  CHECK(std::abs(chi(1, 2)) + std::abs(chi(0, 2)) > 1e-6);
}

TEST_CASE("ferrite: the Polder tensor, with damping, and the in-plane thin-film Kittel resonance") {
  Magnet fe;
  fe.sublattices = {{0.175, 2.0, 0.0}};  // mu0 Ms = 0.175 T, a typical YIG value (invented round number)
  const double B0 = 0.3;
  for (double alpha : {0.0, 0.01}) {
    fe.sublattices[0].damping = alpha;
    const MagnetModel M(fe, {0, 0, B0});
    const auto gs = find_ground_states(M);
    CHECK(gs.ground.m[0].z() == doctest::Approx(1.0));
    const double g = M.gamma[0], wM = g * 0.175;
    const std::complex<double> I(0, 1);
    for (double fr : {2e9, 8.0e9, 9e9, 20e9}) {
      const double w = kTwoPi * fr;
      const std::complex<double> w0 = g * B0 - I * alpha * w;
      const std::complex<double> mu = 1.0 + w0 * wM / (w0 * w0 - w * w), kappa = w * wM / (w0 * w0 - w * w);
      const Mat3c m = Mat3c::Identity() + susceptibility(M, gs.ground, w);
      INFO("alpha " << alpha << " f " << fr);
      CHECK(std::abs(m(0, 0) - mu) < 1e-6 * std::abs(mu));
      CHECK(std::abs(m(1, 1) - mu) < 1e-6 * std::abs(mu));
      CHECK(std::abs(m(0, 1) - (-I * kappa)) < 1e-6 * std::abs(kappa));  // Pozar: +j kappa for exp(+j w t)
      CHECK(std::abs(m(1, 0) - (I * kappa)) < 1e-6 * std::abs(kappa));
    }
  }
  // thin film in the x-z plane (normal y), bias along x in the plane
  fe.sublattices[0].damping = 0;
  const MagnetModel M(fe, {B0, 0, 0});
  const auto gs = find_ground_states(M);
  const double g = M.gamma[0], w0 = g * B0, wM = g * 0.175;
  const double wk = std::sqrt(w0 * (w0 + wM));
  auto mu_yy = [&](double f) { return 1 + susceptibility(M, gs.ground, kTwoPi * f).real()(1, 1); };
  const auto bands = negative_bands(mu_yy, 1e9, 20e9, 2000);
  REQUIRE(!bands.empty());
  CHECK(rel(bands[0].from, w0 / kTwoPi) < 1e-6);  // from the pole at w_0
  CHECK(rel(bands[0].to, wk / kTwoPi) < 1e-6);    // to mu_nn = 0 at the Kittel frequency
}

TEST_CASE("material check values: MnF2 and FeF2 zero-field resonances within 2% of measurement") {
  // MnF2: mu0 H_E = 55.0 T, mu0 H_A = 0.787 T, g = 2 (from memory, references.md); measured
  // low-temperature AFMR near 8.7 cm^-1 = 261 GHz (from memory).
  {
    const MagnetModel M(mnf2(), {0, 0, 0});
    const double f = resonances(M, find_ground_states(M).ground)[0];
    MESSAGE("MnF2: " << f / 1e9 << " GHz against 261 GHz measured");
    CHECK(rel(f, 261e9) < 0.02);
  }
  // FeF2: mu0 H_E = 53.3 T, mu0 H_A = 19.7 T, mu0 Ms = 0.704 T, g = 2.25 (from memory,
  // references.md); measured AFMR near 52.4 cm^-1 = 1.57 THz (from memory).
  {
    Magnet m;
    m.sublattices = {{0.704, 2.25, 0}, {0.704, 2.25, 0}};
    m.lambda = 53.3 / 0.704;
    m.anisotropy = {{{0, 0, 1}, 19.7}};
    const MagnetModel M(m, {0, 0, 0});
    const double f = resonances(M, find_ground_states(M).ground)[0];
    MESSAGE("FeF2: " << f / 1e12 << " THz against 1.57 THz measured");
    CHECK(rel(f, 1.57e12) < 0.02);
  }
}

TEST_CASE("Dzyaloshinskii-Moriya canting of an easy-plane antiferromagnet") {
  // energy lambda mu^2 cos(D) - mu^2 B_D sin(D) over the angle D between the sublattices:
  // minimum at an angle pi - atan(B_D / B_E), net moment 2 mu sin(atan(B_D/B_E)/2)
  Magnet m;
  m.sublattices = {{0.6, 2.0, 0}, {0.6, 2.0, 0}};
  m.lambda = 100.0 / 0.6;                  // mu0 H_E = 100 T (invented)
  m.anisotropy = {{{0, 0, 1}, -0.5}};      // hard axis z: easy plane x-y
  m.dzyaloshinskii = {0, 0, 2.0};          // mu0 H_D = 2 T along z (invented)
  const MagnetModel M(m, {0, 0, 0});
  const auto gs = find_ground_states(M);
  CHECK(gs.ground.kind == "canted");
  const double expect = 2 * 0.6 * std::sin(0.5 * std::atan(2.0 / 100.0));
  CHECK(rel(M.net(gs.ground.m).norm(), expect) < 1e-6);
  CHECK(std::abs(M.net(gs.ground.m).z()) < 1e-9);  // the net moment lies in the easy plane
  // the sense of the canting lowers mu_D B_D.(m1 x m2): m1 x m2 points against B_D
  CHECK(gs.ground.m[0].cross(gs.ground.m[1]).z() < 0);
  CHECK(M.energy(gs.ground.m) < M.energy({gs.ground.m[1], gs.ground.m[0]}));
}

/// \file test_damped_modes.cpp
/// \brief The damped normal modes of the linearised equations (the ring-down `check`
/// prints beside each line) against two outside facts:
///  - one isotropic sublattice in a field B precesses at gamma B / (1 + alpha^2) and its
///    amplitude decays at alpha gamma B / (1 + alpha^2): the small-angle solution of the
///    Gilbert equation (Gilbert, IEEE Trans. Magn. 40, 3443 (2004));
///  - a weakly damped line is a Lorentzian whose half-width at half maximum (in angular
///    frequency) is the amplitude's decay rate (any damped oscillator; e.g. Kittel,
///    Introduction to Solid State Physics, ch. on magnetic resonance): checked on MnF2's
///    exchange-enhanced antiferromagnetic line, where the decay is far above alpha w.
#include <doctest/doctest.h>

#include "materials/magnetic/linear_response.h"
#include "tests/helpers.h"

using namespace ty;

TEST_CASE("damped modes: Gilbert's small-angle solution for one sublattice") {
  for (double alpha : {0.01, 0.1, 0.3}) {
    Magnet fe;
    fe.sublattices = {{0.175, 2.0, alpha}};  // mu0 Ms invented; the precession does not depend on it
    fe.order = {0, 0, 1};
    const double B = 0.5;
    const MagnetModel M(fe, {0, 0, B});
    const auto gs = find_ground_states(M);
    const auto modes = damped_modes(M, gs.ground);
    REQUIRE(modes.size() == 1);
    const double w0 = M.gamma[0] * B, q = 1 + alpha * alpha;
    CHECK(2 * constants::pi * modes[0].frequency == doctest::Approx(w0 / q).epsilon(1e-9));
    CHECK(modes[0].decay == doctest::Approx(alpha * w0 / q).epsilon(1e-9));
  }
}

TEST_CASE("damped modes: the decay rate is the half-width of the line (MnF2, zero field)") {
  const double alpha = 2e-4;
  const MagnetModel M(test::mnf2(alpha), {0, 0, 0});
  const auto gs = find_ground_states(M);
  const auto modes = damped_modes(M, gs.ground);
  REQUIRE(!modes.empty());
  const double f0 = modes.front().frequency, decay = modes.front().decay;
  // Im chi_xx around the line: its peak and the frequencies where it falls to half
  auto im = [&](double f) { return susceptibility(M, gs.ground, 2 * constants::pi * f)(0, 0).imag(); };
  const double peak = im(f0), width = decay / (2 * constants::pi);
  auto half = [&](double a, double b) {  // the half-maximum crossing between a and b
    for (int it = 0; it < 100; ++it) {
      const double m = 0.5 * (a + b);
      ((im(m) > 0.5 * peak) == (im(a) > 0.5 * peak) ? a : b) = m;
    }
    return 0.5 * (a + b);
  };
  const double hwhm = 0.5 * (half(f0 + 20 * width, f0) - half(f0 - 20 * width, f0));
  MESSAGE("MnF2 line " << f0 / 1e9 << " GHz: decay " << decay << " 1/s (ring-down " << 1e9 / decay
                       << " ns), half-width " << hwhm / 1e6 << " MHz; alpha w would give " << alpha * 2 * constants::pi * f0);
  CHECK(2 * constants::pi * hwhm == doctest::Approx(decay).epsilon(0.02));
  CHECK(decay > 3 * alpha * 2 * constants::pi * f0);  // exchange-enhanced: about B_E / sqrt(2 B_E B_A) ~ 6 times alpha w
}

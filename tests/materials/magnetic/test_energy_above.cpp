/// \file test_energy_above.cpp
/// \brief The magnets' energy above the ground state from the deviations
/// (materials/magnetic/energy_above.h) against the closed form of a uniaxial
/// antiferromagnet with one sublattice tilted by theta from the easy axis: the exchange
/// energy lambda mu^2 (1 - cos theta) plus the anisotropy energy mu B_A sin^2(theta) / 2
/// (Gurevich & Melkov, Magnetization Oscillations and Waves, sec. 1.4; here from magnet.h's
/// energy density), where the difference of two total energies (magnet.h) drowns in rounding.
#include <doctest/doctest.h>

#include <cmath>

#include "materials/magnetic/energy_above.h"
#include "tests/helpers.h"

using namespace ty;

TEST_CASE("magnet energy above the ground state: a tilted sublattice of MnF2, large and tiny tilts") {
  const MagnetModel mm(test::mnf2(0), {0, 0, 0});
  const std::array<Vec3, 2> g{Vec3::UnitZ(), -Vec3::UnitZ()};
  for (double theta : {0.2, 1e-3, 1e-6, 1e-9}) {
    const std::array<Vec3, 2> m{Vec3(std::sin(theta), 0, std::cos(theta)), -Vec3::UnitZ()};
    const double s = std::sin(theta), one_minus_cos = 2 * std::pow(std::sin(theta / 2), 2);
    const double exact = mm.lambda * mm.mu[0] * mm.mu[1] * one_minus_cos + 0.5 * mm.mu[0] * mm.b_a[0] * s * s;
    CHECK(energy_above(mm, g, m) == doctest::Approx(exact).epsilon(1e-9).scale(0));
    if (theta < 1e-8) CHECK(std::abs(mm.energy(m) - mm.energy(g) - exact) > 0.1 * exact);  // why: rounding
  }
}

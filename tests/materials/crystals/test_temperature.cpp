/// \file test_temperature.cpp
/// \brief The mean-field magnetization against Weiss's S = 1/2 equation and its critical
/// law, and the MnF2 and FeF2 resonances against temperature against published measurements.
#include <doctest/doctest.h>

#include <cmath>

#include "io/scene/crystals/crystal_magnet.h"
#include "materials/crystals/temperature.h"
#include "materials/magnetic/linear_response.h"
#include "materials/magnetic/state_choice.h"

using namespace ty;

TEST_CASE("Brillouin mean field: Weiss's S = 1/2 equation m = tanh(m Tc/T) and the critical law") {
  // Kittel, Introduction to Solid State Physics, ch. 11: for S = 1/2 the Brillouin law is
  // m = tanh(m / t); solve it independently by fixed-point iteration.
  for (double t : {0.2, 0.5, 0.8, 0.95}) {
    double m = 1;
    for (int i = 0; i < 5000; ++i) m = std::tanh(m / t);
    CHECK(mean_field_magnetization(0.5, t) == doctest::Approx(m).epsilon(1e-9));
  }
  // near T_N the mean field gives m^2 = 3 (1 - t) for S = 1/2 (the expansion of tanh)
  CHECK(std::abs(mean_field_magnetization(0.5, 0.9999) / std::sqrt(3 * 1e-4) - 1) < 1e-3);
  CHECK(mean_field_magnetization(2.5, 0) == 1.0);
  CHECK(mean_field_magnetization(2.5, 1.0) == 0.0);
  // B_S(x) -> 1 for large x and (S+1)/(3S) x for small x, across the series' switch
  CHECK(brillouin(2.5, 200) == doctest::Approx(1.0).epsilon(1e-12));
  CHECK(std::abs(brillouin(2.5, 1.01e-4) / (brillouin(2.5, 0.99e-4) * 1.01 / 0.99) - 1) < 1e-6);
}

namespace {
/// The lowest zero-field resonance of a library crystal at temperature t (K), c along z.
double resonance_at(std::string_view name, double t) {
  Magnet g = crystal_magnet(*find_crystal(name));
  g.thermal.temperature = t;
  return resonances(MagnetModel(g, {0, 0, 0}), choose_state(g, {0, 0, 0}).state).front();
}
}  // namespace

TEST_CASE("MnF2 and FeF2 antiferromagnetic resonance against temperature") {
  // 4.2 K: MnF2 8.7 cm^-1 = 261 GHz (Johnson & Nethercot, Phys. Rev. 114, 705 (1959)); FeF2
  // 52.7 cm^-1 = 1.580 THz (Ohlmann & Tinkham, Phys. Rev. 123, 425 (1961)); both from memory.
  CHECK(std::abs(resonance_at("MnF2", 4.2) / 261e9 - 1) < 0.01);
  CHECK(std::abs(resonance_at("FeF2", 4.2) / (52.7 * 29.9792458e9) - 1) < 0.01);
  // MnF2 at 40 K and 60 K: Johnson & Nethercot's resonance follows the F19-NMR sublattice
  // magnetization, about 0.89 and 0.60 of its low-temperature value there (from memory, read
  // off their curve). Relative tolerances: 8% at 40 K (T/T_N = 0.59, where the mean field is
  // fair); 25% at 60 K, where the mean field falls below the measurement (its exponent is
  // 1/2 near T_N, the measured one about 1/3). Without any scaling both checks fail.
  auto off = [](double x, double ref) { return std::abs(x / ref - 1); };
  const double f0 = resonance_at("MnF2", 0), r40 = resonance_at("MnF2", 40) / f0, r60 = resonance_at("MnF2", 60) / f0;
  MESSAGE("MnF2: f(40 K)/f(0) = " << r40 << ", f(60 K)/f(0) = " << r60);
  CHECK(off(r40, 0.89) < 0.08);
  CHECK(off(r60, 0.60) < 0.25);
  CHECK(r60 < 0.60);  // the mean field's known shortfall near T_N
  // FeF2 at 40 K: the measured line has moved down by only a few percent (Ohlmann & Tinkham
  // 1961, from memory: about 0.96 of 52.7 cm^-1); the model moves it further (about 0.84):
  // the Callen-Callen law is derived for an anisotropy small against the exchange, and
  // FeF2's is 37% of it (docs/crystals.md). What the model must do exactly is its stated
  // laws: Keffer & Kittel's line w = gamma sqrt(2 B_E B_A + B_A^2) (Phys. Rev. 85, 329
  // (1952)) with B_E ~ m and B_A ~ m^(power-1), m the mean-field magnetization. A missing,
  // doubled or halved scaling misses this by far more than the 1e-6 held.
  const Magnet fe = crystal_magnet(*find_crystal("FeF2"));
  const double BE = fe.lambda * fe.sublattices[0].saturation, BA = fe.anisotropy[0].field;
  const Thermal& th = fe.thermal;
  auto line = [&](double t) {
    const double m = mean_field_magnetization(th.spin, t / th.ordering) /
                     mean_field_magnetization(th.spin, th.reference / th.ordering);
    const double be = BE * m, ba = BA * std::pow(m, th.anisotropy_power - 1);
    return std::sqrt(2 * be * ba + ba * ba);
  };
  const double g0 = resonance_at("FeF2", 0), q40 = resonance_at("FeF2", 40) / g0;
  MESSAGE("FeF2: f(40 K)/f(0) = " << q40 << " (measured about 0.96, from memory)");
  CHECK(q40 == doctest::Approx(line(40) / line(0)).epsilon(1e-6));
  CHECK(q40 < 0.96);  // the stated deviation: the model's line moves earlier than the crystal's
  // and both lines fall monotonically towards the Neel temperature
  CHECK(resonance_at("MnF2", 66) < 0.5 * f0);
  CHECK(resonance_at("FeF2", 77) < 0.5 * g0);
}

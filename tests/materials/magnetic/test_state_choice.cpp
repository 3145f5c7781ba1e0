/// \file test_state_choice.cpp
/// \brief Choosing a magnet's state: the MnF2 spin-flop hysteresis along a bias history, a
/// hard ferrite held against a reversed bias, states by number and kind, bad choices.
#include <doctest/doctest.h>

#include <cmath>

#include "../../helpers.h"
#include "io/scene/diagnostics.h"
#include "materials/magnetic/state_choice.h"

// `pick = std::string("...")`: assigning a plain literal draws a false -Wrestrict from GCC 12.

using namespace ty;

namespace {
std::string kind_after(std::vector<std::array<double, 3>> history, double bias) {
  Magnet m = test::mnf2();
  m.state.history = std::move(history);
  return choose_state(m, {0, 0, bias}).state.kind;
}
}  // namespace

TEST_CASE("State choice: MnF2 spin-flop hysteresis along a bias history") {
  // Closed forms from the energy of magnet.h (two equal sublattices, bias along the easy
  // axis; docs/magnets.md): the collinear state is a minimum up to
  // B_c1 = sqrt(2 B_E B_A + B_A^2), where the lower resonance omega_r - gamma B reaches zero
  // (Kittel, Phys. Rev. 82, 565 (1951)); the flop state is one down to
  // B_c2 = (2 B_E - B_A) sqrt(B_A / (2 B_E + B_A)); the two have equal energy at
  // B_SF = sqrt(2 B_E B_A - B_A^2) [derived].
  const double be = 55.0, ba = 0.787;
  const double b_c1 = std::sqrt(2 * be * ba + ba * ba), b_c2 = (2 * be - ba) * std::sqrt(ba / (2 * be + ba));
  const double b_sf = std::sqrt(2 * be * ba - ba * ba);
  REQUIRE(b_c2 < b_sf);
  REQUIRE(b_sf < b_c1);
  const double mid = 0.5 * (b_c2 + b_sf);  // where both are minima and the flop is metastable... or not
  // on the way up the collinear state is kept to just below B_c1, then flops
  CHECK(kind_after({{0, 0, 0}, {0, 0, b_c1 - 2e-3}}, mid) == "collinear");
  CHECK(kind_after({{0, 0, 0}, {0, 0, b_c1 + 2e-3}}, mid) == "spin-flop");
  // on the way down from 10 T the flop is kept down to just above B_c2, then falls back
  CHECK(kind_after({{0, 0, 10}}, b_c2 + 2e-3) == "spin-flop");
  CHECK(kind_after({{0, 0, 10}}, b_c2 - 2e-3) == "collinear");
  // the lab's loop: up to 10 T and back to 9.25 T (between B_c2 and B_SF) is on the flop
  // branch although the collinear state is the lower one there; without the history the
  // lowest state is taken
  CHECK(kind_after({{0, 0, 0}, {0, 0, 10}}, 9.25) == "spin-flop");
  CHECK(kind_after({}, 9.25) == "collinear");
  Magnet m = test::mnf2();
  m.state.history = {{0, 0, 0}, {0, 0, 10}};
  const ChosenState c = choose_state(m, {0, 0, 9.25});
  MESSAGE(c.how);
  CHECK(c.how.find("collinear -> spin-flop") != std::string::npos);
}

TEST_CASE("State choice: a hard ferrite keeps its moment against a reversed bias below the switching field") {
  // Stoner & Wohlfarth, Phil. Trans. R. Soc. A 240, 599 (1948): a single-domain uniaxial
  // magnet with the field along its easy axis switches at mu0 H = mu0 H_K (here B_A).
  Magnet m;
  m.sublattices = {{0.47, 2.0, 0}};
  m.anisotropy = {{{0, 0, 1}, 1.7}};
  m.state.history = {{0, 0, 1}};  // magnetized up
  CHECK(choose_state(m, {0, 0, -1.6}).state.m[0].z() == doctest::Approx(1.0));
  CHECK(choose_state(m, {0, 0, -1.8}).state.m[0].z() == doctest::Approx(-1.0));
  // without a history the reversed bias takes the global minimum (issue #12, item 13) ...
  m.state.history.clear();
  CHECK(choose_state(m, {0, 0, -1.0}).state.m[0].z() == doctest::Approx(-1.0));
  // ... and the metastable one by its number or kind, as `check` lists them
  m.state.pick = std::string("2");
  CHECK(choose_state(m, {0, 0, -1.0}).state.m[0].z() == doctest::Approx(1.0));
}

TEST_CASE("State choice: the other degenerate branch, kinds, and states that do not exist") {
  Magnet m = test::mnf2();  // order +z
  const auto lowest = choose_state(m, {0, 0, 0});
  CHECK(lowest.state.m[0].z() == doctest::Approx(1.0));
  m.state.pick = std::string("2");  // the reversed Neel vector, of equal energy
  const auto other = choose_state(m, {0, 0, 0});
  CHECK(other.state.m[0].z() == doctest::Approx(-1.0));
  CHECK(other.how.find("degenerate") != std::string::npos);
  m.state.pick = std::string("collinear");
  CHECK(choose_state(m, {0, 0, 9.3}).state.kind == "collinear");  // metastable there (above B_SF)
  m.state.pick = std::string("spin-flop");
  CHECK_THROWS_AS(choose_state(m, {0, 0, 1.0}), BadInput);  // no flop state at 1 T
  m.state.pick = std::string("9");
  m.state.where = {"scene.yaml", 12, 14};
  try {
    choose_state(m, {0, 0, 0});
    FAIL("expected BadInput");
  } catch (const BadInput& e) {
    CHECK(std::string(e.what()).find("scene.yaml:12:14") != std::string::npos);
  }
}

/// \file test_medium_domains.cpp
/// \brief `terayee medium SCENE --body N`: the linear response of a body's medium in the state
/// that body starts from. On the bundled scenarios/yfeo3-domains.yaml (a c-cut YFeO3 plate, its
/// right half `order: reversed`) the two domains' net moments are the weak ferromagnet's closed
/// form with opposite signs, and their off-diagonal permeabilities are opposite.
///
/// The closed form: with the Neel vector along x (the easy axis a), the Dzyaloshinskii field
/// B_D along y and the sublattices canted by beta toward z, the energy of docs/magnets.md
/// ("Conventions") per mu_s is -(B_E + (B_A,x - B_A,z)/2) cos 2 beta - B_D sin 2 beta + const, so
/// tan 2 beta = B_D / (B_E + (B_A,x - B_A,z)/2) and mu0 M = 2 mu_s sin beta along z (the weak
/// moment D x L: Dzyaloshinskii, J. Phys. Chem. Solids 4, 241 (1958); Moriya, Phys. Rev. 120, 91
/// (1960)). The reversed domain is the time-reversed state, so mu_xy(-M) = mu_yx(M) (Onsager's
/// relations; Gurevich & Melkov, Magnetization Oscillations and Waves, ch. 1, the reference of
/// docs/magnets.md "Domains"), here -mu_xy(M).
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>

#include "io/scene/scene_reader.h"
#include "tests/helpers.h"

namespace fs = std::filesystem;
using ty::test::read_json;
using ty::test::shell;

namespace {
const std::string kScene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/yfeo3-domains.yaml";

nlohmann::json medium_of(const std::string& who) {
  const fs::path p = fs::temp_directory_path() / "terayee-test-medium-domains.json";
  REQUIRE(shell(std::string(TERAYEE_BINARY) + " medium '" + kScene + "' " + who +
                " --from '0.28 THz' --to '0.32 THz' --count 5 --json '" + p.string() + "'") == 0);
  const auto j = read_json(p.string());
  fs::remove(p);
  return j;
}
}  // namespace

TEST_CASE("terayee medium --body: two YFeO3 domains, opposite weak moments and opposite mu_xy") {
  const ty::Scene s = ty::read_scene(kScene);
  const ty::Magnet& g = *s.media[0].magnet;
  REQUIRE(g.sublattices.size() == 2);
  const double mu = g.sublattices[0].saturation, BE = g.exchange_field(), BD = g.dzyaloshinskii[1];
  REQUIRE(g.dzyaloshinskii[0] == 0);
  REQUIRE(g.dzyaloshinskii[2] == 0);
  double Bx = 0, Bz = 0;  // the anisotropy fields along x (the Neel vector) and z (the weak moment)
  for (const auto& a : g.anisotropy) {
    if (std::abs(a.axis[0]) > 1 - 1e-12) Bx += a.field;
    else if (std::abs(a.axis[2]) > 1 - 1e-12) Bz += a.field;
    else FAIL("an anisotropy axis off x and z");
  }
  const double beta = 0.5 * std::atan(BD / (BE + 0.5 * (Bx - Bz))), net = 2 * mu * std::sin(beta);
  const auto a = medium_of("--body 1"), b = medium_of("--body 2"), m = medium_of("--medium yfo");
  INFO(a["state"].get<std::string>() << "\n" << b["state"].get<std::string>());
  CHECK(a["state"].get<std::string>().find("body 1 (line 27): the medium's state") == 0);
  CHECK(b["state"].get<std::string>().find("body 2 (line 28): its own state") == 0);
  MESSAGE("weak moment: closed form " << net << " T; body 1 " << a["net-moment"][2].get<double>() << " T, body 2 "
                                      << b["net-moment"][2].get<double>() << " T");
  for (int c = 0; c < 2; ++c) {
    CHECK(std::abs(a["net-moment"][c].get<double>()) < 1e-9);
    CHECK(std::abs(b["net-moment"][c].get<double>()) < 1e-9);
  }
  CHECK(a["net-moment"][2].get<double>() == doctest::Approx(net).epsilon(1e-6));  // sublattice 1 along +x, B_D along +y
  CHECK(b["net-moment"][2].get<double>() == doctest::Approx(-net).epsilon(1e-6));
  double largest = 0;
  for (size_t k = 0; k < a["rows"].size(); ++k) {
    const auto &ra = a["rows"][k], &rb = b["rows"][k], &rm = m["rows"][k];
    for (int q = 0; q < 2; ++q) {  // real and imaginary parts
      const double xa = ra["mu-xy"][q].get<double>(), xb = rb["mu-xy"][q].get<double>();
      largest = std::max(largest, std::abs(xa));
      CHECK(xb == doctest::Approx(-xa).epsilon(1e-6));
      CHECK(rm["mu-xy"][q].get<double>() == xa);  // body 1 takes the medium's state
    }
    CHECK(rb["mu"][0][0].get<double>() == doctest::Approx(ra["mu"][0][0].get<double>()).epsilon(1e-9));  // mu_xx alike
  }
  CHECK(largest > 1e-3);  // the gyrotropy is there to turn over (YFeO3's quasi-ferromagnetic line, 0.3 THz)
}

TEST_CASE("terayee medium --body: a body that does not exist or is of another medium") {
  const std::string bin = TERAYEE_BINARY;
  const std::string base = bin + " medium '" + kScene + "' --from '0.3 THz' --to '0.3 THz' --count 1 ";
  CHECK(shell(base + "--body 3") == 2);
  CHECK(shell(base + "--body 2 --medium nothing") == 2);
  CHECK(shell(base) == 2);  // neither --medium nor --body
}

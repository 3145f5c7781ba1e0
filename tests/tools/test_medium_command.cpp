/// \file test_medium_command.cpp
/// \brief `terayee medium` against closed forms: the Fresnel coefficient of a glass
/// half-space at 30 deg (Born & Wolf sec. 1.5.2) and the Artmann shift of total internal
/// reflection, eps1 = 5.5 to vacuum at 45 deg: D_TE = 0.2406 lambda0 (Artmann, Ann. Phys.
/// 437, 87 (1948); the check value of shared/references.md); the character of the wave in a
/// biased hexaferrite against the Polder tensor (Pozar, Microwave Engineering, 4th ed., sec.
/// 9.3): across the bias the wave sees mu_perp = (mu^2 - kappa^2) / mu, whatever the sign of mu.
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <vector>

#include "tests/helpers.h"

namespace {

std::vector<double> first_row(const std::string& csv) {
  std::ifstream in(csv);
  std::string line;
  std::getline(in, line);
  std::getline(in, line);
  std::vector<double> v;
  std::stringstream ss(line);
  for (std::string cell; std::getline(ss, cell, ',');) v.push_back(cell == "ellipse" || cell == "hyperbola" || cell == "evanescent" ? 0 : std::atof(cell.c_str()));
  return v;
}

using ty::test::shell;

}  // namespace

TEST_CASE("terayee medium: Fresnel reflection and the Artmann shift of total internal reflection") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/medium-check.yaml";
  const std::string csv = (std::filesystem::temp_directory_path() / "terayee-medium.csv").string();
  const std::string bin = TERAYEE_BINARY;
  REQUIRE(shell(bin + " medium '" + scene + "' --medium glass --from '1 THz' --to '1 THz' --count 1 --angle '30 deg' --csv '" + csv + "'") == 0);
  auto v = first_row(csv);
  REQUIRE(v.size() == 49);
  const double ct = std::cos(ty::constants::pi / 6), ct2 = std::sqrt(1 - std::pow(std::sin(ty::constants::pi / 6) / 2, 2));
  const double rs = (ct - 2 * ct2) / (ct + 2 * ct2);
  // the permittivity columns and the Hz wave's Fresnel r_p = (n ct - ct2)/(n ct + ct2), n = 2 (Born & Wolf sec. 1.5.2)
  CHECK(v[24] == doctest::Approx(4.0));  // eps_xx
  CHECK(v[28] == doctest::Approx(4.0));  // eps_zz
  CHECK(v[32] == doctest::Approx(std::abs((2 * ct - ct2) / (2 * ct + ct2))).epsilon(1e-7));
  CHECK(v[13] == doctest::Approx(std::abs(rs)).epsilon(1e-7));  // |r+| (the CSV holds 8 digits)
  CHECK(v[15] == doctest::Approx(std::abs(rs)).epsilon(1e-7));  // |r-|: reciprocal
  CHECK(v[18] == doctest::Approx(1 - rs * rs).epsilon(1e-7));   // T+
  // total internal reflection from eps = 5.5 into the gap at 45 deg
  REQUIRE(shell(bin + " medium '" + scene + "' --medium gap --from '1 THz' --to '1 THz' --count 1 --angle '45 deg' "
                      "--incidence-index 2.3452078799117149 --csv '" + csv + "'") == 0);
  v = first_row(csv);
  const double lambda0 = 299792458.0 / 1e12;
  MESSAGE("Artmann shift: " << v[20] / lambda0 << " lambda0 (+45 deg), " << v[21] / lambda0 << " (-45 deg)");
  CHECK(v[13] == doctest::Approx(1.0).epsilon(1e-7));
  CHECK(v[20] / lambda0 == doctest::Approx(0.2406).epsilon(2e-3));
  CHECK(v[21] / lambda0 == doctest::Approx(-0.2406).epsilon(2e-3));  // the shift follows the tangential wavevector
  // the evanescent field's 1/e length, lambda0 / (2 pi sqrt(n1^2 sin^2 45 - 1)) (Born & Wolf sec. 1.5.4)
  CHECK(v[35] == doctest::Approx(lambda0 / (2 * ty::constants::pi * std::sqrt(5.5 * 0.5 - 1))).epsilon(1e-6));
  std::filesystem::remove(csv);
}

TEST_CASE("terayee medium: the wave's character follows mu_perp of the Polder tensor, not the sign of mu_xx") {
  // BaFe12O19 (g = 2, mu0 Ms = 0.47 T, mu0 H_A = 1.7 T) biased with 0.3 T along c: f0 = 55.985 GHz,
  // fm = 13.157 GHz. At 60 GHz mu = -0.58 but mu_perp = +4.36: it propagates (the old diagonal rule
  // said "evanescent"); at 65 GHz mu = +0.32 but mu_perp = -1.57: no real k (old: "ellipse").
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/hexaferrite-voigt.yaml";
  const std::string csv = (std::filesystem::temp_directory_path() / "terayee-medium-hexa.csv").string();
  const double gamma = 2 * 13.99624493e9, f0 = gamma * 2.0, fm = gamma * 0.47;  // CODATA muB/h
  for (double f : {60e9, 65e9}) {
    REQUIRE(ty::test::shell(std::string(TERAYEE_BINARY) + " medium '" + scene + "' --medium hexa --from '" +
                            std::to_string(f / 1e9) + " GHz' --to '" + std::to_string(f / 1e9) + " GHz' --count 1 --angle '45 deg' --csv '" +
                            csv + "'") == 0);
    std::ifstream in(csv);
    std::string header, line;
    std::getline(in, header), std::getline(in, line);
    std::vector<std::string> cells;
    std::stringstream ss(line);
    for (std::string c; std::getline(ss, c, ',');) cells.push_back(c);
    REQUIRE(cells.size() == 49);
    const double mu = 1 + f0 * fm / (f0 * f0 - f * f), kappa = f * fm / (f0 * f0 - f * f);
    const double mu_perp = (mu * mu - kappa * kappa) / mu;
    MESSAGE((f / 1e9) << " GHz: mu " << mu << ", mu_perp " << mu_perp << ": " << cells[11] << ", " << cells[34]);
    CHECK(std::atof(cells[9].c_str()) == doctest::Approx(mu_perp).epsilon(1e-6));  // Re mu_V
    CHECK(cells[11] == (mu_perp > 0 ? "ellipse" : "evanescent"));                   // the curve
    // at 45 deg from vacuum, kt^2 = 0.5 < eps mu_perp = 74: propagates where mu_perp > 0
    CHECK(cells[34] == (mu_perp > 0 ? "prop" : "evan"));
    CHECK(cells[36] == "ellipse");  // the Hz wave: eps and mu_zz = 1
  }
  std::filesystem::remove(csv);
}

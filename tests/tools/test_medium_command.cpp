/// \file test_medium_command.cpp
/// \brief `terayee medium` against closed forms: the Fresnel coefficient of a glass
/// half-space at 30 deg (Born & Wolf sec. 1.5.2) and the Artmann shift of total internal
/// reflection, eps1 = 5.5 to vacuum at 45 deg: D_TE = 0.2406 lambda0 (Artmann, Ann. Phys.
/// 437, 87 (1948); the check value of shared/references.md).
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
  REQUIRE(v.size() == 34);
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
  std::filesystem::remove(csv);
}

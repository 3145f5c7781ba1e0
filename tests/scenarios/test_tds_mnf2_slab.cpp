/// \file test_tds_mnf2_slab.cpp
/// \brief The TDS study (scenarios/tds-mnf2-slab): a single-cycle pulse through a biased MnF2
/// plate; the permeability `measure material` retrieves from the detector behind it (eps = 5.5
/// given) against the crystal's Voigt permeability from the linearised sublattice equations
/// (`terayee medium`, shared/references.md: mu_V = (mu_xx mu_yy - mu_xy mu_yx) / mu_nn), and the
/// permittivity retrieved from r and t together (Smith et al., PRB 65, 195104 (2002)) against
/// the 5.5 put in. Measured: |mu - mu_V| <= 0.0024, eps within 0.01.
#include <doctest/doctest.h>

#include <complex>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "tests/helpers.h"

namespace fs = std::filesystem;

TEST_CASE("study tds-mnf2-slab: mu from the detector trace against the linear response, eps from r and t") {
  const fs::path out = fs::temp_directory_path() / "terayee-study-tds";
  REQUIRE(ty::test::shell(std::string(TERAYEE_SOURCE_DIR) + "/scenarios/tds-mnf2-slab/run.sh '" + out.string() +
                          "' > /dev/null") == 0);
  using cplx = std::complex<double>;
  auto arr = [](const nlohmann::json& j, size_t k) { return cplx(j["real"][k].get<double>(), j["imag"][k].get<double>()); };
  std::ifstream a(out / "material.json"), b(out / "material-rt.json"), lr(out / "linear-response.csv");
  const auto t_only = nlohmann::json::parse(a), rt = nlohmann::json::parse(b);
  std::string line;
  std::getline(lr, line);
  double worst_mu = 0, worst_eps = 0;
  for (size_t k = 0; std::getline(lr, line); ++k) {
    std::vector<std::string> v;
    std::istringstream ss(line);
    for (std::string c; std::getline(ss, c, ',');) v.push_back(c);
    REQUIRE(v.size() > 10);
    worst_mu = std::max(worst_mu, std::abs(arr(t_only["mu"], k) - cplx(std::stod(v[9]), std::stod(v[10]))));
    worst_eps = std::max(worst_eps, std::abs(arr(rt["epsilon"], k) - 5.5));
  }
  MESSAGE("worst |mu - mu_V| " << worst_mu << ", worst |eps - 5.5| from r and t " << worst_eps);
  CHECK(worst_mu < 0.01);
  CHECK(worst_eps < 0.03);
}

/// \file test_check_polarization.cpp
/// \brief `terayee check`'s polarization lines on tests/data/faraday-slab.yaml (a 200 um MnF2
/// plate, easy axis and 0.3 T bias along x, a plane wave along x: the Faraday geometry)
/// against the slab's circular eigenwaves, each through the Airy formula
/// (tests/io/analysis/circular_waves.h: Landau & Lifshitz ECM sec. 101; Born & Wolf sec. 7.6),
/// with mu and kappa from the crystal's linear response. The same plate made of glass (no
/// magnet) prints no polarization lines: an isotropic plate at normal incidence turns nothing.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <regex>
#include <sstream>
#include <string>

#include "io/analysis/spectroscopy/jones_prediction.h"
#include "io/scene/scene_reader.h"
#include "tests/helpers.h"
#include "tests/io/analysis/circular_waves.h"
#include "tests/tools/capture.h"

using namespace ty;

namespace {

const std::string kScene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/faraday-slab.yaml";

std::string check(const std::string& args) {
  return test::capture(std::string(TERAYEE_BINARY) + " check '" + kScene + "' " + args + " 2>&1");
}

}  // namespace

TEST_CASE("check: Faraday rotation of a biased MnF2 plate against its circular eigenwaves") {
  const std::string out = check("");
  const auto at = out.find("polarization of the sample slab (medium 'mnf2', 200 um thick)");
  REQUIRE_MESSAGE(at != std::string::npos, out);
  // mu and kappa of the scene's own crystal and bias (the linear response, materials/magnetic)
  const Scene scene = read_scene(kScene);
  const SlabModel model = slab_model(scene, 0, 200e-6, 0);
  std::istringstream rows(out.substr(at));
  const std::regex row(R"(^\s+([0-9.]+)\s+([0-9.]+)\s+([0-9.]+)\s+(-?[0-9.]+)\s+(-?[0-9.]+)\s.*)");
  int seen = 0;
  double largest = 0;
  for (std::string line; std::getline(rows, line);) {
    std::smatch m;
    if (!std::regex_match(line, m, row)) continue;
    // the frequency is printed to 0.1 MHz: the closed form over the rounding interval, and the
    // printed values (5 and 4 decimals) within their own rounding of that range
    const double f = std::stod(m[1]) * 1e9, deg = 180 / constants::pi;
    double lo[4] = {1e9, 1e9, 1e9, 1e9}, hi[4] = {-1e9, -1e9, -1e9, -1e9};
    for (const double fk : {f - 5e4, f, f + 5e4}) {
      const Mat3c mu = slab_stack(model, fk).layers[0].mu;
      const Jones J = test::circular_jones(5.5, mu(1, 1), std::complex<double>(0, 1) * mu(1, 2), fk, 200e-6);
      const PolarizationState w = jones_rotation(J, 0);
      const double v[4] = {std::abs(J[0][0]), std::abs(J[1][0]), w.theta * deg, w.eta * deg};
      for (int i = 0; i < 4; ++i) lo[i] = std::min(lo[i], v[i]), hi[i] = std::max(hi[i], v[i]);
    }
    INFO(line);
    const double rounding[4] = {6e-6, 6e-6, 6e-5, 6e-5};
    for (int i = 0; i < 4; ++i) {
      const double printed = std::stod(m[2 + i]);
      CHECK(printed >= lo[i] - rounding[i]);
      CHECK(printed <= hi[i] + rounding[i]);
    }
    const double theta = std::abs(std::stod(m[4]));
    largest = std::max(largest, theta);
    ++seen;
  }
  CHECK(seen >= 9);        // 7 steps over the band and each resonance inside it from both sides
  CHECK(largest > 5.0);    // near the resonances the plate turns the polarization by degrees
  CHECK(check("--set bodies.0.medium=glass").find("polarization of the sample slab") == std::string::npos);
}

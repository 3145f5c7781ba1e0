/// \file test_measure_focus.cpp
/// \brief `terayee measure focus` on a synthetic Gaussian spot of known centre and widths
/// (I = exp(-4 ln2 [(x-x0)^2/wx^2 + (y-y0)^2/wy^2]), wx and wy its FWHM): both recovered
/// within 1% (the centre within 1% of the width), with the centre off the sample grid.
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>

#include "io/run/hdf5_file.h"

namespace fs = std::filesystem;
using namespace ty;

TEST_CASE("measure focus recovers a synthetic Gaussian spot's centre and widths within 1%") {
  const fs::path dir = fs::temp_directory_path() / "terayee-test-focus";
  fs::remove_all(dir);
  fs::create_directories(dir);
  const size_t nx = 121, ny = 91;
  const double d = 5e-6, x0 = 0.1234e-3, y0 = -0.0567e-3, wx = 140e-6, wy = 62e-6;
  std::vector<double> x(nx), y(ny), re(nx * ny), im(nx * ny, 0.0);
  for (size_t i = 0; i < nx; ++i) x[i] = (static_cast<double>(i) - 60) * d + 0.1e-3;
  for (size_t j = 0; j < ny; ++j) y[j] = (static_cast<double>(j) - 45) * d;
  for (size_t j = 0; j < ny; ++j)
    for (size_t i = 0; i < nx; ++i) {
      const double I = std::exp(-4 * std::log(2.0) * (std::pow((x[i] - x0) / wx, 2) + std::pow((y[j] - y0) / wy, 2)));
      re[j * nx + i] = 300 * std::sqrt(I);
    }
  {
    h5::File f = h5::File::create((dir / "fields.h5").string());
    const double freq = 0.5e12;
    f.write("/spectral-maps/spot/frequency", {1}, &freq, "Hz");
    f.write("/spectral-maps/spot/x", {nx}, x.data(), "m");
    f.write("/spectral-maps/spot/y", {ny}, y.data(), "m");
    f.write("/spectral-maps/spot/Ez/real", {1, ny, nx}, re.data(), "V/m");
    f.write("/spectral-maps/spot/Ez/imag", {1, ny, nx}, im.data(), "V/m");
  }
  const int status = std::system((std::string(TERAYEE_BINARY) + " measure focus '" + dir.string() +
                                  "' --map spot --axis x --face 0.05mm > /dev/null 2>&1").c_str());
  REQUIRE(WEXITSTATUS(status) == 0);
  std::ifstream in(dir / "focus.json");
  const auto j = nlohmann::json::parse(in);
  const double px = j["peak-position"][0], py = j["peak-position"][1];
  const double along = j["fwhm-along-axis"], across = j["fwhm-across-axis"];
  MESSAGE("focus: centre error (" << (px - x0) / wx << ", " << (py - y0) / wy << ") widths, FWHM along "
                                  << along / wx - 1 << ", across " << across / wy - 1);
  CHECK(std::abs(px - x0) < 0.01 * wx);
  CHECK(std::abs(py - y0) < 0.01 * wy);
  CHECK(std::abs(along / wx - 1) < 0.01);
  CHECK(std::abs(across / wy - 1) < 0.01);
  CHECK(j["distance-from-face"].get<double>() == doctest::Approx(px - 0.05e-3));
  fs::remove_all(dir);
}

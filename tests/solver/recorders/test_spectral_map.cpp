/// \file test_spectral_map.cpp
/// \brief The spectral map of a steady plane wave in vacuum: amplitude E0, time-averaged
/// Poynting vector E0^2 / (2 eta0) along the propagation (the plane-wave relation, e.g.
/// Born & Wolf sec. 1.4), phase advancing by k dx per cell (with the grid's own k, Taflove &
/// Hagness eq. 4.15), and nothing at a frequency the source does not carry.
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <cmath>
#include <filesystem>

#include "io/scene/constants.h"
#include "io/run/hdf5_file.h"
#include "solver/sources/incident.h"

namespace fs = std::filesystem;
using namespace ty;

TEST_CASE("spectral map of a steady plane wave: amplitude, Poynting vector and phase") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/cw-plane.yaml";
  const fs::path dir = fs::temp_directory_path() / "terayee-test-map";
  fs::remove_all(dir);
  const int status = std::system((std::string(TERAYEE_BINARY) + " run '" + scene + "' -o '" + dir.string() +
                                  "' --quiet > /dev/null 2>&1").c_str());
  REQUIRE(WEXITSTATUS(status) == 0);
  const auto h = h5::File::open((dir / "fields.h5").string());
  std::vector<hsize_t> shape;
  const auto re = h.read("/spectral-maps/steady/Ez/real", &shape), im = h.read("/spectral-maps/steady/Ez/imag");
  const auto sx = h.read("/spectral-maps/steady/Sx/real"), sy = h.read("/spectral-maps/steady/Sy/real");
  const auto x = h.read("/spectral-maps/steady/x");
  REQUIRE(shape.size() == 3);
  REQUIRE(shape[0] == 2);
  const size_t ny = shape[1], nx = shape[2];
  const double E0 = 1000, eta0 = 376.730313668, S0 = E0 * E0 / (2 * eta0);
  double worst_e = 0, worst_s = 0, worst_sy = 0, other = 0;
  for (size_t j = 0; j < ny; ++j)
    for (size_t i = 0; i < nx; ++i) {
      const size_t k = j * nx + i;
      worst_e = std::max(worst_e, std::abs(std::hypot(re[k], im[k]) / E0 - 1));
      worst_s = std::max(worst_s, std::abs(sx[k] / S0 - 1));
      worst_sy = std::max(worst_sy, std::abs(sy[k]) / S0);
      other = std::max(other, std::hypot(re[nx * ny + k], im[nx * ny + k]) / E0);
    }
  // phase per cell against the grid's wavenumber
  const double dt = 0.9 * 10e-6 / (299792458.0 * std::sqrt(2.0));
  const double k = yee_wavenumber(2 * constants::pi * 1e12, 0, 1, 10e-6, 10e-6, dt);
  double worst_phase = 0;
  for (size_t i = 1; i < nx; ++i) {
    double d = std::arg(std::complex<double>(re[i], im[i]) / std::complex<double>(re[i - 1], im[i - 1]));
    worst_phase = std::max(worst_phase, std::abs(d / (k * (x[i] - x[i - 1])) - 1));
  }
  MESSAGE("map: |Ez|/E0 - 1 up to " << worst_e << ", Sx/S0 - 1 up to " << worst_s << ", |Sy|/S0 " << worst_sy
                                    << ", phase step error " << worst_phase << ", 0.5 THz amplitude " << other);
  CHECK(worst_e < 0.005);
  CHECK(worst_s < 0.01);
  CHECK(worst_sy < 1e-6);
  CHECK(worst_phase < 1e-3);
  CHECK(other < 0.01);
  CHECK(h.read_attribute("/spectral-maps/steady/Sx/real", "units") == "W/m^2");
  fs::remove_all(dir);
}

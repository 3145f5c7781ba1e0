/// \file test_bloch_spectrum.cpp
/// \brief Bloch sides from the command line: `terayee run` of tests/data/bloch-half-space.yaml
/// (a dielectric half-space, eps = 4, at the k_x of a 30 degree wave at 1 THz), its reference
/// run, and `measure spectrum`: the reflectance at every frequency against Fresnel's at
/// theta(f) = asin(c k_x / 2 pi f) (Born & Wolf, Principles of Optics, 7th ed., sec. 1.5.2),
/// TE (Ez) and TM (Hz); then a sweep over k_x drawn by `render --plot bloch-map`, whose
/// resampled map at normal incidence must be ((n - 1)/(n + 1))^2. Scenes refused with
/// status 2: bloch along y, two wavenumber forms; a magnet under bloch sides runs, and a run
/// whose cells leave the small-signal step stops (status 1).
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "tests/helpers.h"

namespace fs = std::filesystem;
using ty::test::shell;

namespace {

const std::string kScene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/bloch-half-space.yaml";

/// Rows of a CSV after its header, as numbers.
std::vector<std::vector<double>> rows_of(const fs::path& file, std::string& header) {
  std::ifstream in(file);
  std::vector<std::vector<double>> out;
  std::getline(in, header);
  for (std::string line; std::getline(in, line);) {
    std::vector<double> r;
    std::stringstream ss(line);
    for (std::string cell; std::getline(ss, cell, ',');) r.push_back(std::strtod(cell.c_str(), nullptr));
    out.push_back(r);
  }
  return out;
}

/// The scene with `from` replaced by `to`, written to a temporary file.
std::string variant(const std::string& from, const std::string& to, const std::string& name,
                    const std::string& base = kScene) {
  std::ifstream in(base);
  std::stringstream ss;
  ss << in.rdbuf();
  std::string text = ss.str();
  const auto at = text.find(from);
  REQUIRE(at != std::string::npos);
  text.replace(at, from.size(), to);
  const fs::path out = fs::temp_directory_path() / ("terayee-test-" + name + ".yaml");
  std::ofstream(out) << text;
  return out.string();
}

double fresnel_R(bool te, double n, double sin_theta) {
  const double s = sin_theta, c = std::sqrt(1 - s * s), root = std::sqrt(n * n - s * s);
  const double r = te ? (c - root) / (c + root) : (n * n * c - root) / (n * n * c + root);
  return r * r;
}

}  // namespace

TEST_CASE("measure spectrum under Bloch sides: a half-space's R(f) at one k_x is Fresnel's at theta(f)") {
  const std::string bin = TERAYEE_BINARY;
  const double kx = 2 * ty::constants::pi * 1e12 * 0.5 / ty::constants::c0, n = 2;
  for (const std::string pol : {"Ez", "Hz"}) {
    const std::string set = " --set sources.0.plane.polarization=" + pol;
    const fs::path run = fs::temp_directory_path() / ("terayee-test-bloch-" + pol),
                   ref = fs::temp_directory_path() / ("terayee-test-bloch-ref-" + pol);
    fs::remove_all(run), fs::remove_all(ref);
    REQUIRE(shell(bin + " run '" + kScene + "' -o '" + run.string() + "' --quiet" + set) == 0);
    REQUIRE(shell(bin + " run '" + kScene + "' -o '" + ref.string() + "' --reference --quiet" + set) == 0);
    REQUIRE(shell(bin + " measure spectrum '" + run.string() + "' --reference '" + ref.string() + "'") == 0);
    std::string header;
    const auto rows = rows_of(run / "spectrum.csv", header);
    REQUIRE(header.rfind("frequency_Hz,reflectance", 0) == 0);
    double worst = 0;
    for (const auto& r : rows) {
      const double s = ty::constants::c0 * kx / (2 * ty::constants::pi * r[0]);
      worst = std::max(worst, std::abs(r[1] - fresnel_R(pol == "Ez", n, s)));
    }
    MESSAGE(pol << " wave: worst |R - R_Fresnel| " << worst << " over " << rows.size() << " frequencies, 0.7-1.3 THz");
    CHECK(rows.size() == 13);
    // measured: 0.0045 (Ez, at the band's low end) and 0.0009 (Hz), 2 um cells; with the
    // seam's phase dropped (a plain periodic seam) 0.096 and 0.071
    CHECK(worst < 0.006);
  }
}

TEST_CASE("a sweep over the Bloch wavenumber drawn as R(f, theta)") {
  const std::string bin = TERAYEE_BINARY;
  const fs::path dir = fs::temp_directory_path() / "terayee-test-bloch-sweep";
  fs::remove_all(dir);
  // k_x = -6000, 0, 6000 rad/m (the scene's angle form replaced by the wavenumber)
  const std::string scene = variant("bloch: {angle: 30 deg, at: 1 THz}", "bloch: {wavenumber: 0}", "bloch-k");
  REQUIRE(shell(bin + " sweep '" + scene + "' -o '" + dir.string() +
                "' --vary grid.bloch.wavenumber=-6000:6000:3 --measure "
                "'spectrum --reference auto' --jobs 1 --threads 1") == 0);
  REQUIRE(shell(bin + " render '" + dir.string() + "' --plot bloch-map") == 0);
  CHECK(fs::exists(dir / "pictures" / "reflectance-k.png"));
  REQUIRE(fs::exists(dir / "pictures" / "reflectance-angle.png"));
  std::string header;
  const auto cells = rows_of(dir / "pictures" / "reflectance-angle.csv", header);
  double worst = 0;
  int at_normal = 0, filled = 0;
  for (const auto& c : cells) {  // x: angle (rad), y: frequency, z: R
    if (c.size() < 3 || !std::isfinite(c[2])) continue;
    ++filled;
    if (std::abs(c[0]) < 1e-9) worst = std::max(worst, std::abs(c[2] - 1.0 / 9.0)), ++at_normal;
  }
  MESSAGE("bloch-map: " << filled << " cells filled, worst |R - 1/9| at normal incidence " << worst);
  CHECK(at_normal == 13);
  CHECK(worst < 0.003);
  CHECK(filled > 13);
}

TEST_CASE("bloch sides: refused along y and without a wavenumber - magnets run and stop past the small-signal tilt") {
  const std::string bin = TERAYEE_BINARY;
  CHECK(shell(bin + " check '" + kScene + "' --set grid.boundaries.y=bloch") == 2);
  CHECK(shell(bin + " check '" + kScene + "' --set grid.bloch.wavenumber=100") == 2);  // both forms
  const std::string magnet =
      variant("glass: {permittivity: 4}",
              "glass:\n    permittivity: 5.5\n    magnet:\n      sublattices:\n"
              "        - {saturation: 0.754 T, g: 2.0}\n        - {saturation: 0.754 T, g: 2.0}\n"
              "      exchange: 55 T\n      anisotropy:\n        - {axis: [0, 0, 1], field: 0.787 T}\n"
              "      order: [0, 0, 1]",
              "bloch-magnet");
  CHECK(shell(bin + " check '" + magnet + "'") == 0);  // magnets under bloch sides are allowed
  CHECK(shell(bin + " check '" + kScene + "'") == 0);
  // a field of 1e8 V/m tilts the cells far past the small-signal step (mu0 H = 0.33 T against
  // mu0 Ms = 0.754 T): the copies stop superposing, and the run stops saying so (status 1)
  const fs::path out = fs::temp_directory_path() / "terayee-test-bloch-magnet-tilt";
  const fs::path log = fs::temp_directory_path() / "terayee-test-bloch-magnet-tilt.log";
  fs::remove_all(out);
  CHECK(shell("(" + bin + " run '" + magnet + "' -o '" + out.string() +
              "' --set time.stop=10ps --set 'sources.0.plane.amplitude=1e8 V/m' 2> '" + log.string() + "')") == 1);
  std::ifstream in(log);
  std::stringstream text;
  text << in.rdbuf();
  CHECK(text.str().find("small-signal limit") != std::string::npos);
  CHECK(!fs::exists(out / "summary.json"));
  // at 1 kV/m the same run stays linear and completes
  fs::remove_all(out);
  CHECK(shell(bin + " run '" + magnet + "' -o '" + out.string() + "' --quiet --set time.stop=10ps") == 0);
}

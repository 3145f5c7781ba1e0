/// \file test_measure_arguments.cpp
/// \brief `terayee measure` refuses (exit status 2, a message naming what the run holds) every
/// argument outside what the run recorded, instead of measuring something else silently: a
/// line or region outside the map (a line at y = -20 mm on a map of +-10 mm once gave a
/// "shift" of -13969 um), a frequency the map did not record, a map or power-spectrum line
/// the run does not have, a reference run of another grid. The same commands inside the map
/// succeed, so each refusal is the argument's doing. The run folder is synthetic: a spectral
/// map of a Gaussian spot (Ez, Sx, Sy) at 1 THz on a 21 x 21 mm grid of 0.5 mm, and a
/// scene.yaml of that grid.
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "io/run/hdf5_file.h"

namespace fs = std::filesystem;
using namespace ty;

namespace {

/// A run folder holding the map `name` over x, y = -10..10 mm (step `d`), at 1 THz.
void write_map_run(const fs::path& dir, const std::string& name, double d) {
  fs::remove_all(dir);
  fs::create_directories(dir);
  const size_t n = static_cast<size_t>(std::lround(20e-3 / d)) + 1;
  std::vector<double> x(n), re(n * n), im(n * n, 0.0), sx(n * n), sy(n * n, 0.0);
  for (size_t i = 0; i < n; ++i) x[i] = -10e-3 + d * static_cast<double>(i);
  for (size_t j = 0; j < n; ++j)
    for (size_t i = 0; i < n; ++i) {
      const double I = std::exp(-(x[i] * x[i] + x[j] * x[j]) / (3e-3 * 3e-3));
      re[j * n + i] = 1e3 * std::sqrt(I);
      sx[j * n + i] = I;  // power flowing along +x
    }
  h5::File f = h5::File::create((dir / "fields.h5").string());
  const double freq = 1e12;
  const std::string b = "/spectral-maps/" + name;
  f.write(b + "/frequency", {1}, &freq, "Hz");
  f.write(b + "/x", {n}, x.data(), "m");
  f.write(b + "/y", {n}, x.data(), "m");
  f.write(b + "/Ez/real", {1, n, n}, re.data(), "V/m");
  f.write(b + "/Ez/imag", {1, n, n}, im.data(), "V/m");
  f.write(b + "/Sx/real", {1, n, n}, sx.data(), "W/m^2");
  f.write(b + "/Sx/imag", {1, n, n}, im.data(), "W/m^2");
  f.write(b + "/Sy/real", {1, n, n}, sy.data(), "W/m^2");
  f.write(b + "/Sy/imag", {1, n, n}, im.data(), "W/m^2");
  // the run's scene (measure shift takes the face plane and the grid from it)
  std::ofstream(dir / "scene.yaml")
      << "grid: {extent: [20 mm, 20 mm], cell: " << d * 1e3 << " mm}\ntime: {stop: 1 ps}\n"
      << "sources:\n  - point: {at: [0, 0], component: Ez, amplitude: 1 mA, frequency: 1 THz, "
      << "waveform: {kind: pulse, fwhm: 0.2 ps}}\n";
}

std::string quoted(const fs::path& p) {
  std::string s = "'";
  s += p.string();
  s += '\'';
  return s;
}

struct Outcome {
  int status = -1;
  std::string err;
};

Outcome terayee(const std::string& args) {
  const fs::path err = fs::temp_directory_path() / "terayee-test-arguments.err";
  const int s =
      std::system((std::string(TERAYEE_BINARY) + " " + args + " > /dev/null 2> '" + err.string() + "'").c_str());
  std::ifstream in(err);
  std::stringstream ss;
  ss << in.rdbuf();
  return {WIFEXITED(s) ? WEXITSTATUS(s) : -1, ss.str()};
}

/// Exit status 2 and a message holding `says`.
void check_refused(const std::string& args, const std::string& says) {
  const Outcome o = terayee(args);
  INFO("terayee " << args << "\n  -> " << o.status << ": " << o.err);
  CHECK(o.status == 2);
  CHECK(o.err.find(says) != std::string::npos);
}

}  // namespace

TEST_CASE("measure refuses arguments outside what the run holds") {
  const fs::path run = fs::temp_directory_path() / "terayee-test-arguments",
                 coarse = fs::temp_directory_path() / "terayee-test-arguments-coarse";
  write_map_run(run, "cut", 0.5e-3);
  write_map_run(coarse, "cut", 1e-3);
  const std::string r = quoted(run), c = quoted(coarse);
  const std::string shift = "measure shift " + r + " --reference " + r + " --map cut --interface 0mm --angle 30deg";

  // shift: the line must cross the map (its nodes y = -10..10 mm, within half a spacing)
  for (const char* line : {" --line y=-5mm", " --line y=10.2mm"}) {
    const Outcome o = terayee(shift + line);
    INFO(line << " -> " << o.err);
    CHECK(o.status == 0);
  }
  check_refused(shift + " --line y=-20mm", "lies outside the map 'cut', which spans y = -10 to 10 mm");
  check_refused(shift + " --line x=10.3mm", "outside the map");
  check_refused(shift + " --line y=0mm --frequency 2THz", "has no frequency 2000 GHz");
  check_refused("measure shift " + r + " --reference " + c + " --map cut --interface 0mm --angle 30deg --line y=0mm",
                "other nodes");
  check_refused("measure shift " + r + " --reference " + r + " --map other --interface 0mm --angle 30deg --line y=0mm",
                "no spectral map named 'other'");

  // focus: a frequency or a map it does not hold, a reference of another grid
  CHECK(terayee("measure focus " + r + " --map cut --frequency 1THz").status == 0);
  check_refused("measure focus " + r + " --map cut --frequency 0.5THz", "has no frequency 500 GHz");
  check_refused("measure focus " + r + " --map spot", "no spectral map named 'spot'");
  check_refused("measure focus " + r + " --map cut --reference " + c, "other nodes");

  // angle: the region must lie inside the map
  CHECK(terayee("measure angle " + r + " --map cut --region 0mm 0mm 8mm 8mm --normal x").status == 0);
  check_refused("measure angle " + r + " --map cut --region 0mm 0mm 30mm 8mm --normal x",
                "is not inside the map 'cut'");
  check_refused("measure angle " + r + " --map cut --region 15mm 0mm 2mm 2mm --normal x", "is not inside the map");

  // spectrum: line names the run does not have
  check_refused("measure spectrum " + r + " --reference " + r + " --reflected front",
                "no power-spectrum line named 'front'");
  fs::remove_all(run);
  fs::remove_all(coarse);
}

/// \file test_check_estimates.cpp
/// \brief `terayee check`'s memory and run-time estimates. The memory estimate is held to
/// within 1.5x of what the kernel measures for the run that follows: its peak resident set
/// (getrusage's ru_maxrss of the finished child, the figure /usr/bin/time -v prints), on a
/// single-precision scene whose fields and medium map are most of its memory. The
/// run-time estimate is not timed here (machines differ); what is checked is that its terms
/// count the work: a running DFT sums every frequency at every point on each sampled step,
/// so its term grows in proportion to the number of frequencies.
#include <doctest/doctest.h>
#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <regex>
#include <string>

#include "tests/tools/capture.h"

namespace {

namespace fs = std::filesystem;

// 1200 x 1000 cells in single precision and a handful of steps: the fields are ~29 MB and the
// medium map ~5 MB, beside the program's own ~20 MB (an array of every node's ca and cb while the
// media were built, six doubles a node, would add ~58 MB: the builder keeps one row at a time)
const char* kLarge = R"(title: "memory"
grid: {extent: [24 mm, 20 mm], cell: 20 um, boundaries: {x: periodic, y: periodic}}
time: {stop: 0.3 ps, step-fraction: 0.9, precision: single}
media:
  glass: {permittivity: 4}
bodies:
  - {medium: glass, circle: {centre: [0, 0], radius: 5 mm}}
sources:
  - point: {at: [-8 mm, 0], component: Ez, amplitude: 1 mA, frequency: 1 THz, waveform: {kind: cw, ramp: 2 periods}}
outputs:
  - probe: {name: p, at: [8 mm, 0], fields: [Ez]}
)";

// a small vacuum grid with a pulse and one power-spectrum line of `count` frequencies
const char* kLine = R"(title: "line"
grid: {extent: [2 mm, 2 mm], cell: 20 um}
time: {stop: 20 ps, step-fraction: 0.9}
sources:
  - point: {at: [-0.5 mm, 0], component: Ez, amplitude: 1 mA, frequency: 1 THz, waveform: {kind: pulse, fwhm: 1 ps, delay: 3 ps}}
outputs:
  - power-spectrum: {name: line, line: {x: 0.5 mm}, band: {from: 0.5 THz, to: 1.5 THz, count: 11}}
)";

std::string write_scene(const std::string& name, const char* text) {
  const fs::path dir = fs::temp_directory_path() / ("terayee-estimates-" + std::to_string(getpid()));
  fs::create_directories(dir);
  const fs::path p = dir / name;
  std::ofstream(p) << text;
  return p.string();
}

double number(const std::string& text, const std::string& pattern) {
  std::smatch m;
  REQUIRE_MESSAGE(std::regex_search(text, m, std::regex(pattern)), pattern << " in\n" << text);
  return std::stod(m[1]);
}

/// Seconds of a printed duration ("12.3 s", "4.5 min", "1.2 h").
double seconds(const std::string& text, const std::string& what) {
  std::smatch m;
  REQUIRE_MESSAGE(std::regex_search(text, m, std::regex(what + ": ([0-9.e+-]+) (s|min|h)")), what << " in\n" << text);
  return std::stod(m[1]) * (m[2] == "min" ? 60 : m[2] == "h" ? 3600 : 1);
}

/// The peak resident set of `terayee run` on the scene, bytes (the kernel's count).
double peak_of_run(const std::string& scene) {
  const std::string out = fs::path(scene).replace_extension("").string() + "-run";
  const pid_t pid = fork();
  REQUIRE(pid >= 0);
  if (pid == 0) {
    execl(TERAYEE_BINARY, TERAYEE_BINARY, "run", scene.c_str(), "-o", out.c_str(), "--quiet", "--overwrite",
          static_cast<char*>(nullptr));
    _exit(127);
  }
  int status = 0;
  rusage use{};
  REQUIRE(wait4(pid, &status, 0, &use) == pid);
  REQUIRE(WIFEXITED(status));
  REQUIRE(WEXITSTATUS(status) == 0);
  return use.ru_maxrss * 1024.0;  // kB on Linux
}

}  // namespace

TEST_CASE("terayee check: the memory estimate within 1.5x of the run's peak resident set (getrusage)") {
  const std::string scene = write_scene("large.yaml", kLarge);
  const std::string out = ty::test::capture(std::string(TERAYEE_BINARY) + " check '" + scene + "' 2>&1");
  const double estimate = number(out, "memory: about ([0-9.]+) MB at the peak") * 1e6;
  // no whole-grid coefficient arrays while the media are built (coefficient_runs.cpp builds
  // row by row); were they back, the peak would pass the estimate by their ~58 MB (2x)
  CHECK(out.find("coefficients while the media are built") == std::string::npos);
  const double peak = peak_of_run(scene);
  MESSAGE("estimated " << estimate / 1e6 << " MB, measured peak " << peak / 1e6 << " MB");
  CHECK(peak > 40e6);  // the scene's arrays, not the program, are most of the figure
  CHECK(estimate / peak < 1.5);
  CHECK(peak / estimate < 1.5);
}

TEST_CASE("terayee check: with Bloch sides the sine copy's arrays are counted (within 1.5x of the peak)") {
  // the same scene between Bloch sides: two real copies of the grid are stepped (the
  // sine-cosine method: Harms, Mittra & Ko, IEEE Trans. Antennas Propag. 42, 1317 (1994)); an
  // estimate of one copy read 110 MB against a peak of 175 MB
  std::string text = kLarge;
  const std::string from = "boundaries: {x: periodic, y: periodic}}";
  text.replace(text.find(from), from.size(), "boundaries: {x: bloch, y: periodic}, bloch: {wavenumber: 1000}}");
  const std::string scene = write_scene("large-bloch.yaml", text.c_str());
  const std::string out = ty::test::capture(std::string(TERAYEE_BINARY) + " check '" + scene + "' 2>&1");
  const double estimate = number(out, "memory: about ([0-9.]+) MB at the peak") * 1e6;
  CHECK(out.find("fields and absorber (the Bloch sides' sine copy)") != std::string::npos);
  const double peak = peak_of_run(scene);
  MESSAGE("estimated " << estimate / 1e6 << " MB, measured peak " << peak / 1e6 << " MB");
  CHECK(estimate / peak < 1.5);
  CHECK(peak / estimate < 1.5);
}

TEST_CASE("terayee check: the running DFT's term grows with its frequencies (frequencies x points per sampled step)") {
  const std::string scene = write_scene("line.yaml", kLine);
  auto dft = [&](int count) {
    const std::string out = ty::test::capture(std::string(TERAYEE_BINARY) + " check '" + scene +
                                              "' --threads 1 --set outputs.0.power-spectrum.band.count=" +
                                              std::to_string(count) + " 2>&1");
    CHECK(out.find(std::to_string(count) + " frequencies x") != std::string::npos);
    return seconds(out, "power spectrum 'line'");
  };
  const double few = dft(11), many = dft(1001);
  MESSAGE("11 frequencies: " << few << " s, 1001: " << many << " s");
  // 91 times the work; the per-step overhead (the stencils, the thread fork) keeps it under 91
  CHECK(many > 10 * few);
  CHECK(many < 200 * few);
}

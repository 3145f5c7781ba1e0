/// \file test_line_probe.cpp
/// \brief A probe over a line (a finite detector) records the line mean of the field: across
/// the waist of a Gaussian beam, whose field there is E0 exp(-s^2 / w0^2) (incident.h; the
/// angular-spectrum beam), the mean over a centred line of length L is
/// E0 (w0 sqrt(pi) / L) erf(L / (2 w0)) (the Gaussian integral), 0.7468 E0 for L = 2 w0.
#include <doctest/doctest.h>

#include <cmath>
#include <complex>
#include <filesystem>
#include <fstream>

#include "io/analysis/spectroscopy/probe_trace.h"
#include "io/analysis/spectroscopy/trace_spectrum.h"
#include "io/scene/constants.h"
#include "tests/helpers.h"

namespace fs = std::filesystem;

TEST_CASE("line probe: the mean of a Gaussian beam's field across its waist") {
  const fs::path dir = fs::temp_directory_path() / "terayee-test-line-probe";
  fs::create_directories(dir);
  std::ofstream(dir / "beam.yaml") << R"(title: "line probe"
grid: {extent: [6 mm, 6 mm], cell: 30 um, boundaries: {x: absorbing, y: absorbing}}
time: {stop: 40 ps}
sources:
  - beam: {polarization: Ez, frequency: 0.5 THz, waist: 1 mm, focus: [0, 0], launch: {x: -2 mm},
           amplitude: 1 kV/m, waveform: {kind: cw, ramp: 5 periods}}
outputs:
  - probe: {name: point, at: [0, 0], fields: [Ez]}
  - probe: {name: line, over: {from: [0, -1 mm], to: [0, 1 mm]}, fields: [Ez]}
)";
  const fs::path run = dir / "run";
  REQUIRE(ty::test::shell(std::string(TERAYEE_BINARY) + " run '" + (dir / "beam.yaml").string() + "' -o '" +
                          run.string() + "' --quiet --overwrite") == 0);
  const auto p = ty::read_probe_trace(run.string(), "point", "Ez"),
             l = ty::read_probe_trace(run.string(), "line", "Ez");
  const ty::TimeWindow last{20e-12, 40e-12, 2e-12};  // steady state
  const auto P = ty::fourier(p.time, p.value, {0.5e12}, last), L = ty::fourier(l.time, l.value, {0.5e12}, last);
  const double expected = std::sqrt(ty::constants::pi) / 2 * std::erf(1.0);
  MESSAGE("line mean / point: " << std::abs(L[0] / P[0]) << " (expected " << expected << ")");
  CHECK(std::abs(L[0] / P[0]) == doctest::Approx(expected).epsilon(0.01));
  CHECK(std::abs(std::arg(L[0] / P[0])) < 0.02);  // a flat phase front at the waist
}

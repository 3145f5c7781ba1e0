/// \file test_absorber_stability.cpp
/// \brief Absorbers with a magnet through them: an MnF2 half-space (three absorbers) and a
/// 0.6 mm plate (the two side absorbers), lit by a pulsed or cw line current below, inside
/// and above the crystal's band, at several cells. Three crystals (absorber_cases.h): a-cut,
/// hyperbolic (mu_perp < 0 on about 261.4-263.1 GHz for these parameters,
/// shared/references.md), also turned 90 degrees (it must repeat the upright run to
/// round-off, check_turned); c-cut, negative-mu in the plane over the same band; c-cut with 0.2 T along z,
/// gyrotropic, its band moved with the split lines. Nothing in the default absorber may
/// amplify (solver/grid/graded_loss.h: a loss on E and H, no stretch; the energy balance
/// dW/dt = -nu (eps E^2 + mu0 H^2) - Gilbert loss <= 0): once the pulse has passed, the
/// energy (field + magnetic) averaged over a period never rises, and the absorber's cells
/// never tilt more than the interior's. The guard (solver/guard/growth_guard.h) stays quiet.
/// The long version (5-50 um, pulsed and cw, 4 ns) is the skipped case "absorbers, long":
///   ./build/terayee_tests -tc="absorbers\, long*" --no-skip     (or tools/absorber-check.sh)
/// TERAYEE_ABSORBER_CELL=50 TERAYEE_ABSORBER_PICK="a-cut plate pulse 250" picks cases (each
/// word a word of the case's name, absorber_cases.h case_name);
/// TERAYEE_ABSORBER_KIND=pml forces the PML on every side (to see what the default avoids);
/// TERAYEE_ABSORBER_TRACE=1 traces their tilts (print_trace below); TERAYEE_ABSORBER_STEPS=N
/// runs N steps instead of 4 ns (the long run: an MnF2 half-space at 5 um for 10^6
/// steps, TERAYEE_ABSORBER_CELL=5 TERAYEE_ABSORBER_STEPS=1000000 TERAYEE_ABSORBER_PICK=...).
#include <doctest/doctest.h>
#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <iterator>
#include <sstream>
#include <string>
#include <vector>

#include "tests/solver/absorber_checks.h"

using namespace ty;
using test::AbsorberCase;
using test::AbsorberOutcome;
using test::check_quiet;

namespace {

/// The same case turned 90 degrees (the a-cut axis along y: hyperbolic along y, where the
/// body meets the y layers). The Ez wave's Yee scheme, the gather and scatter and the square
/// grid's layers are the same under x <-> y (Hx <-> -Hy), so the turned run must repeat the
/// upright one to round-off: a y layer that differs from an x layer shows here.
void check_turned(AbsorberCase c, const AbsorberOutcome& upright) {
  c.turned = true;
  const AbsorberOutcome turned = check_quiet(c);
  const double d_energy = std::abs(turned.energy_end / upright.energy_end - 1);
  const double d_tilt =
      std::max(std::abs(turned.tilt_in / upright.tilt_in - 1), std::abs(turned.tilt_out / upright.tilt_out - 1));
  MESSAGE(fmt::format("turned against upright: energy at the end {:.2e}, tilts {:.2e} (relative)", d_energy, d_tilt));
  CHECK(d_energy < 1e-12);  // measured 4e-16 (half-space), 1.6e-15 (plate)
  CHECK(d_tilt < 1e-11);    // 1.4e-13, 1.1e-13 (the tilt from a chord: asin of a small sqrt)
}

}  // namespace

TEST_CASE("absorbers: an MnF2 half-space and plate, upright and turned, never gain energy") {
  for (double f : {250e9, 262.5e9, 275e9}) {  // 50 um here; 5-50 um, pulsed and cw, in the long case
    AbsorberCase c;
    c.cell = 50e-6;
    c.frequency = f;
    for (bool plate : {false, true}) {
      c.plate = plate;
      const AbsorberOutcome upright = check_quiet(c);
      if (f == 262.5e9) check_turned(c, upright);  // in the band
    }
  }
}

TEST_CASE("absorbers: a negative-mu and a gyrotropic MnF2 crystal in their bands never gain energy") {
  for (double bias : {0.0, 0.2}) {  // c-cut: mu_perp < 0 in both plane directions; biased: split lines
    AbsorberCase c;
    c.cell = 50e-6;
    c.c_cut = true;
    c.bias = bias;
    c.frequency = test::band_carriers(c)[1];
    check_quiet(c);
    c.plate = true;
    check_quiet(c);
  }
}

TEST_CASE("absorbers: the long matrix picks and leaves out cases by the words of their names") {
  // the harness's own selector (absorber_cases.h, picked), on the names the matrix gives its
  // cases: a run that asks for the unbiased c-cut plates must not also take the biased ones
  AbsorberCase plain, biased;
  plain.c_cut = biased.c_cut = true, plain.plate = biased.plate = true;
  biased.bias = 0.2, plain.frequency = biased.frequency = 250e9;
  const std::string a = test::case_name(plain), b = test::case_name(biased);
  CHECK(a == "c-cut plate pulse 250");
  CHECK(b == "c-cut 0.2 T plate pulse 250");
  CHECK(test::picked(a, "") == true);
  CHECK(test::picked(b, "c-cut plate pulse") == true);
  CHECK(test::picked(a, "c-cut plate -T") == true);
  CHECK(test::picked(b, "c-cut plate -T") == false);
  CHECK(test::picked(a, "c-cut plate cw") == false);
  CHECK(test::picked(a, "a-cut") == false);
  CHECK(test::picked(a, "-") == false);  // a lone '-' is a word to find, not an exclusion
}

TEST_CASE("absorbers, long: 5-50 um, pulsed and cw, below, inside and above the band" * doctest::skip()) {
  // TERAYEE_ABSORBER_CELL (um) runs one cell size only (tools/absorber-check.sh runs them in turn)
  std::vector<double> cells{50e-6, 20e-6, 10e-6, 5e-6};
  if (const char* only = std::getenv("TERAYEE_ABSORBER_CELL")) cells = {std::atof(only) * 1e-6};
  // and TERAYEE_ABSORBER_PICK (e.g. "a-cut plate pulse 250") only the cases that have each of
  // its words among the words of their name (absorber_cases.h, case_name) and none of its
  // words written with a leading '-' ("c-cut plate -T": the unbiased c-cut plates only)
  const std::string pick = std::getenv("TERAYEE_ABSORBER_PICK") ? std::getenv("TERAYEE_ABSORBER_PICK") : "";
  // TERAYEE_ABSORBER_NAME: the one case of exactly that name (tools/absorber-check.sh --queue);
  // TERAYEE_ABSORBER_LIST: print the picked cases' names ("case: NAME"), run none
  const char* exact = std::getenv("TERAYEE_ABSORBER_NAME");
  const bool listing = std::getenv("TERAYEE_ABSORBER_LIST") != nullptr;
  auto wanted = [&](const AbsorberCase& c) {
    return exact ? test::case_name(c) == exact : test::picked(test::case_name(c), pick);
  };
  // hyperbolic (a-cut), negative-mu (c-cut), gyrotropic (c-cut, 0.2 T along z); the turned
  // scene repeats the upright one to round-off (the CI case above), so it is not run here
  AbsorberCase crystals[3];
  crystals[1].c_cut = crystals[2].c_cut = true;
  crystals[2].bias = 0.2;
  const char* steps = std::getenv("TERAYEE_ABSORBER_STEPS");  // the run's last step is N
  const char* kind = std::getenv("TERAYEE_ABSORBER_KIND");    // "pml": the layer that can amplify
  const bool traced = std::getenv("TERAYEE_ABSORBER_TRACE") != nullptr;
  std::vector<std::string> names;  // every case's name, to say so when a pick takes none
  int ran = 0;
  for (const AbsorberCase& crystal : crystals) {
    const auto carriers = test::band_carriers(crystal);
    for (double cell : cells)
      for (bool plate : {false, true})
        for (bool cw : {false, true})
          for (double f : carriers) {
            AbsorberCase c = crystal;
            c.cell = cell;
            c.frequency = f;
            c.plate = plate;
            c.cw = cw;
            names.push_back(test::case_name(c));
            if (!wanted(c)) continue;
            ++ran;
            if (listing) {
              fmt::print("case: {}\n", test::case_name(c));
              continue;
            }
            c.stop = steps ? (std::atof(steps) - 0.5) * c.step_fraction * courant_limit_dt(cell, cell) : 4e-9;
            if (traced) c.trace = 8;  // samples a period
            if (kind) c.kind = std::string(kind) == "pml" ? Absorber::Kind::pml : Absorber::Kind::graded;
            check_quiet(c);
          }
  }
  // a pick that matches no case ran nothing: a failure, not a pass (a carrier misspelled)
  if (ran == 0)
    FAIL_CHECK("TERAYEE_ABSORBER_" << (exact ? "NAME" : "PICK") << "=\"" << (exact ? exact : pick)
                                    << "\" takes none of: " << fmt::format("{}", fmt::join(names, ", ")));
}

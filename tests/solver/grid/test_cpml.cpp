/// \file test_cpml.cpp
/// \brief The convolutional PML (Roden & Gedney, Microwave Opt. Technol. Lett. 27, 334
/// (2000)): a broadband pulse from a line source in vacuum, recorded a few cells from the
/// absorber, against the same run in a domain so large that nothing comes back from its
/// edges within the window. The issue asks for the worst difference below -60 dB of the
/// reference peak with 16 cells (Roden & Gedney report better; common practice expects
/// -60 to -80 dB at normal incidence).
#include <doctest/doctest.h>

#include "solver/recorders/recorders.h"
#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

std::vector<double> record(int n, const Vec2& src_from_centre, const Vec2& probe_from_centre, Component c, long steps) {
  const double d = 10e-6;
  Scene s = test::box_scene(n, n, d, Boundary::absorbing, Boundary::absorbing, 0.95, 1e-9);
  s.grid.absorber.cells = 16;
  const Vec2 centre{0.5 * n * d, 0.5 * n * d};
  // 1 THz carrier, 0.6 ps FWHM: 10 to 1 % of the spectrum spans about 0.2 to 1.8 THz
  // (17 to 170 cells per wavelength)
  Source src = test::point_source(c, {centre.x + src_from_centre.x, centre.y + src_from_centre.y}, 1e12, 0.6e-12,
                                  2.0e-12, is_electric(c) ? 1e-3 : 1.0);
  s.sources.push_back(src);
  Simulation<double> sim(s, 2);
  return test::probe_series(sim, c, {centre.x + probe_from_centre.x, centre.y + probe_from_centre.y}, steps);
}

}  // namespace

TEST_CASE("CPML of 16 cells reflects less than -60 dB of a broadband pulse") {
  const double d = 10e-6;
  const long steps = 1400;  // c t = 940 cells at step-fraction 0.95
  for (Component c : {Component::Ez, Component::Hz}) {
    // small box: 80 cells across; source 20 cells left of centre, probe 5 cells from the
    // absorber on the right and 10 from the top (near a corner, where it is hardest)
    const Vec2 src{-20 * d, 0}, probe{35 * d, 30 * d};
    const auto small = record(80, src, probe, c, steps);
    const auto big = record(1000, src, probe, c, steps);
    double peak = 0, worst = 0;
    for (long k = 0; k < steps; ++k) {
      peak = std::max(peak, std::abs(big[k]));
      worst = std::max(worst, std::abs(small[k] - big[k]));
    }
    const double db = 20 * std::log10(worst / peak);
    MESSAGE(std::string(component_name(c)) << ": worst reflection " << db << " dB of the reference peak");
    CHECK(db < -60);
  }
}

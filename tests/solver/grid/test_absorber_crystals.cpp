/// \file test_absorber_crystals.cpp
/// \brief The absorber cases of test_absorber_stability.cpp on every crystal of the library
/// (io/scene/crystals/), read by name as a scene's `crystal:` medium is: each as a half-space
/// through three absorbers and as a plate through the side ones, lit by a pulsed line current
/// at the centre of its widest band where the Ez wave is evanescent at normal incidence
/// (io/analysis/negative_permeability.h: hyperbolic or negative-mu, whichever the cut gives),
/// the cut (a, b or c) that gives the widest. The MnF2 scene's lengths and times are scaled
/// by 262.5 GHz over the carrier, so that every crystal meets the same grid in wavelengths
/// (23 cells a vacuum wavelength: the MnF2 case's 50 um; the half-space for 4 ns at 262.5 GHz,
/// 1050 periods, the plate for 0.6 ns).
/// Nothing in the default absorber may
/// amplify whatever the crystal: after the pulse the energy never rises, the absorber's
/// largest tilt stays below the interior's, the guard stays quiet (the energy balance of
/// solver/grid/graded_loss.h holds for any medium; this checks it on crystals no absorber
/// test was written for: uniaxial and biaxial antiferromagnets, canted ones with the
/// Dzyaloshinskii-Moriya field, ferrimagnets as one sublattice). It tells an amplifying layer:
/// with the PML forced on every side (c.kind = Absorber::Kind::pml) the MnF2 half-space's
/// energy rises 0.18 and the biased YIG's 2.4 after the pulse, the layer's tilt 1.5x and 4x the
/// interior's, and the guard stops both; over 0.6 ns (the MnF2 cases' CI length) neither grew.
#include <doctest/doctest.h>
#include <fmt/format.h>

#include <string>
#include <vector>

#include "io/scene/crystals/crystal_table.h"
#include "materials/magnetic/ground_state.h"
#include "materials/magnetic/linear_response.h"
#include "tests/solver/absorber_checks.h"

using namespace ty;
using test::AbsorberCase;

namespace {

struct CrystalBand {
  char cut = 0;
  double bias = 0;          ///< T, along z
  double from = 0, to = 0;  ///< GHz
};

/// The widest band, over the cuts and both face normals, in which the Ez wave of the library
/// crystal `name` is evanescent at normal incidence, searched just above each of its lines
/// (a band starts at a line: the susceptibility's pole), under a bias along z.
CrystalBand widest_band(const std::string& name, double bias) {
  CrystalBand best;
  for (char cut : {'a', 'b', 'c'}) {
    AbsorberCase c;
    c.crystal = name, c.cut = cut, c.bias = bias;
    const Scene s = test::absorber_scene(c);
    const MagnetModel M(*s.media.at(0).magnet, s.bias);
    const GroundStates gs = find_ground_states(M);
    for (double line : resonances(M, gs.ground)) {
      if (line < 1e9) continue;  // a soft mode of an easy plane: no band at a terahertz grid's scale
      const auto [a, b] = test::widest_ez_band(s, 0.999 * line, 1.5 * line);
      if (b - a > best.to - best.from) best = {cut, bias, a, b};
    }
  }
  return best;
}

}  // namespace

TEST_CASE("absorbers: every crystal of the library, in its band, never gains energy") {
  int ran = 0;
  for (const Crystal& k : crystal_table()) {
    const std::string name(k.name);
    // a soft ferromagnet (YIG: no anisotropy in the model) has no line without a bias: 1 T
    // along z saturates it and puts Kittel's line at about 28 GHz
    CrystalBand band = widest_band(name, 0);
    if (band.to <= band.from) band = widest_band(name, 1.0);
    INFO(name);
    // every ordered crystal of the library, biased where it has no line of its own, has a
    // line that the in-plane H of an Ez wave drives at some cut, and above it a band of
    // negative mu (Kittel's and the antiferromagnetic resonance: the susceptibility's pole)
    REQUIRE(band.to > band.from);
    AbsorberCase c;
    c.crystal = name, c.cut = band.cut, c.bias = band.bias;
    c.frequency = 0.5 * (band.from + band.to) * 1e9;
    c.scale = 262.5e9 / c.frequency;
    c.cell = 50e-6 * c.scale;
    for (bool plate : {false, true}) {
      // the half-space for 4 ns (the PML's growth shows there, above), the plate for 0.6 ns
      c.plate = plate, c.stop = (plate ? 0.6e-9 : 4e-9) * c.scale;
      INFO(fmt::format("band {:.4g}-{:.4g} GHz", band.from, band.to));
      // the verdict of the MnF2 cases (absorber_checks.h): guard quiet, no rise after the
      // pulse, the layer's tilt not above the interior's, less energy than injected
      const test::AbsorberOutcome o = test::check_quiet(c);
      CHECK(o.tilt_out > 0);  // the pulse reached the crystal
      ++ran;
    }
  }
  CHECK(ran >= 16);  // the library's eight crystals at least, each twice
}

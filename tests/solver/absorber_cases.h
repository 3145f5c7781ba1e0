/// \file absorber_cases.h
/// \brief Scenes for the absorber tests: an MnF2 crystal as a half-space through three
/// absorbers or as a plate through the two side absorbers, lit by a line current; and the
/// run that measures energy and tilts after the source has stopped. Three crystals:
/// - a-cut (easy axis along x): the Ez wave sees mu_xx = 1 and mu_yy = mu_perp, a hyperbolic
///   band where mu_perp < 0 (backward waves along x);
/// - c-cut (easy axis along z): mu_xx = mu_yy = mu_perp, a negative-mu band in which the
///   wave is evanescent in every direction (magnetic surface waves along the faces);
/// - c-cut with a bias along z: the Polder tensor (mu, i kappa) in the plane, gyrotropic, its
///   line split in two and the band of mu_V = (mu^2 - kappa^2) / mu < 0 moved with it
///   (io/analysis/negative_permeability.h finds it).
/// Or any crystal of the library by name (AbsorberCase::crystal, test_absorber_crystals.cpp),
/// the scene scaled to its band.
#pragma once
#include <doctest/doctest.h>
#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <iterator>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include "io/analysis/negative_permeability.h"
#include "io/scene/scene_reader.h"
#include "solver/guard/growth_guard.h"
#include "solver/simulation.h"
#include "tests/helpers.h"
#include "tests/solver/absorber_trace.h"

namespace ty::test {

struct AbsorberCase {
  double cell = 20e-6;
  double frequency = 262.5e9;  ///< carrier: below (250), inside (262.5) or above (275 GHz) the band
  bool plate = false;          ///< a 0.6 mm plate through the side absorbers, else a half-space
  bool c_cut = false;          ///< easy axis along z (negative-mu band), else along x (hyperbolic)
  double bias = 0;             ///< mu0 H0 along z, T (with c_cut: a gyrotropic crystal)
  bool turned = false;         ///< the scene turned 90 degrees: x and y swapped (the a-cut axis along y)
  bool cw = false;
  double stop = 0.6e-9;
  Absorber::Kind kind = Absorber::Kind::automatic;
  double damping = 1e-4;
  double step_fraction = 0.95;
  int trace = 0;  ///< samples a period of the tilt trace (absorber_trace.h); 0: no trace
  /// a crystal of the library by name, cut `cut` (io/scene/crystals/; empty: the MnF2
  /// model above), read as a scene's `crystal:` medium is (its own damping; c_cut, turned and
  /// damping do not apply); its lengths and times are the MnF2 scene's times `scale`, and so
  /// is the line current, whose field goes as its frequency times its current
  /// (test_absorber_crystals.cpp sets it from the crystal's band)
  std::string crystal;
  char cut = 'c';
  double scale = 1;
};

struct AbsorberOutcome {
  double rise = 0;  ///< largest rise of the period-averaged scheme energy (below) over its earlier minimum, relative
  double rise_plain = 0;  ///< the same for the plain sum field_energy() + magnetic_energy() (E at n+1, H at n+1/2)
  /// largest tilt inside the absorbing layers over the run's last quarter and outside them
  /// over its last half (every step), rad: each region's peak whatever the phase and the beat
  /// the run ends at, and the interior's over the time a slow wave takes to reach the layer
  double tilt_in = 0, tilt_out = 0;
  double energy_end = 0, injected = 0;  ///< J/m
  std::string guard;                    ///< the guard's error, if it fired
  long guard_step = 0, steps = 0;
  double dt = 0;
  int npx = 0;
  long trace_every = 0;  ///< steps between the trace's samples
  TiltTrace trace;       ///< when AbsorberCase::trace > 0; its column envelope over the last quarter of the run
};

/// The case's name in messages and in TERAYEE_ABSORBER_PICK (whose words must each be one of
/// its words): the crystal ("a-cut", "c-cut" or "c-cut 0.2 T"), the body ("half-space",
/// "plate", "half-space-turned", "plate-turned"), "pulse" or "cw", the carrier in GHz.
inline std::string case_name(const AbsorberCase& c) {
  std::string crystal = !c.c_cut ? "a-cut" : c.bias == 0 ? "c-cut" : fmt::format("c-cut {:g} T", c.bias);
  if (!c.crystal.empty())
    crystal = fmt::format("{} {}-cut{}", c.crystal, c.cut, c.bias == 0 ? "" : fmt::format(" {:g} T", c.bias));
  return fmt::format("{} {}{} {} {:g}", crystal, c.plate ? "plate" : "half-space", c.turned ? "-turned" : "",
                     c.cw ? "cw" : "pulse", c.frequency / 1e9);
}

/// Whether a case named `name` is among those `pick` asks for (TERAYEE_ABSORBER_PICK): each
/// word of pick must be a word of the name, and a word written with a leading '-' must not be
/// ("c-cut plate -T": the unbiased c-cut plates only). An empty pick takes every case.
inline bool picked(const std::string& name, const std::string& pick) {
  std::istringstream in(name), asked(pick);
  const std::vector<std::string> words{std::istream_iterator<std::string>(in), {}};
  for (std::string w; asked >> w;) {
    const bool excluded = w.size() > 1 && w[0] == '-';
    const bool has = std::find(words.begin(), words.end(), excluded ? w.substr(1) : w) != words.end();
    if (has == excluded) return false;
  }
  return true;
}

inline Scene absorber_scene(const AbsorberCase& c);

/// The carriers below, inside and above the crystal's band: 250 and 275 GHz, and inside it
/// 262.5 GHz (mu_perp < 0 on 261.44-263.10 GHz without a bias, shared/references.md) or,
/// with a bias, the centre of the widest band in which the Ez wave is evanescent at normal
/// incidence on either face (io/analysis/negative_permeability.h).
inline std::pair<double, double> widest_ez_band(const Scene& s, double f0, double f1);

inline std::array<double, 3> band_carriers(const AbsorberCase& c) {
  REQUIRE(c.crystal.empty());  // the MnF2 model's carriers (a library crystal's: test_absorber_crystals.cpp)
  double inside = 262.5e9;
  if (c.bias != 0) {
    const auto [from, to] = widest_ez_band(absorber_scene(c), 240e9, 285e9);
    if (to > from) inside = 0.5 * (from + to) * 1e9;  // bands in GHz
  }
  return {250e9, inside, 275e9};
}

/// The widest band (GHz; from = to = 0 if none) within [f0, f1] (Hz) in which the Ez wave of
/// the scene's magnets is evanescent at normal incidence on a face normal to x or to y
/// (io/analysis/negative_permeability.h).
inline std::pair<double, double> widest_ez_band(const Scene& s, double f0, double f1) {
  std::pair<double, double> widest{0, 0};
  for (int normal : {0, 1})
    for (const auto& band : negative_mu_bands(s, f0, f1, normal))
      if (band.second - band.first > widest.second - widest.first) widest = band;
  return widest;
}

/// The medium a scene's `media: {x: {crystal: NAME, cut: CUT}}` reads to (the library's
/// values at their own temperature, its damping included).
inline Medium library_medium(const std::string& name, char cut) {
  const std::string text = fmt::format(
      "grid: {{extent: [1 mm, 1 mm], cell: 50 um}}\ntime: {{stop: 1 ps}}\nmedia:\n  x: {{crystal: {}, cut: {}}}\n"
      "sources:\n  - point: {{at: [0, 0], component: Ez, amplitude: 1 mA, frequency: 1 THz, waveform: {{kind: pulse, "
      "fwhm: 1 ps}}}}\n",
      name, cut);
  return read_scene_text(text, "library-" + name).media.at(0);
}

inline Scene absorber_scene(const AbsorberCase& c) {
  const double L = 2e-3 * c.scale;
  const int n = static_cast<int>(std::lround(L / c.cell));
  Scene s = box_scene(n, n, c.cell, Boundary::absorbing, Boundary::absorbing, c.step_fraction, c.stop);
  s.grid.absorber.kind = c.kind;
  Medium m;
  m.name = "MnF2";
  m.permittivity = {5.5, 5.5, 5.5};
  Magnet mag = mnf2(c.damping);  // c-cut: easy axis along z
  // turned: every position and the a-cut axis with x and y swapped, so that the plate runs
  // through the top and bottom layers instead of the sides
  auto at = [&](double x, double y) { return c.turned ? Vec2{y, x} : Vec2{x, y}; };
  if (!c.c_cut) {
    const Vec2 axis = at(1, 0);
    mag.anisotropy = {{{axis.x, axis.y, 0}, 0.787}};
    mag.order = {axis.x, axis.y, 0};
  }
  s.bias = {0, 0, c.bias};
  m.magnet = mag;
  if (!c.crystal.empty()) {
    REQUIRE(!c.turned);  // the positions would turn, the library crystal's axes not
    m = library_medium(c.crystal, c.cut);
  }
  s.media.push_back(m);
  Body b;
  b.shape.kind = Shape::Kind::rectangle;
  const double k = c.scale;
  b.shape.centre = c.plate ? at(0.5 * L, 1.0e-3 * k) : at(0.5 * L, 1.0e-3 * k + 2 * L);
  b.shape.size = c.plate ? at(10 * L, 0.6e-3 * k) : at(10 * L, 4 * L);
  s.bodies.push_back(b);
  Source src = point_source(Component::Ez, at(0.5 * L, (c.plate ? 0.35e-3 : 0.5e-3) * k), c.frequency, 20e-12 * k,
                            40e-12 * k, 1e-3 * k);
  if (c.cw) {
    src.waveform.kind = Waveform::Kind::cw;
    src.waveform.ramp = 20 / c.frequency;
  }
  s.sources.push_back(src);
  return s;
}

/// The leapfrog's own energy at the half step n+1/2 (after step() has moved E to n+1 and H,
/// M to n+1/2): W = eps E^n . E^(n+1) / 2 + mu0 |H^(n+1/2)|^2 / 2 + the magnets' (at n+1/2).
/// For the lossless Yee scheme it is exactly constant (eps (E^(n+1) - E^n) = dt C H^(n+1/2),
/// mu0 (H^(n+3/2) - H^(n+1/2)) = -dt C^T E^(n+1): the difference of two such W is
/// dt/2 E^(n+1).C (H^(n+3/2) + H^(n+1/2)) - dt/2 (H^(n+3/2) + H^(n+1/2)).C^T E^(n+1) = 0;
/// Taflove & Hagness, Computational Electrodynamics, 3rd ed., ch. 3-4, the energy argument of
/// the Courant limit), where the plain sum |E^(n+1)|^2 + |H^(n+1/2)|^2 swings by O(w dt).
/// E^n is kept by before_step(); E^n . E^(n+1) is read through field_energy() as
/// |(E^n + E^(n+1))/2|^2 - |(E^(n+1) - E^n)/2|^2, the H part once with E set to zero.
struct SchemeEnergy {
  std::vector<double> before[3], now[3];
  template <class R>
  void before_step(const Simulation<R>& sim) {
    for (int q = 0; q < 3; ++q) {
      const R* e = sim.field(static_cast<Component>(q));
      before[q].assign(e, e + sim.grid().size());
    }
  }
  template <class R>
  double operator()(Simulation<R>& sim) {
    const size_t n = sim.grid().size();
    auto with = [&](double a, double b) {  // field_energy() with E = a E^(n+1) + b E^n
      for (int q = 0; q < 3; ++q) {
        R* e = sim.field(static_cast<Component>(q));
        for (size_t i = 0; i < n; ++i) e[i] = static_cast<R>(a * now[q][i] + b * before[q][i]);
      }
      return sim.field_energy();
    };
    for (int q = 0; q < 3; ++q) {
      const R* e = sim.field(static_cast<Component>(q));
      now[q].assign(e, e + n);
    }
    const double w = with(0.5, 0.5) - with(0.5, -0.5) + with(0, 0);
    for (int q = 0; q < 3; ++q) std::copy(now[q].begin(), now[q].end(), sim.field(static_cast<Component>(q)));
    return w + sim.magnetic_energy();
  }
};

/// Steps the scene to its stop time, checking the guard every 1% of the run; after the
/// pulse has passed (4 FWHM after its peak) the energy averaged over each period must not rise.
inline AbsorberOutcome run_absorber_case(const AbsorberCase& c) {
  const Scene s = absorber_scene(c);
  Simulation<double> sim(s, 2);
  GrowthGuard<double> guard(sim);
  AbsorberOutcome out;
  out.steps = sim.total_steps();
  out.dt = sim.grid().dt;
  out.npx = sim.grid().npml_x;
  const long every = std::max(1L, sim.total_steps() / 100);
  const long quiet = c.cw ? sim.total_steps() : static_cast<long>((40e-12 + 4 * 20e-12) * c.scale / sim.grid().dt);
  const long period = std::max(1L, static_cast<long>(std::lround(1 / (c.frequency * sim.grid().dt))));
  // the period average from 4 equally spaced samples: exact for the plain sum's swing at
  // twice the frequency (the scheme energy has none), at a quarter of a step's cost per step
  const long sample = std::max(1L, period / 4);
  // the layer's largest tilt over the run's last quarter, the interior's over its last half
  // (each at least a period), at every step: what the layer holds came through the interior
  // earlier, a slow wave a nanosecond or more before (test_absorber_stability.cpp)
  const long window_in = std::max(period, sim.total_steps() / 4), window_out = std::max(period, sim.total_steps() / 2);
  double in2 = 0, out2 = 0;  // squared chords (absorber_trace.h)
  if (c.trace > 0) out.trace_every = std::max(1L, period / c.trace);
  SchemeEnergy scheme;
  double acc[2] = {0, 0}, lowest[2] = {0, 0};
  long count = 0, samples = 0;
  bool first = true;
  for (long k = 0; k < sim.total_steps(); ++k) {
    const bool sampled = k >= quiet && count % sample == 0;
    if (sampled) scheme.before_step(sim);
    sim.step();
    if (k >= quiet) {
      if (sampled) acc[0] += scheme(sim), acc[1] += sim.field_energy() + sim.magnetic_energy(), ++samples;
      if (++count == period) {
        double* rise[2] = {&out.rise, &out.rise_plain};
        for (int q = 0; q < 2; ++q) {
          const double w = acc[q] / samples;
          if (first) lowest[q] = w;
          *rise[q] = std::max(*rise[q], w / lowest[q] - 1);
          lowest[q] = std::min(lowest[q], w);
          acc[q] = 0;
        }
        first = false, count = 0, samples = 0;
      }
    }
    if (k + 1 >= sim.total_steps() - window_out) {
      const YeeGrid& g = sim.grid();
      largest_chords(sim.magnets(), g.nx, g.ny, g.npml_x, g.npml_y, in2, out2, k + 1 >= sim.total_steps() - window_in);
    }
    if (out.trace_every > 0 && (k + 1) % out.trace_every == 0) {
      const YeeGrid& g = sim.grid();
      if (k + 1 <= 3 * sim.total_steps() / 4) out.trace.column.assign(g.nx, 0.0);
      out.trace.sample(sim.magnets(), g.nx, g.ny, g.npml_x, g.npml_y);
    }
    if ((k + 1) % every == 0) {
      out.guard = guard.check(sim);
      if (!out.guard.empty()) {
        out.guard_step = k + 1;
        break;
      }
    }
  }
  const YeeGrid& g = sim.grid();
  // and the state now (where the guard stopped the run before the window)
  largest_chords(sim.magnets(), g.nx, g.ny, g.npml_x, g.npml_y, in2, out2);
  out.tilt_in = tilt_of_chord(in2);
  out.tilt_out = tilt_of_chord(out2);
  out.energy_end = sim.field_energy() + sim.magnetic_energy();
  out.injected = sim.injected_energy();
  return out;
}

}  // namespace ty::test

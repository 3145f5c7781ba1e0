/// \file helpers.h
/// \brief Small helpers for the tests: scenes built in code, a DFT, zero crossings.
#pragma once
#include <sys/wait.h>

#include <cmath>
#include <complex>
#include <cstdlib>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "io/scene/scene.h"
#include "io/scene/units.h"
#include "solver/recorders/recorders.h"

namespace ty::test {

/// MnF2 with the values of shared/references.md (from memory there): mu0 H_E = 55 T,
/// mu0 H_A = 0.787 T along z, mu0 Ms = 0.754 T, g = 2; damping alpha set by the test.
inline Magnet mnf2(double alpha = 0) {
  Magnet m;
  m.sublattices = {{0.754, 2.0, alpha}, {0.754, 2.0, alpha}};
  m.lambda = 55.0 / 0.754;
  m.anisotropy = {{{0, 0, 1}, 0.787}};
  m.order = {0, 0, 1};
  return m;
}

/// An empty vacuum scene of nx x ny cells of size d, no absorber unless the boundary says so.
inline Scene box_scene(int nx, int ny, double d, Boundary bx, Boundary by, double step_fraction, double stop) {
  Scene s;
  s.title = "test";
  s.grid.dx = s.grid.dy = d;
  s.grid.extent = {nx * d, ny * d};
  s.grid.bx = bx;
  s.grid.by = by;
  s.time.step_fraction = step_fraction;
  s.time.stop = stop;
  s.time.threads = 2;
  return s;
}

/// A circle of a lossy, anisotropic dielectric (eps 3, 4, 5 along x, y, z; 50 S/m; values
/// invented for the tests) added to the scene.
inline void add_lossy_circle(Scene& s, Vec2 centre, double radius) {
  Medium m;
  m.name = "lossy";
  m.permittivity = {3, 4, 5};
  m.conductivity = 50;
  s.media.push_back(m);
  Body b;
  b.medium = static_cast<int>(s.media.size()) - 1;
  b.shape.kind = Shape::Kind::circle;
  b.shape.centre = centre;
  b.shape.radius = radius;
  s.bodies.push_back(b);
}

/// A source of the given kind and component carrying a Gaussian pulse.
inline Source pulsed(Source::Kind kind, Component c, double f, double fwhm, double delay, double amplitude) {
  Source s;
  s.kind = kind;
  s.component = c;
  s.frequency = f;
  s.amplitude = amplitude;
  s.waveform.kind = Waveform::Kind::pulse;
  s.waveform.fwhm = fwhm;
  s.waveform.delay = delay;
  return s;
}

inline Source point_source(Component c, Vec2 at, double f, double fwhm, double delay, double amplitude) {
  Source s = pulsed(Source::Kind::point, c, f, fwhm, delay, amplitude);
  s.at = at;
  return s;
}

/// A plane-wave pulse launched from the line x = at, travelling +x.
inline Source plane_pulse(Component pol, double at, double f, double fwhm, double delay, double amplitude) {
  Source s = pulsed(Source::Kind::plane, pol, f, fwhm, delay, amplitude);
  s.angle = 0;
  s.line_axis = 'x';
  s.line_at = at;
  return s;
}

/// Steps `sim` `steps` times, recording component c interpolated at p after each step.
template <class Sim>
std::vector<double> probe_series(Sim& sim, Component c, Vec2 p, long steps) {
  const PointStencil st = point_stencil(sim.grid(), c, p);
  std::vector<double> out;
  for (long k = 0; k < steps; ++k) {
    sim.step();
    double v = 0;
    for (int q = 0; q < 4; ++q) v += st.weight[q] * sim.field(c)[st.index[q]];
    out.push_back(v);
  }
  return out;
}

/// A text file's whole content ("" if it cannot be read).
inline std::string read_text(const std::string& path) {
  std::ifstream in(path);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

/// A JSON file, parsed.
inline nlohmann::json read_json(const std::string& path) {
  std::ifstream in(path);
  return nlohmann::json::parse(in);
}

/// Runs a shell command quietly; its exit status (-1 if it did not exit).
inline int shell(const std::string& cmd) {
  const int status = std::system((cmd + " > /dev/null 2>&1").c_str());
  return WIFEXITED(status) ? WEXITSTATUS(status) : -1;
}

/// X(f) = sum_n x_n exp(+i 2 pi f t_n) dt (the exp(-i w t) convention of the outputs).
inline std::complex<double> dft(const std::vector<double>& x, double dt, double f, double t0 = 0) {
  std::complex<double> s = 0;
  const double w = 2 * constants::pi * f;
  for (size_t n = 0; n < x.size(); ++n) {
    const double t = t0 + n * dt;
    s += x[n] * std::complex<double>(std::cos(w * t), std::sin(w * t));
  }
  return s * dt;
}

/// Frequency of a pure oscillation from its first and last upward zero crossings.
inline double crossing_frequency(const std::vector<double>& x, double dt) {
  double first = -1, last = -1;
  int count = 0;
  for (size_t n = 1; n < x.size(); ++n)
    if (x[n - 1] < 0 && x[n] >= 0) {
      const double t = (n - 1 + x[n - 1] / (x[n - 1] - x[n])) * dt;
      if (first < 0) first = t;
      last = t;
      ++count;
    }
  return count > 1 ? (count - 1) / (last - first) : 0.0;
}

}  // namespace ty::test

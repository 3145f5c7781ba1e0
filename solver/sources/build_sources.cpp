/// \file build_sources.cpp
/// \brief The sources of a Simulation as per-row injections: a point source's Gaussian
/// footprint (weights times its signal), and the one-sided total-field/scattered-field
/// sheets of beams and plane waves, found from the curl stencil table (curl_stencil.h);
/// sorted by row so the sweep adds them row by row, their values computed once per step.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>
#include <tuple>

#include "io/scene/medium_lookup.h"
#include "io/scene/units.h"
#include "materials/dielectric.h"
#include "solver/grid/curl_stencil.h"
#include "solver/simulation.h"
#include "solver/sources/incident.h"

namespace ty {

using constants::c0;
using constants::eta0;

template <class R>
void Simulation<R>::add_injection(bool h_phase, Component c, int i, int j, std::complex<double> A, double tau,
                                  int signal) {
  if (i < 0 || i >= g_.nx || j < 0 || j >= g_.ny) return;
  // Bloch sides: every source runs as exp(i k_x x), its real part in the cosine copy and its
  // imaginary part in the sine copy (bloch.h); k_x = 0 elsewhere, a factor of exactly 1
  const double phase = scene_.grid.bloch_kx * g_.x(c, i);
  A *= copy_ == 0 ? std::cos(phase) : std::sin(phase);
  const int slot = static_cast<int>(emitters_.size());
  emitters_.push_back({A, tau, signal, h_phase});
  (h_phase ? inj_h_ : inj_e_).push_back({g_.at(i, j), static_cast<int>(c), j, slot, 0.0});
}

template <class R>
void Simulation<R>::build_sources() {
  for (const Source& src : scene_.sources) {
    const int sig = static_cast<int>(signals_.size());
    signals_.emplace_back(src.waveform, src.frequency);
    if (src.waveform.kind == Waveform::Kind::file) {  // solver/sources/waveform.h: the estimate
      const double e = spline_error_estimate(src.waveform);
      (e > 0.01 ? warnings_ : notes_)
          .push_back(fmt::format("source at line {}: waveform file '{}' ({} samples) resampled to the {:.4g} fs step "
                                 "by a cubic spline; estimated resampling error {:.2g} of its peak",
                                 src.where.line, src.waveform.file, src.waveform.table_time.size(), g_.dt * 1e15, e));
    }
    if (src.kind == Source::Kind::point)
      add_point_source(src, sig);
    else
      add_launch_sheet(src, sig);
  }
  // sort injections by row (stable: fixed order within a row) and index them
  auto index = [&](std::vector<Injection>& v, std::vector<int>& offsets) {
    std::stable_sort(v.begin(), v.end(), [](const Injection& a, const Injection& b) { return a.row < b.row; });
    offsets.assign(g_.ny + 1, 0);
    for (const auto& e : v) offsets[e.row + 1]++;
    for (int j = 0; j < g_.ny; ++j) offsets[j + 1] += offsets[j];
  };
  index(inj_h_, inj_h_row_);
  index(inj_e_, inj_e_row_);
  // energy weights for the run's guard (injected_energy): eps0 eps_r dx dy / 2 for E (eps_r
  // about 1 / cb at the node), eps0 dx dy / 2 for eta0 H (mu0 H^2 = eps0 (eta0 H)^2)
  const double half_cell = 0.5 * constants::eps0 * g_.dx * g_.dy;
  for (auto& e : inj_e_) {
    const double b = node_cb(e.comp, static_cast<int>(e.index - g_.at(0, e.row)), e.row);
    e.weight = b > 0 ? half_cell / b : 0.0;
  }
  for (auto& e : inj_h_) e.weight = half_cell;
  injected_.assign(g_.ny, 0.0);
  emitter_value_.assign(emitters_.size(), 0.0);
}

template <class R>
void Simulation<R>::add_point_source(const Source& src, int sig) {
  const double cdt = c0 * g_.dt;
  // Gaussian footprint over the component's nodes, weights summing to one
  const Component c = src.component;
  const double fi = g_.fi(c, src.at.x), fj = g_.fj(c, src.at.y);
  std::vector<std::tuple<int, int, double>> nodes;
  if (src.spread < 0.25 * std::min(g_.dx, g_.dy)) {
    nodes.emplace_back(static_cast<int>(std::lround(fi)), static_cast<int>(std::lround(fj)), 1.0);
  } else {
    const int rx = static_cast<int>(std::ceil(3 * src.spread / g_.dx)),
              ry = static_cast<int>(std::ceil(3 * src.spread / g_.dy));
    double sum = 0;
    for (int j = static_cast<int>(std::floor(fj)) - ry; j <= static_cast<int>(std::ceil(fj)) + ry; ++j)
      for (int i = static_cast<int>(std::floor(fi)) - rx; i <= static_cast<int>(std::ceil(fi)) + rx; ++i) {
        const double ddx = (i - fi) * g_.dx, ddy = (j - fj) * g_.dy;
        const double r2 = (ddx * ddx + ddy * ddy) / (src.spread * src.spread);
        if (r2 > 9) continue;
        const double w = std::exp(-0.5 * r2);
        nodes.emplace_back(i, j, w);
        sum += w;
      }
    for (auto& n : nodes) std::get<2>(n) /= sum;
  }
  for (auto [i, j, w] : nodes) {
    if (i < 0 || i >= g_.nx || j < 0 || j >= g_.ny) continue;
    double coef;
    if (is_electric(c)) {  // dE = -(dt/eps) J, J = I w / (dx dy)
      coef = -eta0 * cdt * node_cb(static_cast<int>(c), i, j) / (g_.dx * g_.dy);
    } else {  // d(eta0 H) = -c dt M, M = V w / (dx dy)
      coef = -cdt / (g_.dx * g_.dy);
    }
    add_injection(!is_electric(c), c, i, j, coef * w * src.amplitude, 0.0, sig);
  }
}

template <class R>
void Simulation<R>::add_launch_sheet(const Source& src, int sig) {
  const Scene& s = scene_;
  const double cdt = c0 * g_.dt;
  // launch line: one-sided total-field/scattered-field sheet
  const bool xline = src.line_axis == 'x';
  const Vec2 cross = launch_point(src, s.grid.extent);
  const int m = medium_at(s, cross);
  double n = 1;
  if (m >= 0) {
    const Medium& med = s.media[m];
    if (med.perfect_conductor)  // rejected by validate_scene (io/scene/validation.cpp)
      throw std::logic_error("a launch line inside a perfect conductor reached the solver");
    if (src.component == Component::Ez) {
      n = std::sqrt(med.permittivity[2]);
    } else {
      const double vx = -std::sin(src.angle), vy = std::cos(src.angle);
      n = std::sqrt(1.0 / (vx * vx / med.permittivity[0] + vy * vy / med.permittivity[1]));
    }
    if (med.conductivity > 0)
      warnings_.push_back(
          fmt::format("source at line {}: the launch medium '{}' is lossy; the launched field "
                      "ignores its loss",
                      src.where.line, med.name));
  }
  const IncidentField inc(src, cross, n, g_.dx, g_.dy, g_.dt);
  const int line = xline ? static_cast<int>(std::lround(g_.fi(Component::Ez, src.line_at)))
                         : static_cast<int>(std::lround(g_.fj(Component::Ez, src.line_at)));
  const double x0 = xline ? g_.x(Component::Ez, line) : g_.y(Component::Ez, line);
  const double fwd = xline ? (std::cos(src.angle) > 0 ? 1.0 : -1.0) : (std::sin(src.angle) > 0 ? 1.0 : -1.0);
  const double cell = xline ? g_.dx : g_.dy;
  auto total_side = [&](Component c, int i, int j) {
    const double pos = xline ? g_.x(c, i) : g_.y(c, j);
    return fwd * (pos - x0) >= -0.25 * cell;
  };
  const bool periodic_along = xline ? walls_.periodic_y : walls_.periodic_x || walls_.bloch_x;
  const double span = xline ? s.grid.extent.y : s.grid.extent.x;
  auto in_span = [&](Component c, int i, int j) {
    if (periodic_along) return true;
    const double t = xline ? g_.y(c, j) : g_.x(c, i);
    return t >= -1e-9 * cell && t <= span + 1e-9 * cell;
  };
  const int along = xline ? g_.ny : g_.nx;
  for (int a = 0; a < along; ++a)
    for (int d = line - 3; d <= line + 3; ++d) {
      const int i = xline ? d : a, j = xline ? a : d;
      for (const CurlTerm& t : kCurlTerms) {
        const int iq = i + t.di, jq = j + t.dj;
        const bool tp = total_side(t.p, i, j), tq = total_side(t.q, iq, jq);
        if (tp == tq || !in_span(t.p, i, j) || !in_span(t.q, iq, jq)) continue;
        if (i < 0 || i >= g_.nx || j < 0 || j >= g_.ny) continue;
        double coef;
        switch (t.coef) {
          case 0:
            coef = cdt / g_.dx;
            break;
          case 1:
            coef = cdt / g_.dy;
            break;
          case 2:
            coef = node_cb(static_cast<int>(t.p), i, j) * cdt / g_.dx;
            break;
          default:
            coef = node_cb(static_cast<int>(t.p), i, j) * cdt / g_.dy;
            break;
        }
        // the stencil reads the wrong kind of field across the line: add or remove the
        // incident part (total side reading scattered: +; scattered reading total: -)
        const double sgn = (tp ? 1.0 : -1.0) * t.sign * coef;
        std::complex<double> A;
        double tau;
        inc.at(t.q, {g_.x(t.q, iq), g_.y(t.q, jq)}, A, tau);
        if (std::abs(A) == 0.0) continue;
        add_injection(!is_electric(t.p), t.p, i, j, sgn * A, tau, sig);
      }
    }
}

template <class R>
void Simulation<R>::compute_emitters() {
  emitters_at(n_, emitter_value_.data());
}

template <class R>
void Simulation<R>::emitters_at(long step, double* out) const {
  const double th = step * g_.dt, te = (step + 0.5) * g_.dt;
  const long n = static_cast<long>(emitters_.size());
  // a point source's footprint shares one signal value: evaluate it once per run of emitters
  int last_signal = -1;
  double last_t = 0;
  std::complex<double> g = 0;
  for (long k = 0; k < n; ++k) {
    const Emitter& e = emitters_[k];
    const double t = (e.h_phase ? th : te) - e.tau;
    if (e.signal != last_signal || t != last_t) g = signals_[e.signal](t), last_signal = e.signal, last_t = t;
    out[k] = (e.A * g).real();
  }
}

#define TY_INSTANTIATE(R)                                                                                   \
  template void Simulation<R>::add_injection(bool, Component, int, int, std::complex<double>, double, int); \
  template void Simulation<R>::build_sources();                                                             \
  template void Simulation<R>::add_point_source(const Source&, int);                                        \
  template void Simulation<R>::add_launch_sheet(const Source&, int);                                        \
  template void Simulation<R>::compute_emitters();                                                          \
  template void Simulation<R>::emitters_at(long, double*) const;
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

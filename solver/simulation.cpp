/// \file simulation.cpp
/// \brief Building a simulation from a Scene, and the fused row-by-row Yee step.
#include "solver/simulation.h"

#include <fmt/format.h>
#include <omp.h>

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "io/scene/units.h"
#include "materials/dielectric.h"
#include "solver/sources/incident.h"

namespace ty {

using constants::c0;
using constants::eta0;

namespace {


// Curl stencils of the Yee update, one term F_p(i,j) += sign * coef * F_q(i+di, j+dj);
// coef: 0 = c dt/dx, 1 = c dt/dy (H), 2 = cb c dt/dx, 3 = cb c dt/dy (E, cb of node p).
struct Term {
  Component p, q;
  int di, dj, coef;
  double sign;
};
constexpr Term kTerms[] = {
    {Component::Hx, Component::Ez, 0, 1, 1, -1}, {Component::Hx, Component::Ez, 0, 0, 1, +1},
    {Component::Hy, Component::Ez, 1, 0, 0, +1}, {Component::Hy, Component::Ez, 0, 0, 0, -1},
    {Component::Hz, Component::Ey, 1, 0, 0, -1}, {Component::Hz, Component::Ey, 0, 0, 0, +1},
    {Component::Hz, Component::Ex, 0, 1, 1, +1}, {Component::Hz, Component::Ex, 0, 0, 1, -1},
    {Component::Ex, Component::Hz, 0, 0, 3, +1}, {Component::Ex, Component::Hz, 0, -1, 3, -1},
    {Component::Ey, Component::Hz, 0, 0, 2, -1}, {Component::Ey, Component::Hz, -1, 0, 2, +1},
    {Component::Ez, Component::Hy, 0, 0, 2, +1}, {Component::Ez, Component::Hy, -1, 0, 2, -1},
    {Component::Ez, Component::Hx, 0, 0, 3, -1}, {Component::Ez, Component::Hx, 0, -1, 3, +1},
};

}  // namespace

template <class R>
Simulation<R>::Simulation(const Scene& scene, int threads) : scene_(scene) {
  const GridSpec& G = scene.grid;
  g_ = grid_for(scene, static_cast<int>(64 / sizeof(R)));
  total_steps_ = steps_for(scene, g_);
  sx_ = static_cast<R>(c0 * g_.dt / g_.dx);
  sy_ = static_cast<R>(c0 * g_.dt / g_.dy);
  periodic_x_ = G.bx == Boundary::periodic;
  periodic_y_ = G.by == Boundary::periodic;
  magnetic_x_ = G.bx == Boundary::magnetic_wall;
  magnetic_y_ = G.by == Boundary::magnetic_wall;
  threads_ = threads > 0 ? threads : scene.time.threads > 0 ? scene.time.threads : omp_get_max_threads();

  for (auto& a : f_) a.resize(g_.size());
  bytes_ += 6 * g_.size() * sizeof(R);
  std::vector<double> cb[3];
  build_media(cb);
  build_magnets();
  build_pml(cb);
  build_sources(cb);
  build_recorders();
}

template <class R>
void Simulation<R>::build_media(std::vector<double> (&cb)[3]) {
  const Scene& s = scene_;
  const int nx = g_.nx, ny = g_.ny;
  std::vector<double> ca[3];
  // sub-cell sampling: arithmetic mean of the medium over the node's cell (4 x 4 points)
  constexpr int kSub = 4;  // even: a face on a node splits its cell exactly in half
  for (int c = 0; c < 3; ++c) {
    const Component comp = static_cast<Component>(c);
    ca[c].assign(static_cast<size_t>(nx) * ny, 1.0);
    cb[c].assign(static_cast<size_t>(nx) * ny, 1.0);
    if (s.bodies.empty()) continue;
#pragma omp parallel for schedule(static) num_threads(threads_)
    for (int j = 0; j < ny; ++j)
      for (int i = 0; i < nx; ++i) {
        const Vec2 p{g_.x(comp, i), g_.y(comp, j)};
        const int centre = medium_at(s, p);
        double a = 1, b = 1;
        if (centre >= 0 && s.media[centre].perfect_conductor) {
          a = b = 0;
        } else {
          double eps = 0, sig = 0;
          int count = 0;
          for (int u = 0; u < kSub; ++u)
            for (int v = 0; v < kSub; ++v) {
              const Vec2 q{p.x + ((u + 0.5) / kSub - 0.5) * g_.dx, p.y + ((v + 0.5) / kSub - 0.5) * g_.dy};
              const int m = medium_at(s, q);
              if (m >= 0 && s.media[m].perfect_conductor) continue;
              eps += m >= 0 ? s.media[m].permittivity[c] : 1.0;
              sig += m >= 0 ? s.media[m].conductivity : 0.0;
              ++count;
            }
          const ECoefficients k = dielectric_update(eps / count, sig / count, g_.dt);
          a = k.ca;
          b = k.cb;
        }
        ca[c][static_cast<size_t>(j) * nx + i] = a;
        cb[c][static_cast<size_t>(j) * nx + i] = b;
      }
  }
  // electric walls: tangential E held at zero on the low-side wall (the high side is the
  // zero ghost line)
  auto pec = [&](int c, int i, int j) {
    ca[c][static_cast<size_t>(j) * nx + i] = 0;
    cb[c][static_cast<size_t>(j) * nx + i] = 0;
  };
  if (s.grid.bx == Boundary::electric_wall)
    for (int j = 0; j < ny; ++j) pec(1, 0, j), pec(2, 0, j);
  if (s.grid.by == Boundary::electric_wall)
    for (int i = 0; i < nx; ++i) pec(0, i, 0), pec(2, i, 0);

  // run-length rows
  row_runs_.assign(static_cast<size_t>(3) * ny + 1, 0);
  simple_row_.assign(ny, 0);
  for (int j = 0; j < ny; ++j) {
    for (int c = 0; c < 3; ++c) {
      row_runs_[3 * j + c] = static_cast<int>(runs_.size());
      int i0 = 0;
      for (int i = 1; i <= nx; ++i) {
        const size_t a = static_cast<size_t>(j) * nx + i0, b = static_cast<size_t>(j) * nx + i;
        if (i < nx && ca[c][b] == ca[c][a] && cb[c][b] == cb[c][a]) continue;
        runs_.push_back({i0, i, static_cast<R>(ca[c][a]), static_cast<R>(cb[c][a] * c0 * g_.dt / g_.dx),
                         static_cast<R>(cb[c][a] * c0 * g_.dt / g_.dy)});
        i0 = i;
      }
    }
    const Run* r = &runs_[row_runs_[3 * j]];
    const bool one = runs_.size() - row_runs_[3 * j] == 3;
    simple_row_[j] = one && r[0].ca == R(1) && r[1].ca == R(1) && r[2].ca == R(1) && r[0].kx == r[1].kx &&
                     r[1].kx == r[2].kx && r[0].ky == r[1].ky && r[1].ky == r[2].ky;
  }
  row_runs_[3 * ny] = static_cast<int>(runs_.size());
  bytes_ += runs_.size() * sizeof(Run);

  // medium index map of the extent's cells (at the cell centres)
  map_nx_ = nx - 2 * g_.npml_x;
  map_ny_ = ny - 2 * g_.npml_y;
  medium_map_.assign(static_cast<size_t>(map_nx_) * map_ny_, -1);
  if (!s.bodies.empty())
    for (int j = 0; j < map_ny_; ++j)
      for (int i = 0; i < map_nx_; ++i)
        medium_map_[static_cast<size_t>(j) * map_nx_ + i] = medium_at(s, {(i + 0.5) * g_.dx, (j + 0.5) * g_.dy});
}

template <class R>
void Simulation<R>::build_pml(const std::vector<double> (&cb)[3]) {
  const Absorber& A = scene_.grid.absorber;
  px_ = make_cpml_axis(g_.nx, g_.npml_x, g_.dx, g_.dt, A);
  py_ = make_cpml_axis(g_.ny, g_.npml_y, g_.dy, g_.dt, A);
  for (int h = 0; h < 2; ++h) {
    for (int l = 0; l < px_.count(); ++l) {
      pbx_[h].push_back(static_cast<R>(px_.b[h][l]));
      pax_[h].push_back(static_cast<R>(px_.a[h][l]));
      pkx_[h].push_back(static_cast<R>(px_.kinv_m1[h][l]));
    }
    for (int l = 0; l < py_.count(); ++l) {
      pby_[h].push_back(static_cast<R>(py_.b[h][l]));
      pay_[h].push_back(static_cast<R>(py_.a[h][l]));
      pky_[h].push_back(static_cast<R>(py_.kinv_m1[h][l]));
    }
  }
  const size_t nxl = static_cast<size_t>(g_.ny) * px_.count();
  for (auto* a : {&psi_hyx_, &psi_hzx_, &psi_eyx_, &psi_ezx_, &cb_eyx_, &cb_ezx_}) a->resize(nxl);
  const size_t nyl = static_cast<size_t>(py_.count()) * g_.nx;
  for (auto* a : {&psi_hxy_, &psi_hzy_, &psi_exy_, &psi_ezy_, &cb_exy_, &cb_ezy_}) a->resize(nyl);
  bytes_ += 6 * (nxl + nyl) * sizeof(R);
  const double kx = c0 * g_.dt / g_.dx, ky = c0 * g_.dt / g_.dy;
  for (int j = 0; j < g_.ny; ++j)
    for (int l = 0; l < px_.count(); ++l) {
      const size_t node = static_cast<size_t>(j) * g_.nx + px_.lines[l];
      cb_eyx_[static_cast<size_t>(j) * px_.count() + l] = static_cast<R>(cb[1][node] * kx);
      cb_ezx_[static_cast<size_t>(j) * px_.count() + l] = static_cast<R>(cb[2][node] * kx);
    }
  pml_row_of_.assign(g_.ny, -1);
  for (int l = 0; l < py_.count(); ++l) {
    const int j = py_.lines[l];
    pml_row_of_[j] = l;
    for (int i = 0; i < g_.nx; ++i) {
      const size_t node = static_cast<size_t>(j) * g_.nx + i;
      cb_exy_[static_cast<size_t>(l) * g_.nx + i] = static_cast<R>(cb[0][node] * ky);
      cb_ezy_[static_cast<size_t>(l) * g_.nx + i] = static_cast<R>(cb[2][node] * ky);
    }
  }
}

template <class R>
void Simulation<R>::add_injection(bool h_phase, Component c, int i, int j, std::complex<double> A, double tau,
                                  int signal) {
  if (i < 0 || i >= g_.nx || j < 0 || j >= g_.ny) return;
  const int slot = static_cast<int>(emitters_.size());
  emitters_.push_back({A, tau, signal, h_phase});
  (h_phase ? inj_h_ : inj_e_).push_back({g_.at(i, j), static_cast<int>(c), j, slot});
}

template <class R>
void Simulation<R>::build_sources(const std::vector<double> (&cb)[3]) {
  const Scene& s = scene_;
  const double cdt = c0 * g_.dt;
  for (const Source& src : s.sources) {
    const int sig = static_cast<int>(signals_.size());
    signals_.emplace_back(src.waveform, src.frequency);
    if (src.kind == Source::Kind::point) {
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
          coef = -eta0 * cdt * cb[static_cast<int>(c)][static_cast<size_t>(j) * g_.nx + i] / (g_.dx * g_.dy);
        } else {  // d(eta0 H) = -c dt M, M = V w / (dx dy)
          coef = -cdt / (g_.dx * g_.dy);
        }
        add_injection(!is_electric(c), c, i, j, coef * w * src.amplitude, 0.0, sig);
      }
      continue;
    }
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
        warnings_.push_back(fmt::format("source at line {}: the launch medium '{}' is lossy; the launched field "
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
    const bool periodic_along = xline ? periodic_y_ : periodic_x_;
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
        for (const Term& t : kTerms) {
          const int iq = i + t.di, jq = j + t.dj;
          const bool tp = total_side(t.p, i, j), tq = total_side(t.q, iq, jq);
          if (tp == tq || !in_span(t.p, i, j) || !in_span(t.q, iq, jq)) continue;
          if (i < 0 || i >= g_.nx || j < 0 || j >= g_.ny) continue;
          double coef;
          const size_t node = static_cast<size_t>(j) * g_.nx + i;
          switch (t.coef) {
            case 0: coef = cdt / g_.dx; break;
            case 1: coef = cdt / g_.dy; break;
            case 2: coef = cb[static_cast<int>(t.p)][node] * cdt / g_.dx; break;
            default: coef = cb[static_cast<int>(t.p)][node] * cdt / g_.dy; break;
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
  // sort injections by row (stable: fixed order within a row) and index them
  auto index = [&](std::vector<Injection>& v, std::vector<int>& offsets) {
    std::stable_sort(v.begin(), v.end(), [](const Injection& a, const Injection& b) { return a.row < b.row; });
    offsets.assign(g_.ny + 1, 0);
    for (const auto& e : v) offsets[e.row + 1]++;
    for (int j = 0; j < g_.ny; ++j) offsets[j + 1] += offsets[j];
  };
  index(inj_h_, inj_h_row_);
  index(inj_e_, inj_e_row_);
  emitter_value_.assign(emitters_.size(), 0.0);
}

template <class R>
void Simulation<R>::build_recorders() {
  for (const Output& o : scene_.outputs) {
    if (o.kind == Output::Kind::probe) {
      ProbeRecorder p;
      p.name = o.name;
      p.at = o.at;
      p.fields = o.fields;
      for (int c = 0; c < 6; ++c) p.stencil[c] = point_stencil(g_, static_cast<Component>(c), o.at);
      p.raw.assign(static_cast<size_t>(total_steps_) * 6, 0.0);
      for (const auto& f : o.fields)
        if (is_magnetic_field(f)) {
          p.magnetic.push_back(f);
          p.magnetic_series.emplace_back(static_cast<size_t>(total_steps_), 0.0);
        }
      if (!p.magnetic.empty() && !mag_.empty()) {
        const PointStencil st = point_stencil(g_, Component::Hz, o.at);
        for (int q = 0; q < 4; ++q) {
          const long idx = st.index[q];
          const int j = static_cast<int>(idx / g_.stride) - 1, i = static_cast<int>(idx % g_.stride - g_.lead);
          p.cells[q] = mag_.cell_of[static_cast<size_t>(j) * g_.nx + i];
          p.cell_weight[q] = st.weight[q];
        }
      }
      bytes_ += p.raw.size() * sizeof(double);
      probes_.push_back(std::move(p));
    } else if (o.kind == Output::Kind::spectral_map) {
      maps_.push_back(make_spectral_map(scene_, o, g_, total_steps_));
      bytes_ += maps_.back().acc.size() * sizeof(std::complex<double>);
    } else if (o.kind == Output::Kind::power_spectrum) {
      power_spectra_.push_back(make_power_spectrum(scene_, o, g_, total_steps_));
      bytes_ += power_spectra_.back().acc.size() * sizeof(std::complex<double>);
    } else {
      snap_ = plan_snapshots(scene_, o, g_, total_steps_);
      size_t most = 0;
      for (const auto& f : snap_.fields) most = std::max(most, static_cast<size_t>(f.ni) * f.nj);
      frame_buf_.assign(most, R(0));
      bytes_ += most * sizeof(R);
    }
  }
}

template <class R>
void Simulation<R>::compute_emitters() {
  const double th = n_ * g_.dt, te = (n_ + 0.5) * g_.dt;
  const long n = static_cast<long>(emitters_.size());
  // a point source's footprint shares one signal value: evaluate it once per run of emitters
  int last_signal = -1;
  double last_t = 0;
  std::complex<double> g = 0;
  for (long k = 0; k < n; ++k) {
    const Emitter& e = emitters_[k];
    const double t = (e.h_phase ? th : te) - e.tau;
    if (e.signal != last_signal || t != last_t) g = signals_[e.signal](t), last_signal = e.signal, last_t = t;
    emitter_value_[k] = (e.A * g).real();
  }
}

template <class R>
void Simulation<R>::h_row(int j) {
  const int nx = g_.nx;
  const long o = g_.at(0, j), s = g_.stride;
  R* __restrict hx = f_[3].data() + o;
  R* __restrict hy = f_[4].data() + o;
  R* __restrict hz = f_[5].data() + o;
  R* __restrict ex = f_[0].data() + o;
  R* __restrict ey = f_[1].data() + o;
  R* __restrict ez = f_[2].data() + o;
  if (periodic_x_) ez[nx] = ez[0], ey[nx] = ey[0];
  const R* __restrict exn = ex + s;
  const R* __restrict ezn = ez + s;
  const R sx = sx_, sy = sy_;
#pragma omp simd
  for (int i = 0; i < nx; ++i) {
    hx[i] -= sy * (ezn[i] - ez[i]);
    hy[i] += sx * (ez[i + 1] - ez[i]);
    hz[i] -= sx * (ey[i + 1] - ey[i]) - sy * (exn[i] - ex[i]);
  }
  // convolutional PML, x strips (columns of px_) and y strips (whole rows)
  const int ncx = px_.count();
  if (ncx) {
    R* __restrict p1 = psi_hyx_.data() + static_cast<size_t>(j) * ncx;
    R* __restrict p2 = psi_hzx_.data() + static_cast<size_t>(j) * ncx;
    const R *b = pbx_[1].data(), *a = pax_[1].data(), *k = pkx_[1].data();
    for (int l = 0; l < ncx; ++l) {
      const int i = px_.lines[l];
      const R d1 = ez[i + 1] - ez[i], d2 = ey[i + 1] - ey[i];
      p1[l] = b[l] * p1[l] + a[l] * d1;
      p2[l] = b[l] * p2[l] + a[l] * d2;
      hy[i] += sx * (k[l] * d1 + p1[l]);
      hz[i] -= sx * (k[l] * d2 + p2[l]);
    }
  }
  if (const int l = pml_row_of_[j]; l >= 0) {
    R* __restrict p1 = psi_hxy_.data() + static_cast<size_t>(l) * nx;
    R* __restrict p2 = psi_hzy_.data() + static_cast<size_t>(l) * nx;
    const R b = pby_[1][l], a = pay_[1][l], k = pky_[1][l];
#pragma omp simd
    for (int i = 0; i < nx; ++i) {
      const R d1 = ezn[i] - ez[i], d2 = exn[i] - ex[i];
      p1[i] = b * p1[i] + a * d1;
      p2[i] = b * p2[i] + a * d2;
      hx[i] -= sy * (k * d1 + p1[i]);
      hz[i] += sy * (k * d2 + p2[i]);
    }
  }
  for (int q = inj_h_row_[j]; q < inj_h_row_[j + 1]; ++q) {
    const Injection& e = inj_h_[q];
    f_[e.comp][e.index] += static_cast<R>(emitter_value_[e.slot]);
  }
  h_boundaries(j);
}

template <class R>
void Simulation<R>::h_boundaries(int j) {
  const int nx = g_.nx;
  const long o = g_.at(0, j);
  R* hx = f_[3].data() + o;
  R* hy = f_[4].data() + o;
  R* hz = f_[5].data() + o;
  if (magnetic_x_) hy[nx - 1] = 0, hz[nx - 1] = 0;
  if (magnetic_y_ && j == g_.ny - 1)
    for (int i = 0; i < nx; ++i) hx[i] = 0, hz[i] = 0;
  if (periodic_x_) hy[-1] = hy[nx - 1], hz[-1] = hz[nx - 1];
}

template <class R>
void Simulation<R>::e_row(int j) {
  const int nx = g_.nx;
  const long o = g_.at(0, j), s = g_.stride;
  R* __restrict ex = f_[0].data() + o;
  R* __restrict ey = f_[1].data() + o;
  R* __restrict ez = f_[2].data() + o;
  const R* __restrict hx = f_[3].data() + o;
  const R* __restrict hy = f_[4].data() + o;
  const R* __restrict hz = f_[5].data() + o;
  const R* __restrict hxp = hx - s;
  const R* __restrict hzp = hz - s;
  const Run* run = runs_.data();
  if (simple_row_[j]) {
    const R kx = run[row_runs_[3 * j]].kx, ky = run[row_runs_[3 * j]].ky;
#pragma omp simd
    for (int i = 0; i < nx; ++i) {
      ex[i] += ky * (hz[i] - hzp[i]);
      ey[i] -= kx * (hz[i] - hz[i - 1]);
      ez[i] += kx * (hy[i] - hy[i - 1]) - ky * (hx[i] - hxp[i]);
    }
  } else {
    for (int r = row_runs_[3 * j]; r < row_runs_[3 * j + 1]; ++r) {
      const R ca = run[r].ca, ky = run[r].ky;
#pragma omp simd
      for (int i = run[r].i0; i < run[r].i1; ++i) ex[i] = ca * ex[i] + ky * (hz[i] - hzp[i]);
    }
    for (int r = row_runs_[3 * j + 1]; r < row_runs_[3 * j + 2]; ++r) {
      const R ca = run[r].ca, kx = run[r].kx;
#pragma omp simd
      for (int i = run[r].i0; i < run[r].i1; ++i) ey[i] = ca * ey[i] - kx * (hz[i] - hz[i - 1]);
    }
    for (int r = row_runs_[3 * j + 2]; r < row_runs_[3 * j + 3]; ++r) {
      const R ca = run[r].ca, kx = run[r].kx, ky = run[r].ky;
#pragma omp simd
      for (int i = run[r].i0; i < run[r].i1; ++i)
        ez[i] = ca * ez[i] + kx * (hy[i] - hy[i - 1]) - ky * (hx[i] - hxp[i]);
    }
  }
  const int ncx = px_.count();
  if (ncx) {
    R* __restrict p1 = psi_eyx_.data() + static_cast<size_t>(j) * ncx;
    R* __restrict p2 = psi_ezx_.data() + static_cast<size_t>(j) * ncx;
    const R* __restrict c1 = cb_eyx_.data() + static_cast<size_t>(j) * ncx;
    const R* __restrict c2 = cb_ezx_.data() + static_cast<size_t>(j) * ncx;
    const R *b = pbx_[0].data(), *a = pax_[0].data(), *k = pkx_[0].data();
    for (int l = 0; l < ncx; ++l) {
      const int i = px_.lines[l];
      const R d1 = hz[i] - hz[i - 1], d2 = hy[i] - hy[i - 1];
      p1[l] = b[l] * p1[l] + a[l] * d1;
      p2[l] = b[l] * p2[l] + a[l] * d2;
      ey[i] -= c1[l] * (k[l] * d1 + p1[l]);
      ez[i] += c2[l] * (k[l] * d2 + p2[l]);
    }
  }
  if (const int l = pml_row_of_[j]; l >= 0) {
    R* __restrict p1 = psi_exy_.data() + static_cast<size_t>(l) * nx;
    R* __restrict p2 = psi_ezy_.data() + static_cast<size_t>(l) * nx;
    const R* __restrict c1 = cb_exy_.data() + static_cast<size_t>(l) * nx;
    const R* __restrict c2 = cb_ezy_.data() + static_cast<size_t>(l) * nx;
    const R b = pby_[0][l], a = pay_[0][l], k = pky_[0][l];
#pragma omp simd
    for (int i = 0; i < nx; ++i) {
      const R d1 = hz[i] - hzp[i], d2 = hx[i] - hxp[i];
      p1[i] = b * p1[i] + a * d1;
      p2[i] = b * p2[i] + a * d2;
      ex[i] += c1[i] * (k * d1 + p1[i]);
      ez[i] -= c2[i] * (k * d2 + p2[i]);
    }
  }
  for (int q = inj_e_row_[j]; q < inj_e_row_[j + 1]; ++q) {
    const Injection& e = inj_e_[q];
    f_[e.comp][e.index] += static_cast<R>(emitter_value_[e.slot]);
  }
}

template <class R>
void Simulation<R>::step() {
  if (mag_.empty()) step_fused(); else step_magnetic();
}

template <class R>
void Simulation<R>::step_fused() {
  compute_emitters();
  const int ny = g_.ny;
  const long s = g_.stride;
  if (periodic_y_)
    for (int c = 0; c < 3; ++c) std::copy_n(f_[c].data() + g_.row_begin(0), s, f_[c].data() + g_.row_begin(ny));
#pragma omp parallel num_threads(threads_)
  {
    int j0, j1;
    block_rows(ny, omp_get_thread_num(), omp_get_num_threads(), j0, j1);
    if (j1 > j0) h_row(j1 - 1);
#pragma omp barrier
    if (periodic_y_ && j0 == 0 && j1 > 0)
      for (int c = 3; c < 6; ++c) std::copy_n(f_[c].data() + g_.row_begin(ny - 1), s, f_[c].data() + g_.row_begin(-1));
    for (int j = j0; j < j1 - 1; ++j) {
      h_row(j);
      e_row(j);
    }
    if (j1 > j0) e_row(j1 - 1);
  }
  ++n_;
}

template <class R>
void Simulation<R>::record() {
  const long k = n_ - 1;
  for (auto& p : probes_) {
    for (int c = 0; c < 6; ++c) {
      double v = 0;
      for (int q = 0; q < 4; ++q) v += p.stencil[c].weight[q] * f_[c][p.stencil[c].index[q]];
      p.raw[static_cast<size_t>(k) * 6 + c] = v;
    }
    for (size_t f = 0; f < p.magnetic.size(); ++f) {
      double v = 0;
      for (int q = 0; q < 4; ++q)
        if (p.cells[q] >= 0) v += p.cell_weight[q] * magnetic_value(p.magnetic[f], p.cells[q]);
      p.magnetic_series[f][k] = v;
    }
    p.count = k + 1;
  }
  for (auto& fl : power_spectra_) {
    fl.steps = n_;
    if ((total_steps_ - 1 - k) % fl.every != 0) continue;  // not a sampling step
    const size_t np = fl.points.size(), nf = fl.freq.size();
    for (size_t p = 0; p < np; ++p)
      for (int c = 0; c < 6; ++c) {
        double v = 0;
        for (int q = 0; q < 4; ++q) v += fl.stencil[p][c].weight[q] * f_[c][fl.stencil[p][c].index[q]];
        fl.value[p * 6 + c] = c < 3 ? v : v / eta0;
      }
    const double te = n_ * g_.dt, th = (n_ - 0.5) * g_.dt, dt = g_.dt * fl.every;
    std::complex<double>* acc = fl.acc.data();
    const double* val = fl.value.data();
    const double* freq = fl.freq.data();
#pragma omp parallel for schedule(static) num_threads(threads_)
    for (long fi = 0; fi < static_cast<long>(nf); ++fi) {
      const double w = 2 * constants::pi * freq[fi];
      const std::complex<double> pe = std::polar(dt, w * te), ph = std::polar(dt, w * th);
      std::complex<double>* a = acc + static_cast<size_t>(fi) * np * 6;
      for (size_t p = 0; p < np; ++p) {
        for (int c = 0; c < 3; ++c) a[p * 6 + c] += val[p * 6 + c] * pe;
        for (int c = 3; c < 6; ++c) a[p * 6 + c] += val[p * 6 + c] * ph;
      }
    }
  }
  for (auto& m : maps_) {
    if (k < m.start || (total_steps_ - 1 - k) % m.every != 0) continue;
    const long st = g_.stride;
    const size_t np = static_cast<size_t>(m.ni) * m.nj;
    for (int b = 0; b < m.nj; ++b)
      for (int a = 0; a < m.ni; ++a) {  // the six components averaged to the Ez node
        const long id = g_.at(m.i0 + a * m.stride, m.j0 + b * m.stride);
        double* v = &m.value[(static_cast<size_t>(b) * m.ni + a) * 6];
        v[0] = 0.5 * (f_[0][id] + f_[0][id - 1]);
        v[1] = 0.5 * (f_[1][id] + f_[1][id - st]);
        v[2] = f_[2][id];
        v[3] = 0.5 * (f_[3][id] + f_[3][id - st]) / eta0;
        v[4] = 0.5 * (f_[4][id] + f_[4][id - 1]) / eta0;
        v[5] = 0.25 * (f_[5][id] + f_[5][id - 1] + f_[5][id - st] + f_[5][id - st - 1]) / eta0;
      }
    const double te = n_ * g_.dt, th = (n_ - 0.5) * g_.dt;
    for (size_t fi = 0; fi < m.freq.size(); ++fi) {
      if (k < m.first_step[fi]) continue;
      const double w = 2 * constants::pi * m.freq[fi];
      const double dt = g_.dt * m.every;
      const std::complex<double> pe = std::polar(dt, w * te), ph = std::polar(dt, w * th);
      std::complex<double>* acc = m.acc.data() + fi * np * 6;
      const double* val = m.value.data();
#pragma omp parallel for schedule(static) num_threads(threads_)
      for (long p = 0; p < static_cast<long>(np); ++p) {
        for (int c = 0; c < 3; ++c) acc[p * 6 + c] += val[p * 6 + c] * pe;
        for (int c = 3; c < 6; ++c) acc[p * 6 + c] += val[p * 6 + c] * ph;
      }
    }
  }
  if (next_frame_ >= static_cast<long>(snap_.steps.size()) || snap_.steps[next_frame_] != k) return;
  for (size_t fi = 0; fi < snap_.fields.size(); ++fi) {
    const SnapshotField& sf = snap_.fields[fi];
    const bool derived = sf.name[0] == 'S';
    const int c = static_cast<int>(sf.node);
    const R* F[6];
    for (int q = 0; q < 6; ++q) F[q] = f_[q].data();
    const long st = g_.stride;
    for (int b = 0; b < sf.nj; ++b)
      for (int a = 0; a < sf.ni; ++a) {
        const int i = sf.i0 + a * sf.stride, j = sf.j0 + b * sf.stride;
        const long id = g_.at(i, j);
        double v;
        if (is_magnetic_field(sf.name)) {
          const int cell = mag_.empty() ? -1 : mag_.cell_of[static_cast<size_t>(j) * g_.nx + i];
          v = cell >= 0 ? magnetic_value(sf.name, cell) : 0.0;
        } else if (!derived) {
          v = F[c][id];
          if (c >= 3) v /= eta0;
        } else {  // Poynting vector at the Ez node from neighbour averages
          const double exv = 0.5 * (F[0][id] + F[0][id - 1]), eyv = 0.5 * (F[1][id] + F[1][id - st]);
          const double ezv = F[2][id];
          const double hxv = 0.5 * (F[3][id] + F[3][id - st]) / eta0, hyv = 0.5 * (F[4][id] + F[4][id - 1]) / eta0;
          const double hzv = 0.25 * (F[5][id] + F[5][id - 1] + F[5][id - st] + F[5][id - st - 1]) / eta0;
          const double sxv = eyv * hzv - ezv * hyv, syv = ezv * hxv - exv * hzv;
          v = sf.name == "Sx" ? sxv : sf.name == "Sy" ? syv : std::hypot(sxv, syv);
        }
        frame_buf_[static_cast<size_t>(b) * sf.ni + a] = static_cast<R>(v);
      }
    if (sink_) sink_->frame(next_frame_, snap_.times[next_frame_], fi, frame_buf_.data());
  }
  ++next_frame_;
}

template <class R>
void Simulation<R>::advance() {
  step();
  record();
}

template <class R>
double Simulation<R>::field_energy() const {
  double we = 0, wh = 0;
  for (int j = 0; j < g_.ny; ++j) {
    for (int c = 0; c < 3; ++c)
      for (int r = row_runs_[3 * j + c]; r < row_runs_[3 * j + c + 1]; ++r) {
        const Run& run = runs_[r];
        if (run.kx == R(0)) continue;
        const double eps = (c0 * g_.dt / g_.dx) / static_cast<double>(run.kx);
        for (int i = run.i0; i < run.i1; ++i) {
          const double e = f_[c][g_.at(i, j)];
          we += eps * e * e;
        }
      }
    for (int c = 3; c < 6; ++c)
      for (int i = 0; i < g_.nx; ++i) {
        const double h = f_[c][g_.at(i, j)] / eta0;
        wh += h * h;
      }
  }
  return 0.5 * (constants::eps0 * we + constants::mu0 * wh) * g_.dx * g_.dy;
}

template <class R>
bool Simulation<R>::find_nonfinite(int& i, int& j, Component& c) const {
  for (int jj = 0; jj < g_.ny; ++jj)
    for (int q = 0; q < 6; ++q)
      for (int ii = 0; ii < g_.nx; ++ii)
        if (!std::isfinite(static_cast<double>(f_[q][g_.at(ii, jj)]))) {
          i = ii, j = jj, c = static_cast<Component>(q);
          return true;
        }
  return false;
}

template class Simulation<float>;
template class Simulation<double>;

}  // namespace ty

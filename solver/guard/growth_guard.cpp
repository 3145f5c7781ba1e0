/// \file growth_guard.cpp
/// \brief The run's guard against growth (growth_guard.h).
#include "solver/guard/growth_guard.h"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>

#include "io/scene/medium_lookup.h"
#include "io/scene/units.h"
#include "materials/dielectric.h"
#include "materials/magnetic/linear_response.h"

namespace ty {

namespace {

/// Appends v to a history of the last kHistory values (newest last), counting them.
template <size_t N>
void push(std::array<double, N>& h, int& count, double v) {
  std::copy(h.begin() + 1, h.end(), h.begin());
  h.back() = v;
  ++count;
}

bool in_absorber(const YeeGrid& g, int i, int j) {
  return i < g.npml_x || i >= g.nx - g.npml_x || j < g.npml_y || j >= g.ny - g.npml_y;
}

/// The node (i, j) of the largest sum of the squared field values (E and eta0 H alike);
/// nonfinite: the first node whose sum is not finite wins. Over ranks (collective) each rank
/// looks through its rows and the ranks' picks are taken in rank order by the same rule.
template <class R>
void largest_field(const Simulation<R>& sim, bool nonfinite, int& bi, int& bj) {
  const YeeGrid& g = sim.grid();
  double best = -1;
  long at = -1;
  const auto better = [&](double e) { return e > best || (nonfinite && !std::isfinite(e)); };
  for (int j = sim.row_lo(); j < sim.row_hi() && !(nonfinite && !std::isfinite(best)); ++j)
    for (int i = 0; i < g.nx; ++i) {
      double e = 0;
      for (int c = 0; c < 6; ++c) {
        const double v = sim.field(static_cast<Component>(c))[g.at(i, j)];
        e += v * v;
      }
      if (better(e)) best = e, at = static_cast<long>(j) * g.nx + i;
      if (nonfinite && !std::isfinite(best)) break;
    }
  if (sim.ranks() > 1) {
    const auto picks = parallel::picks_over_ranks({best, at});
    best = -1, at = -1;
    for (const parallel::Pick& p : picks) {
      if (p.where >= 0 && better(p.value)) best = p.value, at = p.where;
      if (nonfinite && !std::isfinite(best)) break;
    }
  }
  bi = at < 0 ? 0 : static_cast<int>(at % g.nx), bj = at < 0 ? 0 : static_cast<int>(at / g.nx);
}

// A source's field amplitude, V/m, at frequency f: a launch line's peak E; a line current I:
// about eta0 k I one cell away (the 2D Green's function (w mu0 I / 4)|H0(k r)|, |H0| ~ 1
// there); a magnetic line current V: k V.
double peak_field(const Source& src, double f) {
  const double k = 2 * constants::pi * f / constants::c0;
  const double e0 = std::abs(src.amplitude);
  if (src.kind != Source::Kind::point) return e0;
  return e0 * (is_electric(src.component) ? constants::eta0 * k : k);
}

}  // namespace

template <class R>
GrowthGuard<R>::GrowthGuard(const Simulation<R>& sim) {
  const Scene& s = sim.scene();
  const MagneticCells& M = sim.magnets();
  sources_end_ = 0;
  for (const Source& src : s.sources) sources_end_ = std::max(sources_end_, source_end(src));
  // W as measured (E at n, H at n-1/2) is not the leapfrog's conserved energy (1/2)(eps E^n.E^n +
  // mu H^(n-1/2).H^(n+1/2)) (the discrete energy identity of the Yee scheme; e.g. Joly, in Topics in
  // Computational Wave Propagation, LNCSE 31 (2003), from memory): H^(n+1/2) - H^(n-1/2) = -(dt/mu) curl E^n
  // and |curl E| ~ w mu |H| at frequency w, so W swings about it by up to (w dt / 2) W each way, w dt peak to
  // peak: in a closed lossless box at a few cells a wavelength that is tens of percent. A rise counts past
  // w dt at the highest of the sources' band centres, where their energy is (a closed box measured 0.42 w dt
  // there; the band's top, 1.7 times higher, let a slowly amplifying PML run to 95% of its time unstopped).
  // And the scale of the energy the sources deliver, eps0 e0^2 lambda^2 (J/m) for a peak field
  // e0 over a wavelength squared: the energy check's floor is 1e-12 of it, above the leading tail
  // of a pulse and the round-off of magnets at rest (NiO at rest held 3e-28 J/m by step 21 and
  // was stopped beside a 1 mA line current's tail at 3.5e-31 J/m: test_growth_guard.cpp).
  double f_centre = 0;
  for (const Source& src : s.sources) {
    const Band2 band = source_band(src);
    f_centre = std::max(f_centre, 0.5 * (band.lo + band.hi));
    const double lambda = constants::c0 / std::max(band.hi, 1.0), e0 = peak_field(src, band.hi);
    w_scale_ += constants::eps0 * e0 * e0 * lambda * lambda;
  }
  rise_ = std::max(kEnergyRise, 2 * constants::pi * f_centre * sim.grid().dt);
  // The same identity bounds W by the conserved energy: the conserved one is W - (dt/2) H^(n-1/2).
  // curl E^n, and (c dt / 2)|curl| <= S on the grid (S = c dt sqrt(dx^-2 + dy^-2), the fraction
  // of the 2D step limit), so it is at least (1 - S) W. A line current switched on at once at
  // S = 0.95 measured W at 2.8 times its work (tests/solver/guard/test_growth_guard.cpp).
  const YeeGrid& g = sim.grid();
  const double S = constants::c0 * g.dt * std::sqrt(1 / (g.dx * g.dx) + 1 / (g.dy * g.dy));
  if (S < 1) energy_factor_ = std::max(kEnergyFactor, 2 / (1 - S));  // past the limit nothing bounds W
  if (M.models.empty()) return;
  double worst = 0;
  for (const Source& src : s.sources) {
    const Band2 band = source_band(src);
    const double lo = 0.8 * band.lo, hi = 1.2 * band.hi;
    const double e0 = peak_field(src, hi);
    for (size_t slot = 0; slot < M.models.size(); ++slot) {
      const MagnetModel& mm = M.models[slot];
      std::vector<double> f;
      for (int q = 0; q <= 400; ++q) f.push_back(lo + (hi - lo) * q / 400.0);
      for (double r : resonances(mm, M.ground[slot]))
        if (r >= lo && r <= hi) f.push_back(r);
      double chi = 0;
      for (double fq : f)
        if (fq > 0)
          chi = std::max(chi, susceptibility(mm, M.ground[slot], 2 * constants::pi * fq).cwiseAbs().maxCoeff());
      if (!std::isfinite(chi)) chi = std::numeric_limits<double>::infinity();
      const double ms = std::min(mm.mu[0], mm.n == 2 ? mm.mu[1] : mm.mu[0]);
      worst = std::max(worst, chi * (e0 / constants::c0) / ms);
    }
  }
  linear_tilt_ = worst;
  const double limit = std::max(kTiltMargin * worst, kTiltFloor);
  tilt_limit_ = limit < kTiltOff ? limit : 0.0;
}

template <class R>
std::string GrowthGuard<R>::where(const Simulation<R>& sim, int i, int j) const {
  const YeeGrid& g = sim.grid();
  const Scene& s = sim.scene();
  const Vec2 p{g.x(Component::Hz, i), g.y(Component::Hz, j)};
  const int m = medium_at(s, p);
  const bool in = in_absorber(g, i, j);
  return fmt::format("cell ({}, {}) at x = {:.4g} mm, y = {:.4g} mm, in {}, {} the absorbing layers", i, j,
                     (p.x - s.origin_shift.x) * 1e3, (p.y - s.origin_shift.y) * 1e3,
                     m >= 0 ? "'" + s.media[m].name + "'" : std::string("vacuum"), in ? "inside" : "outside");
}

template <class R>
std::string GrowthGuard<R>::check(const Simulation<R>& sim) {
  const YeeGrid& g = sim.grid();
  const long n = sim.steps_done();
  most_injected_ = std::max(most_injected_, sim.injected_energy());
  // the largest tilt inside and outside the absorbing layers, and where: over ranks each
  // rank's cells (its rows'), then the ranks' picks in rank order by the same rule
  const MagneticCells& M = sim.magnets();
  double worst[2] = {0, 0};  // outside, inside
  long at[2] = {-1, -1};
  for (long k = M.first_cell(sim.row_lo()); k < M.first_cell(sim.row_hi()); ++k) {
    const MagneticState& g0 = M.ground[M.medium[k]];
    const int side = in_absorber(g, M.ci[k], M.cj[k]) ? 1 : 0;
    for (int sl = 0; sl < 2; ++sl) {
      const Vec3 now(M.m[M.latest][3 * sl][k], M.m[M.latest][3 * sl + 1][k], M.m[M.latest][3 * sl + 2][k]);
      if (now.squaredNorm() == 0) continue;
      const double t = std::atan2(now.cross(g0.m[sl]).norm(), now.dot(g0.m[sl]));
      if (t > worst[side] || !std::isfinite(t)) worst[side] = t, at[side] = k;
    }
  }
  if (sim.ranks() > 1)
    for (int side = 0; side < 2; ++side) {
      const auto picks = parallel::picks_over_ranks({worst[side], at[side]});
      worst[side] = 0, at[side] = -1;
      for (const parallel::Pick& p : picks)
        if (p.where >= 0 && (p.value > worst[side] || !std::isfinite(p.value))) worst[side] = p.value, at[side] = p.where;
    }
  const int s = worst[1] > worst[0] ? 1 : 0;
  if (tilt_limit_ > 0 && at[s] >= 0 && !(worst[s] <= tilt_limit_))  // tilt first: the earlier sign in a magnet
    return fmt::format(
        "the run is growing: by step {} (t = {:.4g} ps; all was well at step {}) a magnetic cell tilted to {:.3g} "
        "rad, where the linear response of the sources allows about {:.2g} rad; the largest tilt is at {}. If the "
        "growth is inside the absorbing layers, check grid.absorber.kind (auto gives magnets the graded loss); else "
        "run again with a smaller time.step-fraction to see whether it is a stability problem",
        n, n * g.dt * 1e12, last_good_, worst[s], linear_tilt_, where(sim, M.ci[at[s]], M.cj[at[s]]));
  const double w = sim.held_energy();
  const double floor = 1e-30 + 1e-12 * (most_injected_ + w_scale_);
  if (!(w <= energy_factor_ * most_injected_ + floor)) {  // NaN too
    int bi, bj;  // the node of largest energy density (E and eta0 H alike), the first that is not finite
    largest_field(sim, true, bi, bj);
    return fmt::format(
        "the run is growing: by step {} (t = {:.4g} ps; all was well at step {}) the grid holds {:.3g} J/m, more "
        "than {:g} times the {:.3g} J/m its sources have put in; the largest field is at {}. Run again with a "
        "smaller time.step-fraction to see whether it is a stability problem",
        n, n * g.dt * 1e12, last_good_, w, energy_factor_, most_injected_, where(sim, bi, bj));
  }
  if (std::string e = slow_tilt(sim, worst[1], at[1], worst[0]); !e.empty()) return e;
  if (std::string e = slow_energy(sim, w); !e.empty()) return e;
  last_good_ = n;
  return {};
}

template <class R>
std::string GrowthGuard<R>::slow_tilt(const Simulation<R>& sim, double in, long at_in, double out) {
  // the absorber's largest tilt, kWindow checks back: past kTiltRatio times the interior's
  // largest ever, grown by kTiltGrowth and rising at each check
  interior_peak_ = std::max(interior_peak_, out);
  push(tilt_seen_, tilts_, in);
  const int k = kHistory - 1;  // the newest
  if (tilts_ <= kWindow || !(in > kTiltRatio * interior_peak_) || interior_peak_ <= 0) return {};
  if (!(in > kTiltGrowth * tilt_seen_[k - kWindow])) return {};
  for (int q = k - kWindow + 1; q <= k; ++q)
    if (!(tilt_seen_[q] > tilt_seen_[q - 1])) return {};
  const YeeGrid& g = sim.grid();
  const long n = sim.steps_done();
  const MagneticCells& M = sim.magnets();
  return fmt::format(
      "the run is growing slowly in the absorbing layers: by step {} (t = {:.4g} ps) their magnets tilt {:.3g} rad, "
      "{:.3g} times the most the interior's ever did ({:.3g} rad), and rising at each of the last {} checks ({:.3g} "
      "rad "
      "then); the largest tilt is at {}. The absorber amplifies the backward waves of this medium: use "
      "grid.absorber.kind auto or graded",
      n, n * g.dt * 1e12, in, in / interior_peak_, interior_peak_, kWindow, tilt_seen_[k - kWindow],
      where(sim, M.ci[at_in], M.cj[at_in]));
}

template <class R>
std::string GrowthGuard<R>::slow_energy(const Simulation<R>& sim, double w) {
  // after the sources have stopped: W past (1 + kEnergyRise) times its lowest since, and
  // rising over each of the last two windows of kWindow checks
  w_peak_ = std::max(w_peak_, w);
  const YeeGrid& g = sim.grid();
  const long n = sim.steps_done();
  if (!(n * g.dt >= sources_end_)) return {};
  w_low_ = w_low_ < 0 ? w : std::min(w_low_, w);
  push(w_seen_, ws_, w);
  const int k = kHistory - 1;  // the newest
  if (ws_ <= 2 * kWindow) return {};
  const double base = std::max(w_low_, kEnergyFloor * w_peak_);
  if (!(w - w_low_ > rise_ * base)) return {};
  const double w1 = w_seen_[k - kWindow], w2 = w_seen_[k - 2 * kWindow];
  if (!(w > w1 && w1 > w2)) return {};
  int bi, bj;  // where: the node of largest energy density, as for the fast growth
  largest_field(sim, false, bi, bj);
  return fmt::format(
      "the run is growing slowly: its sources stopped at t = {:.4g} ps, and by step {} (t = {:.4g} ps) the energy "
      "held has risen to {:.3g} J/m, {:.3g} times the lowest since ({:.3g} J/m), rising over each of the last {} "
      "checks; the largest field is at {}. Growth in the absorbing layers: use grid.absorber.kind auto or graded; "
      "elsewhere: run again with a smaller time.step-fraction to see whether it is a stability problem",
      sources_end_ * 1e12, n, n * g.dt * 1e12, w, w / w_low_, w_low_, 2 * kWindow, where(sim, bi, bj));
}

template class GrowthGuard<float>;
template class GrowthGuard<double>;

}  // namespace ty

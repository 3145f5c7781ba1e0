/// \file growth_guard.cpp
/// \brief The run's guard against growth (growth_guard.h).
#include "solver/guard/growth_guard.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>

#include "io/scene/medium_lookup.h"
#include "io/scene/units.h"
#include "materials/dielectric.h"
#include "materials/magnetic/linear_response.h"

namespace ty {

template <class R>
GrowthGuard<R>::GrowthGuard(const Simulation<R>& sim) {
  const Scene& s = sim.scene();
  const MagneticCells& M = sim.magnets();
  if (M.models.empty()) return;
  double worst = 0;
  for (const Source& src : s.sources) {
    const Band2 band = source_band(src);
    const double lo = 0.8 * band.lo, hi = 1.2 * band.hi;
    const double k = 2 * constants::pi * hi / constants::c0;
    // field amplitude, V/m: a launch line's peak E; a line current I: about eta0 k I one
    // cell away (the 2D Green's function (w mu0 I / 4)|H0(k r)|, |H0| ~ 1 there); a
    // magnetic line current V: k V
    double e0 = std::abs(src.amplitude);
    if (src.kind == Source::Kind::point) e0 *= is_electric(src.component) ? constants::eta0 * k : k;
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
  const bool in = i < g.npml_x || i >= g.nx - g.npml_x || j < g.npml_y || j >= g.ny - g.npml_y;
  return fmt::format("cell ({}, {}) at x = {:.4g} mm, y = {:.4g} mm, in {}, {} the absorbing layers", i, j,
                     (p.x - s.origin_shift.x) * 1e3, (p.y - s.origin_shift.y) * 1e3,
                     m >= 0 ? "'" + s.media[m].name + "'" : std::string("vacuum"), in ? "inside" : "outside");
}

template <class R>
std::string GrowthGuard<R>::check(const Simulation<R>& sim) {
  const YeeGrid& g = sim.grid();
  const long n = sim.steps_done();
  most_injected_ = std::max(most_injected_, sim.injected_energy());
  if (tilt_limit_ > 0) {  // tilt first: it is the earlier sign in a magnet
    const MagneticCells& M = sim.magnets();
    double worst = 0;
    long at = -1;
    for (long k = 0; k < M.count(); ++k) {
      const MagneticState& g0 = M.ground[M.medium[k]];
      for (int sl = 0; sl < 2; ++sl) {
        const Vec3 now(M.m[M.latest][3 * sl][k], M.m[M.latest][3 * sl + 1][k], M.m[M.latest][3 * sl + 2][k]);
        if (now.squaredNorm() == 0) continue;
        const double t = std::atan2(now.cross(g0.m[sl]).norm(), now.dot(g0.m[sl]));
        if (t > worst) worst = t, at = k;
      }
    }
    if (worst > tilt_limit_)
      return fmt::format(
          "the run is growing: by step {} (t = {:.4g} ps; all was well at step {}) a magnetic cell tilted to {:.3g} "
          "rad, where the linear response of the sources allows about {:.2g} rad; the largest tilt is at {}. If the "
          "growth is inside the absorbing layers, check grid.absorber.kind (auto gives magnets the graded loss); else "
          "run again with a smaller time.step-fraction to see whether it is a stability problem",
          n, n * g.dt * 1e12, last_good_, worst, linear_tilt_, where(sim, M.ci[at], M.cj[at]));
  }
  const double w = sim.field_energy() + sim.magnetic_energy();
  const double floor = 1e-30 + 1e-12 * most_injected_;
  if (!(w <= kEnergyFactor * most_injected_ + floor)) {  // NaN too
    double best = -1;                                    // the node of largest energy density (E and eta0 H alike)
    int bi = 0, bj = 0;
    for (int j = 0; j < g.ny; ++j) {
      for (int i = 0; i < g.nx; ++i) {
        double e = 0;
        for (int c = 0; c < 6; ++c) {
          const double v = sim.field(static_cast<Component>(c))[g.at(i, j)];
          e += v * v;
        }
        if (e > best || !std::isfinite(e)) best = e, bi = i, bj = j;
        if (!std::isfinite(best)) break;
      }
      if (!std::isfinite(best)) break;
    }
    return fmt::format(
        "the run is growing: by step {} (t = {:.4g} ps; all was well at step {}) the grid holds {:.3g} J/m, more "
        "than {:g} times the {:.3g} J/m its sources have put in; the largest field is at {}. Run again with a "
        "smaller time.step-fraction to see whether it is a stability problem",
        n, n * g.dt * 1e12, last_good_, w, kEnergyFactor, most_injected_, where(sim, bi, bj));
  }
  last_good_ = n;
  return {};
}

template class GrowthGuard<float>;
template class GrowthGuard<double>;

}  // namespace ty

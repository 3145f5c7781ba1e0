/// \file magnetic_values.cpp
/// \brief What a Simulation's magnetic cells hold, read out: their energy relative to the
/// ground state (with the cells' own field, magnetic_cells.h) and the values of the magnetic
/// outputs (Mx, Lx, dLx, M1x, ...). The cells and their step: magnetic_step.cpp.
#include <cmath>
#include <string>

#include "io/scene/units.h"
#include "materials/magnetic/energy_above.h"
#include "solver/simulation.h"

namespace ty {

template <class R>
double Simulation<R>::magnetic_energy() const {
  return magnetic_energy_of(0, mag_.count()) + (twin_ ? twin_->magnetic_energy() : 0.0);  // both copies
}

/// Cells [k0, k1) of this copy: each cell's own energy above the ground state, and the
/// self-field terms of its faces (the cells below and to the left, and its own open faces),
/// so the rows' ranges add up to the whole list's.
template <class R>
double Simulation<R>::magnetic_energy_of(long k0, long k1) const {
  const MagneticCells& M = mag_;
  double e = 0;
  for (long k = k0; k < k1; ++k) {
    const MagnetModel& mm = M.models[M.medium[k]];
    const auto& s = M.m[M.latest];
    const std::array<Vec3, 2> m{Vec3(s[0][k], s[1][k], s[2][k]), Vec3(s[3][k], s[4][k], s[5][k])};
    e += energy_above(mm, M.ground[M.medium[k]].m, m);  // from the deviations (energy_above.h)
  }
  {
    // the cells' own field G B / mu0 - M holds the energy (|M|^2 - |P M|^2) / 2 beside
    // mu0 H^2 / 2 at the nodes (magnetic_cells.h): along x and y, each face node once
    const int p = M.latest;
    const long none = M.count();
    for (long k = k0; k < k1; ++k) {
      const double mx = M.deviation(p, 0, k), my = M.deviation(p, 1, k);
      e += 0.5 * (mx * mx + my * my);
      auto face = [&](int c, long other) {
        const double v = 0.5 * (M.deviation(p, c, k) + M.deviation(p, c, other));
        e -= 0.5 * v * v;
      };
      if (partner_ && M.ci[k] == 0 && M.left[k] < none) {  // across the Bloch seam: bloch.h
        const long l = M.left[k];
        const double v = 0.5 * (mx + seam_value(M.deviation(p, 0, l), partner_->mag_.deviation(p, 0, l), true));
        e -= 0.5 * v * v;
      } else {
        face(0, M.left[k]);
      }
      face(1, M.down[k]);
      if (M.right[k] == none && (M.ci[k] + 1 < g_.nx || walls_.periodic_x || walls_.bloch_x)) face(0, none);
      if (M.up[k] == none && (M.cj[k] + 1 < g_.ny || walls_.periodic_y)) face(1, none);
    }
  }
  return e / constants::mu0 * g_.dx * g_.dy;
}

template <class R>
double Simulation<R>::magnetic_value(const std::string& f, long k, int p) const {
  const MagneticCells& M = mag_;
  const int slot = M.medium[k];
  const MagnetModel& mm = M.models[slot];
  const MagneticState& g0 = M.ground[slot];
  const int c = f.back() - 'x';
  const double m1 = M.m[p][c][k], m2 = mm.n == 2 ? M.m[p][3 + c][k] : 0.0;
  if (f[0] == 'M' && f.size() == 2)  // mu0 times the deviation of the total magnetization, T
    return mm.mu[0] * (m1 - g0.m[0][c]) + (mm.n == 2 ? mm.mu[1] * (m2 - g0.m[1][c]) : 0.0);
  if (f.rfind("M1", 0) == 0) return mm.mu[0] * m1;
  if (f.rfind("M2", 0) == 0) return mm.n == 2 ? mm.mu[1] * m2 : 0.0;
  const double l = mm.n == 2 ? 0.5 * (m1 - m2) : m1;  // Neel unit vector (m1 - m2)/2
  if (f[0] == 'L') return l;
  const double l0 = mm.n == 2 ? 0.5 * (g0.m[0][c] - g0.m[1][c]) : g0.m[0][c];
  return l - l0;  // dL
}

#define TY_INSTANTIATE(R)                                 \
  template double Simulation<R>::magnetic_energy() const; \
  template double Simulation<R>::magnetic_energy_of(long, long) const; \
  template double Simulation<R>::magnetic_value(const std::string&, long, int) const;
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

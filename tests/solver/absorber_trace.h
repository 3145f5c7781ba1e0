/// \file absorber_trace.h
/// \brief Where and when the tilts of an absorber case peak: the largest tilt inside and
/// outside the absorbing layers over time, where the layer's largest sits (depth in cells
/// past the layer's entrance), and, per column, the largest tilt over the traced stretch --
/// the envelope along x that tells a wave growing in the layer from a steady pattern of a cw
/// wave meeting it (a standing wave or the beat of guided modes).
#pragma once
#include <algorithm>
#include <cmath>
#include <vector>

#include "solver/media/magnetic_cells.h"

namespace ty::test {

/// The larger of the sublattices' angles to their ground directions, cell k (rad).
inline double cell_tilt(const MagneticCells& M, long k) {
  const MagneticState& g = M.ground[M.medium[k]];
  double worst = 0;
  for (int s = 0; s < 2; ++s) {
    const Vec3 now(M.m[M.latest][3 * s][k], M.m[M.latest][3 * s + 1][k], M.m[M.latest][3 * s + 2][k]);
    if (now.squaredNorm() == 0) continue;
    worst = std::max(worst, std::atan2(now.cross(g.m[s]).norm(), now.dot(g.m[s])));
  }
  return worst;
}

/// Each region's largest squared chord |m_s - g_s|^2 of any sublattice now, inside (in2,
/// only with `layer`) and outside (out2) the layers, raised to it: the tilt's monotone
/// measure without an atan2 per cell, cheap enough to take at every step (angle =
/// 2 asin(|chord| / 2), tilt_of_chord).
inline void largest_chords(const MagneticCells& M, int nx, int ny, int npx, int npy, double& in2, double& out2,
                           bool layer = true) {
  const auto& m = M.m[M.latest];
  for (long k = 0; k < M.count(); ++k) {
    const bool in = MagneticCells::in_layers(M.ci[k], M.cj[k], nx, ny, npx, npy);
    if (in && !layer) continue;
    const MagneticState& g = M.ground[M.medium[k]];
    double d2 = 0;
    for (int s = 0; s < 2; ++s) {
      if (m[3 * s][k] == 0 && m[3 * s + 1][k] == 0 && m[3 * s + 2][k] == 0) continue;  // one sublattice
      double e = 0;
      for (int c = 0; c < 3; ++c) e += (m[3 * s + c][k] - g.m[s][c]) * (m[3 * s + c][k] - g.m[s][c]);
      d2 = std::max(d2, e);
    }
    double& worst = in ? in2 : out2;
    worst = std::max(worst, d2);
  }
}

/// The angle (rad) between two unit vectors a squared chord d2 apart.
inline double tilt_of_chord(double d2) { return 2 * std::asin(std::min(1.0, 0.5 * std::sqrt(d2))); }

/// One sample of the trace: the largest tilt inside and outside the layers and where.
struct TiltSample {
  double in = 0, out = 0;
  int in_i = -1, in_j = -1, out_i = -1, out_j = -1;
  int depth = 0;  ///< the layer's largest: cells past the nearer layer's entrance (1: the first cell in it)
};

struct TiltTrace {
  std::vector<double> column;  ///< per column i: the largest tilt seen at any j and any sample
  std::vector<double>
      entrance;  ///< per sample: the largest tilt of the interior's last 4 columns before either x layer
  std::vector<TiltSample> samples;

  /// Samples the cells now (nx, npx: the grid's columns and x layer's cells; npy the y layer's).
  TiltSample sample(const MagneticCells& M, int nx, int ny, int npx, int npy) {
    if (column.empty()) column.assign(nx, 0.0);
    TiltSample t;
    double near = 0;
    for (long k = 0; k < M.count(); ++k) {
      const int i = M.ci[k], j = M.cj[k];
      const double a = cell_tilt(M, k);
      column[i] = std::max(column[i], a);
      const bool in = MagneticCells::in_layers(i, j, nx, ny, npx, npy);
      if (in && a > t.in) {
        t.in = a, t.in_i = i, t.in_j = j;
        int d = std::min({i < npx ? npx - i : nx, i >= nx - npx ? i - (nx - npx) + 1 : nx, j < npy ? npy - j : ny,
                          j >= ny - npy ? j - (ny - npy) + 1 : ny});
        t.depth = d;
      }
      if (!in && a > t.out) t.out = a, t.out_i = i, t.out_j = j;
      if (!in && ((i >= npx && i < npx + 4) || (i < nx - npx && i >= nx - npx - 4))) near = std::max(near, a);
    }
    entrance.push_back(near);
    samples.push_back(t);
    return t;
  }
};

}  // namespace ty::test

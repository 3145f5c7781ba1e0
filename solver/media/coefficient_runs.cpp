/// \file coefficient_runs.cpp
/// \brief The media of a Simulation as E-update coefficients: each E node's ca, cb from the
/// medium averaged over its cell (4 x 4 sub-samples; perfect conductors zero both), then
/// rows of run-length coefficient runs (Run{i0, i1, ca, kx, ky}), a vacuum-like row marked
/// for the fused constant-coefficient loop; and the medium map of the extent's cells.
#include "io/scene/units.h"
#include "materials/dielectric.h"
#include "solver/simulation.h"

namespace ty {

using constants::c0;
using constants::eta0;

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
  walls_.hold_e_coefficients(ca, cb, nx, ny);  // electric walls

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

#define TY_INSTANTIATE(R) template void Simulation<R>::build_media(std::vector<double>(&)[3]);
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

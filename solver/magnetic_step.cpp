/// \file magnetic_step.cpp
/// \brief The magnetic cells of a Simulation: building the compact list, the time step
/// of a scene that holds magnets (H sweep, magnetic cells, scatter, E sweep), and the
/// magnetic energy and output values. Placement and time centring: magnetic_cells.h.
#include <fmt/format.h>
#include <omp.h>

#include <algorithm>
#include <cmath>

#include "io/units.h"
#include "materials/dielectric.h"
#include "materials/linear_response.h"
#include "solver/simulation.h"

namespace ty {

using constants::c0;

template <class R>
void Simulation<R>::build_magnets() {
  const Scene& s = scene_;
  MagneticCells& M = mag_;
  const int nx = g_.nx, ny = g_.ny;
  M.cell_of.assign(static_cast<size_t>(nx) * ny, -1);
  std::vector<int> slot_of_medium(s.media.size(), -1);
  for (size_t k = 0; k < s.media.size(); ++k) {
    if (!s.media[k].magnet) continue;
    bool used = false;
    for (const Body& b : s.bodies) used |= b.medium == static_cast<int>(k);
    if (!used) continue;
    slot_of_medium[k] = static_cast<int>(M.models.size());
    M.models.emplace_back(*s.media[k].magnet, s.bias);
    M.ground.push_back(find_ground_states(M.models.back()).ground);
    const auto f = resonances(M.models.back(), M.ground.back());
    const double f_max = f.empty() ? M.models.back().gamma[0] * 1.0 / (2 * constants::pi) : f.back();
    M.coeffs.push_back(LlgCoefficients::from(M.models.back(), g_.dt, f_max));
    notes_.push_back(fmt::format("magnetic medium '{}': ground state {}, {} midpoint sub-step{} per time step",
                                 s.media[k].name, M.ground.back().kind, M.coeffs.back().substeps,
                                 M.coeffs.back().substeps == 1 ? "" : "s"));
  }
  if (M.models.empty()) return;
  // cells by medium, then row-major (uniform parameters along the list)
  for (int slot = 0; slot < static_cast<int>(M.models.size()); ++slot)
    for (int j = 0; j < ny; ++j)
      for (int i = 0; i < nx; ++i) {
        const int med = medium_at(s, {g_.x(Component::Hz, i), g_.y(Component::Hz, j)});
        if (med < 0 || slot_of_medium[med] != slot) continue;
        M.cell_of[static_cast<size_t>(j) * nx + i] = static_cast<int>(M.ci.size());
        M.ci.push_back(i);
        M.cj.push_back(j);
        M.medium.push_back(slot);
      }
  const long n = M.count();
  auto node = [&](int i, int j) -> long {  // flat index of a node, wrapped on periodic sides
    if (periodic_x_) i = (i % nx + nx) % nx;
    if (periodic_y_) j = (j % ny + ny) % ny;
    if (i < 0 || i >= nx || j < 0 || j >= ny) return -1;
    return g_.at(i, j);
  };
  auto cell = [&](int i, int j) -> int {
    if (periodic_x_) i = (i % nx + nx) % nx;
    if (periodic_y_) j = (j % ny + ny) % ny;
    if (i < 0 || i >= nx || j < 0 || j >= ny) return -1;
    return M.cell_of[static_cast<size_t>(j) * nx + i];
  };
  for (auto* v : {&M.hx0, &M.hx1, &M.hy0, &M.hy1, &M.hz}) v->resize(n);
  for (auto* v : {&M.left, &M.right, &M.down, &M.up}) v->resize(n);
  for (int c = 0; c < 6; ++c) M.m[c].resize(n), M.guess[c].assign(n, 0.0);
  for (int c = 0; c < 3; ++c)
    M.b_old[c].assign(n, 0), M.b_new[c].assign(n, 0), M.dM[c].assign(n, 0), M.dM_prev[c].assign(n, 0);
  for (long k = 0; k < n; ++k) {
    const int i = M.ci[k], j = M.cj[k];
    M.hx0[k] = node(i, j), M.hx1[k] = node(i + 1, j), M.hy0[k] = node(i, j), M.hy1[k] = node(i, j + 1);
    M.hz[k] = node(i, j);
    M.left[k] = cell(i - 1, j), M.right[k] = cell(i + 1, j), M.down[k] = cell(i, j - 1), M.up[k] = cell(i, j + 1);
    const MagneticState& g0 = M.ground[M.medium[k]];
    for (int c = 0; c < 3; ++c) M.m[c][k] = g0.m[0][c], M.m[3 + c][k] = g0.m[1][c];
  }
  // scatter nodes: every H node a magnetic cell gathers from, with its one or two cells
  std::vector<std::pair<long, int>> keys;  // (index * 8 + comp) -> list position
  auto add = [&](long index, int comp, int k, double w) {
    if (index < 0) return;
    const long key = index * 8 + comp;
    auto it = std::lower_bound(keys.begin(), keys.end(), std::make_pair(key, -1));
    if (it != keys.end() && it->first == key) {
      MagneticCells::Node& nd = M.nodes[it->second];
      nd.cell[1] = k;
      nd.weight[1] = w;
      return;
    }
    keys.insert(it, {key, static_cast<int>(M.nodes.size())});
    M.nodes.push_back({index, comp, {k, -1}, {w, 0.0}});
  };
  for (long k = 0; k < n; ++k) {
    add(M.hx0[k], 3, static_cast<int>(k), 0.5);
    add(M.hx1[k], 3, static_cast<int>(k), 0.5);
    add(M.hy0[k], 4, static_cast<int>(k), 0.5);
    add(M.hy1[k], 4, static_cast<int>(k), 0.5);
    add(M.hz[k], 5, static_cast<int>(k), 1.0);
  }
  std::sort(M.nodes.begin(), M.nodes.end(), [](const auto& a, const auto& b) {
    return a.index != b.index ? a.index < b.index : a.comp < b.comp;
  });
  bytes_ += n * (12 + 15) * sizeof(double) + n * (5 * sizeof(long) + 5 * sizeof(int)) +
            M.nodes.size() * sizeof(MagneticCells::Node) + M.cell_of.size() * sizeof(int);
}

template <class R>
void Simulation<R>::gather(long k, double* b) const {
  const MagneticCells& M = mag_;
  auto at = [&](int comp, long idx) { return idx < 0 ? 0.0 : static_cast<double>(f_[comp][idx]); };
  const double inv_c = 1.0 / c0;  // mu0 H = (eta0 H) / c
  b[0] = 0.5 * (at(3, M.hx0[k]) + at(3, M.hx1[k])) * inv_c;
  b[1] = 0.5 * (at(4, M.hy0[k]) + at(4, M.hy1[k])) * inv_c;
  b[2] = at(5, M.hz[k]) * inv_c;
}

template <class R>
void Simulation<R>::step_split() {
  compute_emitters();
  const int ny = g_.ny;
  const long s = g_.stride;
  MagneticCells& M = mag_;
  const long n = M.count();
  const long nn = static_cast<long>(M.nodes.size());
  if (periodic_y_)
    for (int c = 0; c < 3; ++c) std::copy_n(f_[c].data() + g_.row_begin(0), s, f_[c].data() + g_.row_begin(ny));
#pragma omp parallel num_threads(threads_)
  {
    const int t = omp_get_thread_num(), nt = omp_get_num_threads();
    auto range = [&](long total, long& lo, long& hi) {
      const long q = total / nt, r = total % nt;
      lo = t * q + std::min<long>(t, r);
      hi = lo + q + (t < r ? 1 : 0);
    };
    long c0_, c1_, j0, j1, n0, n1;
    range(n, c0_, c1_);
    range(ny, j0, j1);
    range(nn, n0, n1);
    for (long k = c0_; k < c1_; ++k) {  // b at n-1/2, before H moves
      double b[3];
      gather(k, b);
      for (int c = 0; c < 3; ++c) M.b_old[c][k] = b[c];
    }
#pragma omp barrier
    for (long j = j0; j < j1; ++j) h_row(static_cast<int>(j));  // h* = H - c dt curl E
#pragma omp barrier
    const double r[3] = {0.5, 0.5, 1.0};  // the cell's own share of G P dM
    for (long k = c0_; k < c1_; ++k) {  // b at n+1/2 less the neighbours' share of G P dM (their previous step)
      double b[3];
      gather(k, b);
      auto prev = [&](int cell, int comp) { return cell < 0 ? 0.0 : M.dM_prev[comp][cell]; };
      M.b_new[0][k] = b[0] - 0.25 * (prev(M.left[k], 0) + prev(M.right[k], 0));
      M.b_new[1][k] = b[1] - 0.25 * (prev(M.down[k], 1) + prev(M.up[k], 1));
      M.b_new[2][k] = b[2];
    }
    // the cells of one medium are contiguous in the list: advance each run together
    for (long a = c0_; a < c1_;) {
      long e = a;
      while (e < c1_ && M.medium[e] == M.medium[a]) ++e;
      double* mp[6];
      double* gp[6];
      for (int c = 0; c < 6; ++c) mp[c] = M.m[c].data() + a, gp[c] = M.guess[c].data() + a;
      const double* bo[3] = {M.b_old[0].data() + a, M.b_old[1].data() + a, M.b_old[2].data() + a};
      const double* bn[3] = {M.b_new[0].data() + a, M.b_new[1].data() + a, M.b_new[2].data() + a};
      double* dp[3] = {M.dM[0].data() + a, M.dM[1].data() + a, M.dM[2].data() + a};
      llg_cells(M.coeffs[M.medium[a]], e - a, mp, gp, bo, bn, r, dp);
      a = e;
    }
#pragma omp barrier
    for (long q = n0; q < n1; ++q) {  // H = h* - P dM, each node once
      const MagneticCells::Node& nd = M.nodes[q];
      const int comp = nd.comp - 3;
      double d = nd.weight[0] * M.dM[comp][nd.cell[0]];
      if (nd.cell[1] >= 0) d += nd.weight[1] * M.dM[comp][nd.cell[1]];
      f_[nd.comp][nd.index] -= static_cast<R>(c0 * d);
    }
    for (long k = c0_; k < c1_; ++k)
      for (int c = 0; c < 3; ++c) M.dM_prev[c][k] = M.dM[c][k];
#pragma omp barrier
    for (long j = j0; j < j1; ++j) h_boundaries(static_cast<int>(j));  // walls and ghosts again, after the scatter
#pragma omp barrier
    if (t == 0 && periodic_y_)
      for (int c = 3; c < 6; ++c) std::copy_n(f_[c].data() + g_.row_begin(ny - 1), s, f_[c].data() + g_.row_begin(-1));
#pragma omp barrier
    for (long j = j0; j < j1; ++j) e_row(static_cast<int>(j));
  }
  ++n_;
}

template <class R>
double Simulation<R>::magnetic_energy() const {
  const MagneticCells& M = mag_;
  double e = 0;
  for (long k = 0; k < M.count(); ++k) {
    const MagnetModel& mm = M.models[M.medium[k]];
    const std::array<Vec3, 2> m{Vec3(M.m[0][k], M.m[1][k], M.m[2][k]), Vec3(M.m[3][k], M.m[4][k], M.m[5][k])};
    e += mm.energy(m) - M.ground[M.medium[k]].energy;
  }
  return e / constants::mu0 * g_.dx * g_.dy;
}

template <class R>
double Simulation<R>::magnetic_value(const std::string& f, long k) const {
  const MagneticCells& M = mag_;
  const int slot = M.medium[k];
  const MagnetModel& mm = M.models[slot];
  const MagneticState& g0 = M.ground[slot];
  const int c = f.back() - 'x';
  const double m1 = M.m[c][k], m2 = mm.n == 2 ? M.m[3 + c][k] : 0.0;
  if (f[0] == 'M' && f.size() == 2)  // mu0 times the deviation of the total magnetization, T
    return mm.mu[0] * (m1 - g0.m[0][c]) + (mm.n == 2 ? mm.mu[1] * (m2 - g0.m[1][c]) : 0.0);
  if (f.rfind("M1", 0) == 0) return mm.mu[0] * m1;
  if (f.rfind("M2", 0) == 0) return mm.n == 2 ? mm.mu[1] * m2 : 0.0;
  const double l = mm.n == 2 ? 0.5 * (m1 - m2) : m1;  // Neel unit vector (m1 - m2)/2
  if (f[0] == 'L') return l;
  const double l0 = mm.n == 2 ? 0.5 * (g0.m[0][c] - g0.m[1][c]) : g0.m[0][c];
  return l - l0;  // dL
}

#define TY_INSTANTIATE(R)                                                     \
  template void Simulation<R>::build_magnets();                               \
  template void Simulation<R>::gather(long, double*) const;                   \
  template void Simulation<R>::step_split();                                  \
  template double Simulation<R>::magnetic_energy() const;                     \
  template double Simulation<R>::magnetic_value(const std::string&, long) const;
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

/// \file tensor_cells.cpp
/// \brief Building the list of in-plane nodes with a full 2D permittivity tensor
/// (tensor_cells.h): the medium sampled over each node's cell, the nodes' 2 x 2
/// coefficients, and the symmetric neighbour weights of Werner & Cary (2007).
#include "solver/media/tensor_cells.h"

#include <algorithm>
#include <cmath>

#include "io/scene/constants.h"
#include "io/scene/medium_lookup.h"
#include "materials/permittivity/ade.h"
#include "solver/grid/yee_grid.h"

namespace ty {

namespace {

constexpr int kSub = 4;  // as in coefficient_runs.cpp: the same samples, the same shares

/// Sample (u, v) of node (c, i, j).
Vec2 sample_at(const YeeGrid& g, int c, int i, int j, int u, int v) {
  const Component comp = static_cast<Component>(c);
  return {g.x(comp, i) + ((u + 0.5) / kSub - 0.5) * g.dx, g.y(comp, j) + ((v + 0.5) / kSub - 0.5) * g.dy};
}

bool rotated(const Medium& m) { return !m.perfect_conductor && m.tensor && !m.tensor->diagonal_in_plane(); }

}  // namespace

bool samples_rotated(const Scene& s, const YeeGrid& g, int c, int i, int j) {
  for (int u = 0; u < kSub; ++u)
    for (int v = 0; v < kSub; ++v) {
      const int m = medium_at(s, sample_at(g, c, i, j, u, v));
      if (m >= 0 && rotated(s.media[m])) return true;
    }
  return false;
}

bool tensor_node(const Scene& s, const YeeGrid& g, int c, int i, int j, TensorNode& out) {
  const Component comp = static_cast<Component>(c);
  const int centre = medium_at(s, {g.x(comp, i), g.y(comp, j)});
  if (centre >= 0 && s.media[centre].perfect_conductor) return false;
  out = TensorNode{};
  out.index = g.at(i, j), out.comp = c, out.i = i, out.j = j;
  out.eps[0][0] = out.eps[1][1] = 0;
  int sample[kSub * kSub], count = 0;
  for (int u = 0; u < kSub; ++u)
    for (int v = 0; v < kSub; ++v) {
      const int m = medium_at(s, sample_at(g, c, i, j, u, v));
      if (m >= 0 && s.media[m].perfect_conductor) continue;
      sample[count++] = m;
    }
  // the medium of most samples (the centre's on a tie) fills the node: see the header on
  // why these nodes do not take the mean over the cell
  int best = count > 0 ? sample[0] : -1, most = 0;
  for (int k = 0; k < count; ++k) {
    const int n = static_cast<int>(std::count(sample, sample + count, sample[k]));
    if (n > most || (n == most && sample[k] == centre)) best = sample[k], most = n;
  }
  count = std::min(count, 1);
  sample[0] = best;
  for (int k = 0; k < count; ++k) {
    const int m = sample[k];
    const double share = 1.0;
    if (m < 0) {
      out.eps[0][0] += share, out.eps[1][1] += share;
      continue;
    }
    const Medium& med = s.media[m];
    out.sigma += share * med.conductivity;
    if (!med.tensor) {
      out.eps[0][0] += share * med.permittivity[0], out.eps[1][1] += share * med.permittivity[1];
      continue;
    }
    // R diag(eps_u, eps_v) R^T (Born & Wolf, sec. 15.1), and the poles along u and v
    const PermittivityTensor& t = *med.tensor;
    const double cs = std::cos(t.rotate), sn = std::sin(t.rotate);
    const double eu = t.axis[0].eps_inf, ev = t.axis[1].eps_inf;
    out.eps[0][0] += share * (eu * cs * cs + ev * sn * sn);
    out.eps[1][1] += share * (eu * sn * sn + ev * cs * cs);
    out.eps[0][1] += share * (eu - ev) * sn * cs;
    out.eps[1][0] = out.eps[0][1];
    const double dir[2][2] = {{cs, sn}, {-sn, cs}};
    for (int ax = 0; ax < 2; ++ax) {
      std::vector<AdePole> ps;
      append_poles(t.axis[ax], share, g.dt, ps);
      for (const AdePole& p : ps) out.poles.push_back({p.c1, p.c2, p.c3, dir[ax][0], dir[ax][1]});
    }
  }
  return true;
}

namespace {

/// Node n's coefficients: K = (eps_inf + Y + x_s)^-1 and row comp of Y + x_s.
void node_rows(const TensorNode& n, double dt, double& k_own, double& k_cross, double& y_own, double& y_cross,
               double& x_s) {
  const double a = 0.5 * dt;
  x_s = a * n.sigma / constants::eps0;
  double y[2][2] = {{x_s, 0}, {0, x_s}};
  for (const TensorPole& p : n.poles) {
    y[0][0] += a * p.c3 * p.dx * p.dx;
    y[0][1] += a * p.c3 * p.dx * p.dy;
    y[1][1] += a * p.c3 * p.dy * p.dy;
  }
  y[1][0] = y[0][1];
  const double m00 = n.eps[0][0] + y[0][0], m01 = n.eps[0][1] + y[0][1], m11 = n.eps[1][1] + y[1][1];
  const double det = m00 * m11 - m01 * m01;
  const int c = n.comp;
  k_own = (c == 0 ? m11 : m00) / det;
  k_cross = -m01 / det;
  y_own = y[c][c];
  y_cross = y[c][1 - c];
}

}  // namespace

TensorCells join_tensor_nodes(std::vector<TensorNode>& nodes, const YeeGrid& g, bool wrap_x, bool wrap_y) {
  std::sort(nodes.begin(), nodes.end(), [](const TensorNode& x, const TensorNode& y) {
    return x.comp != y.comp ? x.comp < y.comp : x.index < y.index;
  });
  TensorCells t;
  t.half_dt = 0.5 * g.dt;
  const size_t n = nodes.size();
  t.k_own.resize(n), t.k_cross.resize(n), t.y_own.resize(n), t.y_cross.resize(n), t.x_sigma.resize(n);
  t.pole_first.assign(1, 0);
  for (size_t q = 0; q < n; ++q) {
    const TensorNode& node = nodes[q];
    t.index.push_back(node.index);
    t.comp.push_back(node.comp);
    node_rows(node, g.dt, t.k_own[q], t.k_cross[q], t.y_own[q], t.y_cross[q], t.x_sigma[q]);
    t.poles.insert(t.poles.end(), node.poles.begin(), node.poles.end());
    t.pole_first.push_back(static_cast<int>(t.poles.size()));
  }
  // neighbours: Ex(i, j) touches Ey(i, j), Ey(i+1, j), Ey(i, j-1), Ey(i+1, j-1); Ey(i, j) the
  // transpose, Ex(i, j), Ex(i-1, j), Ex(i, j+1), Ex(i-1, j+1)
  const auto mid = t.index.begin() + std::count(t.comp.begin(), t.comp.end(), 0);  // first Ey
  auto find = [&](int c, long index) {
    const auto first = c == 0 ? t.index.begin() : mid, last = c == 0 ? mid : t.index.end();
    const auto at = std::lower_bound(first, last, index);
    return at != last && *at == index ? static_cast<int>(at - t.index.begin()) : -1;
  };
  t.nb.resize(n), t.nb_field.resize(n), t.w.resize(n);
  for (size_t q = 0; q < n; ++q) {
    const TensorNode& node = nodes[q];
    const int di[4] = {0, node.comp == 0 ? 1 : -1, 0, node.comp == 0 ? 1 : -1};
    const int dj[4] = {0, 0, node.comp == 0 ? -1 : 1, node.comp == 0 ? -1 : 1};
    for (int m = 0; m < 4; ++m) {
      int i = node.i + di[m], j = node.j + dj[m];
      if (wrap_x) i = (i + g.nx) % g.nx;  // across a periodic seam, the wrapped node
      if (wrap_y) j = (j + g.ny) % g.ny;
      const bool inside = i >= 0 && j >= 0 && i < g.nx && j < g.ny;
      t.nb_field[q][m] = inside ? g.at(i, j) : -1;
      t.nb[q][m] = inside ? find(1 - node.comp, g.at(i, j)) : -1;
      t.w[q][m] = t.nb[q][m] >= 0 ? 0.125 * (t.k_cross[q] + t.k_cross[t.nb[q][m]]) : 0.0;
    }
  }
  t.d.assign(n, 0.0), t.e_own.assign(n, 0.0), t.e_other.assign(n, 0.0);
  t.f.assign(n, 0.0), t.g.assign(n, 0.0);
  t.p.assign(t.poles.size(), 0.0), t.j.assign(t.poles.size(), 0.0);
  return t;
}

}  // namespace ty

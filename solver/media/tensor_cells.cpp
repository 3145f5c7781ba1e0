/// \file tensor_cells.cpp
/// \brief Building the list of in-plane nodes with a full 2D permittivity tensor
/// (tensor_cells.h): the medium sampled over each node's cell, its principal frame and
/// poles, the neighbour links and the sites with their weights.
#include "solver/media/tensor_cells.h"
#include "solver/media/tensor_energy.h"

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

}  // namespace

bool samples_rotated(const Scene& s, const YeeGrid& g, int c, int i, int j) {
  for (int u = 0; u < kSub; ++u)
    for (int v = 0; v < kSub; ++v) {
      const int m = medium_at(s, sample_at(g, c, i, j, u, v));
      if (m >= 0 && s.media[m].rotated_in_plane()) return true;
    }
  return false;
}

bool tensor_node(const Scene& s, const YeeGrid& g, int c, int i, int j, TensorNode& out) {
  const Component comp = static_cast<Component>(c);
  const int centre = medium_at(s, {g.x(comp, i), g.y(comp, j)});
  if (centre >= 0 && s.media[centre].perfect_conductor) return false;
  out = TensorNode{};
  out.index = g.at(i, j), out.comp = c, out.i = i, out.j = j;
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
  if (best < 0) return true;  // vacuum: eps 1 along x and y, no poles
  const Medium& med = s.media[best];
  out.sigma = med.conductivity;
  if (!med.tensor) {
    out.eps[0] = med.permittivity[0], out.eps[1] = med.permittivity[1];
    return true;
  }
  // the principal axes u, v at `rotate` from x (Born & Wolf, sec. 15.1), with their poles
  const PermittivityTensor& t = *med.tensor;
  out.cs = std::cos(t.rotate), out.sn = std::sin(t.rotate);
  for (int ax = 0; ax < 2; ++ax) {
    out.eps[ax] = t.axis[ax].eps_inf;
    append_poles(t.axis[ax], 1.0, g.dt, out.poles[ax]);
  }
  return true;
}

namespace {

/// An instance of node n (tensor_cells.h): its kind, weight, per-axis coefficients (ade.h) and poles.
void add_instance(TensorCells& t, const TensorNode& n, int kind, double w, double dt) {
  t.kind.push_back(kind);
  t.weight.push_back(w);
  for (int a = 0; a < 2; ++a) {
    double sum_c3 = 0;
    for (const AdePole& p : n.poles[a]) sum_c3 += p.c3;
    t.axis.push_back(ade_node(n.eps[a], n.sigma, sum_c3, dt));
    t.poles.insert(t.poles.end(), n.poles[a].begin(), n.poles[a].end());
    t.pole_first.push_back(static_cast<int>(t.poles.size()));
  }
}

bool same_poles(const std::vector<AdePole>& a, const std::vector<AdePole>& b) {
  if (a.size() != b.size()) return false;
  for (size_t k = 0; k < a.size(); ++k)
    if (a[k].c1 != b[k].c1 || a[k].c2 != b[k].c2 || a[k].c3 != b[k].c3) return false;
  return true;
}

/// Whether two nodes hold the same medium (frame, backgrounds, conductivity, poles).
bool same_medium(const TensorNode& a, const TensorNode& b) {
  return a.cs == b.cs && a.sn == b.sn && a.eps[0] == b.eps[0] && a.eps[1] == b.eps[1] && a.sigma == b.sigma &&
         same_poles(a.poles[0], b.poles[0]) && same_poles(a.poles[1], b.poles[1]);
}

/// The neighbour links of the sorted list (wrapped across the seam of a periodic axis):
/// Ex(i, j) touches Ey(i, j), Ey(i+1, j), Ey(i, j-1), Ey(i+1, j-1); Ey(i, j) the transpose,
/// Ex(i, j), Ex(i-1, j), Ex(i, j+1), Ex(i-1, j+1) (slot for slot).
void link(TensorCells& t, const std::vector<TensorNode>& nodes, const YeeGrid& g, bool wrap_x, bool wrap_y) {
  const auto mid = t.index.begin() + std::count(t.comp.begin(), t.comp.end(), 0);  // first Ey
  auto find = [&](int c, long index) {
    const auto first = c == 0 ? t.index.begin() : mid, last = c == 0 ? mid : t.index.end();
    const auto at = std::lower_bound(first, last, index);
    return at != last && *at == index ? static_cast<int>(at - t.index.begin()) : -1;
  };
  const size_t n = nodes.size();
  t.nb.resize(n), t.back.resize(n);
  for (size_t q = 0; q < n; ++q) {
    const TensorNode& node = nodes[q];
    const int di[4] = {0, node.comp == 0 ? 1 : -1, 0, node.comp == 0 ? 1 : -1};
    const int dj[4] = {0, 0, node.comp == 0 ? -1 : 1, node.comp == 0 ? -1 : 1};
    for (int m = 0; m < 4; ++m) {
      int i = node.i + di[m], j = node.j + dj[m];
      if (wrap_x) i = (i + g.nx) % g.nx;  // across a periodic seam, the wrapped node
      if (wrap_y) j = (j + g.ny) % g.ny;
      const bool inside = i >= 0 && j >= 0 && i < g.nx && j < g.ny;
      t.nb[q][m] = inside ? find(1 - node.comp, g.at(i, j)) : -1;
      // no link across a face between media: a face node's diagonal stays its own medium's
      // (its own instance makes up for the missing neighbours), not a mean of 1/eps that
      // would misplace the tangential field's resonances
      if (t.nb[q][m] >= 0 && !same_medium(node, nodes[t.nb[q][m]])) t.nb[q][m] = -1;
    }
  }
  for (size_t q = 0; q < n; ++q)
    for (int m = 0; m < 4; ++m) {
      t.back[q][m] = -1;
      if (const int k = t.nb[q][m]; k >= 0)
        for (int i = 0; i < 4; ++i)
          if (t.nb[k][i] == static_cast<int>(q)) t.back[q][m] = i;
    }
}

}  // namespace

TensorCells join_tensor_nodes(std::vector<TensorNode>& nodes, const YeeGrid& g, bool wrap_x, bool wrap_y) {
  std::sort(nodes.begin(), nodes.end(), [](const TensorNode& x, const TensorNode& y) {
    return x.comp != y.comp ? x.comp < y.comp : x.index < y.index;
  });
  TensorCells t;
  t.half_dt = 0.5 * g.dt;
  const size_t n = nodes.size();
  for (const TensorNode& node : nodes) {
    t.index.push_back(node.index), t.comp.push_back(node.comp);
    t.cs.push_back(node.cs), t.sn.push_back(node.sn);
  }
  link(t, nodes, g, wrap_x, wrap_y);
  std::vector<int> links(n, 0);  // neighbours in the list
  for (size_t q = 0; q < n; ++q)
    for (int m = 0; m < 4; ++m) links[q] += t.nb[q][m] >= 0;
  // the weights (tensor_cells.h): a neighbour m with all four links gives node q 1/8 of the
  // diagonal (its full and deviation instances), one with fewer links (and no deviation
  // instances) links/32; the own instance makes up the rest of 1 beside the full instance's 1/2
  t.pole_first.assign(1, 0);
  t.inst_first.assign(1, 0);
  for (size_t q = 0; q < n; ++q) {
    add_instance(t, nodes[q], TensorCells::full, 0.5, g.dt);
    if (links[q] == 4)
      for (int i = 0; i < 4; ++i) add_instance(t, nodes[q], TensorCells::deviation + i, 0.125, g.dt);
    double rest = 0.5;
    for (int m = 0; m < 4; ++m)
      if (const int k = t.nb[q][m]; k >= 0) rest -= links[k] == 4 ? 0.125 : links[k] / 32.0;
    if (rest > 1e-12) add_instance(t, nodes[q], TensorCells::own, rest, g.dt);
    t.inst_first.push_back(static_cast<int>(t.kind.size()));
  }
  t.e_axis.assign(2 * t.kind.size(), 0.0);
  t.e_node.assign(n, 0.0), t.g.assign(n, 0.0), t.out_own.assign(n, 0.0), t.out_other.assign(n, 0.0);
  t.out_dev.assign(n, {0, 0, 0, 0});
  t.p.assign(t.poles.size(), 0.0), t.j.assign(t.poles.size(), 0.0);
  return t;
}

double instance_energy(const TensorCells& t) {
  // eps_inf comes back from the node's coefficients (ade.h: k+- = eps_inf +- x, ca = k-/k+,
  // cb = 1/k+), each pole's energy from its own (pole_energy)
  double u = 0;
  for (long s = 0; s < t.instances(); ++s)
    for (int x = 0; x < 2; ++x) {
      const long sa = 2 * s + x;
      const AdeNode& k = t.axis[sa];
      double w = 0.5 * (1 + k.ca) / (2 * k.cb) * t.e_axis[sa] * t.e_axis[sa];
      for (int i = t.pole_first[sa]; i < t.pole_first[sa + 1]; ++i) w += pole_energy(t.poles[i], t.half_dt, t.p[i], t.j[i]);
      u += t.weight[s] * w;
    }
  return u;
}

}  // namespace ty

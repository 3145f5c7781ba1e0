/// \file coefficient_runs.cpp
/// \brief The media of a Simulation as E-update coefficients: each E node's ca, cb from the
/// medium averaged over its cell (4 x 4 sub-samples; perfect conductors zero both; dispersive
/// nodes also go to the compact list of solver/media/dispersive_cells.h; in-plane nodes
/// where eps_xy != 0, and their neighbours, to solver/media/tensor_cells.h), then
/// rows of run-length coefficient runs (Run{i0, i1, ca, kx, ky}, and each run's cb for the
/// absorber's and sources' builders), a vacuum-like row marked for the fused
/// constant-coefficient loop; and the medium map of the extent's cells. Built a row at a
/// time: no array of every node's coefficients is held (it would be as large as the fields).
#include <algorithm>

#include "io/scene/medium_lookup.h"
#include "io/scene/units.h"
#include "materials/dielectric.h"
#include "solver/simulation.h"

namespace ty {

using constants::c0;
using constants::eta0;

/// The coefficients of E node (c, i, j): the arithmetic mean of the medium over its cell
/// (kSub x kSub samples; perfect conductors zero both). Where a sample lies in a dispersive
/// medium the node takes the ADE step (materials/permittivity/ade.h) with each medium's
/// poles weighted by its share of the samples: the mean of eps(omega) over the cell.
template <class R>
void Simulation<R>::node_coefficients(int c, int i, int j, double& a, double& b,
                                      std::vector<DispersiveNode>& out) const {
  const Scene& s = scene_;
  const Component comp = static_cast<Component>(c);
  constexpr int kSub = 4;  // even: a face on a node splits its cell exactly in half
  const Vec2 p{g_.x(comp, i), g_.y(comp, j)};
  const int centre = medium_at(s, p);
  a = b = 1;
  if (centre >= 0 && s.media[centre].perfect_conductor) {
    a = b = 0;
    return;
  }
  int sample[kSub * kSub];
  int count = 0;
  bool dispersive = false;
  double eps = 0, sig = 0;
  for (int u = 0; u < kSub; ++u)
    for (int v = 0; v < kSub; ++v) {
      const Vec2 q{p.x + ((u + 0.5) / kSub - 0.5) * g_.dx, p.y + ((v + 0.5) / kSub - 0.5) * g_.dy};
      const int m = medium_at(s, q);
      if (m >= 0 && s.media[m].perfect_conductor) continue;
      eps += m >= 0 ? s.media[m].permittivity[c] : 1.0;
      sig += m >= 0 ? s.media[m].conductivity : 0.0;
      dispersive = dispersive || (m >= 0 && s.media[m].tensor && s.media[m].tensor->along(c).dispersive());
      sample[count++] = m;
    }
  if (!dispersive) {
    const ECoefficients k = dielectric_update(eps / count, sig / count, g_.dt);
    a = k.ca, b = k.cb;
    return;
  }
  DispersiveNode node{g_.at(i, j), c, {}, 0};
  for (int k = 0; k < count; ++k) {  // each sampled medium once, with its share
    const int m = sample[k];
    if (m < 0 || !s.media[m].tensor || std::find(sample, sample + k, m) != sample + k) continue;
    const double share = double(std::count(sample, sample + count, m)) / count;
    append_poles(s.media[m].tensor->along(c), share, g_.dt, node.poles);
  }
  double sum_c3 = 0;
  for (const AdePole& q : node.poles) sum_c3 += q.c3;
  const AdeNode k = ade_node(eps / count, sig / count, sum_c3, g_.dt);
  a = k.ca, b = k.cb, node.corr = k.corr;
  out.push_back(std::move(node));
}

template <class R>
void Simulation<R>::join_dispersive_nodes(std::vector<std::vector<DispersiveNode>>& found) {
  DispersiveCells& d = disp_;
  d = {};
  d.half_dt = 0.5 * g_.dt;
  d.row_first.assign(1, 0);
  d.pole_first.assign(1, 0);
  for (auto& row : found) {
    std::sort(row.begin(), row.end(),
              [](const auto& x, const auto& y) { return x.comp != y.comp ? x.comp < y.comp : x.index < y.index; });
    for (const DispersiveNode& n : row) {
      d.index.push_back(n.index);
      d.comp.push_back(n.comp);
      d.corr.push_back(n.corr);
      d.poles.insert(d.poles.end(), n.poles.begin(), n.poles.end());
      d.pole_first.push_back(static_cast<int>(d.poles.size()));
    }
    d.row_first.push_back(static_cast<int>(d.index.size()));
  }
  d.p.resize(d.poles.size());  // zero (MappedAllocator)
  d.j.resize(d.poles.size());
  d.e_old.resize(d.index.size());
  bytes_ += d.index.size() * (sizeof(long) + 2 * sizeof(int) + 2 * sizeof(double)) +
            d.poles.size() * (sizeof(AdePole) + 2 * sizeof(double));
}

/// The in-plane nodes the tensor list steps (tensor_cells.h): those sampling a medium with
/// eps_xy != 0, their four neighbours of the other component (the off-diagonal coupling
/// reaches them), and those neighbours' neighbours (so that a rotated node's diagonal is
/// made of full sites only); none where no medium is rotated.
template <class R>
void Simulation<R>::mark_tensor_nodes(std::vector<char> (&in)[2]) const {
  const Scene& s = scene_;
  const int nx = g_.nx, ny = g_.ny;
  const bool any = std::any_of(s.media.begin(), s.media.end(), [](const Medium& m) { return m.rotated_in_plane(); });
  if (!any || s.bodies.empty()) return;
  std::vector<char> rot[2];
  for (int c = 0; c < 2; ++c) {
    rot[c].assign(static_cast<size_t>(nx) * ny, 0);
#pragma omp parallel for schedule(static) num_threads(threads_)
    for (int j = 0; j < ny; ++j)
      for (int i = 0; i < nx; ++i) rot[c][static_cast<size_t>(j) * nx + i] = samples_rotated(s, g_, c, i, j);
  }
  const bool wx = s.grid.bx == Boundary::periodic, wy = s.grid.by == Boundary::periodic;
  for (int layer = 0; layer < 2; ++layer) {
    auto on = [&](int c, int i, int j) {
      if (wx) i = (i + nx) % nx;
      if (wy) j = (j + ny) % ny;
      return i >= 0 && j >= 0 && i < nx && j < ny && rot[c][size_t(j) * nx + i];
    };
    for (int c = 0; c < 2; ++c) {
      in[c].assign(static_cast<size_t>(nx) * ny, 0);
      const int si = c == 0 ? 1 : -1, sj = -si;  // the neighbours' offsets (tensor_cells.cpp)
      for (int j = 0; j < ny; ++j)
        for (int i = 0; i < nx; ++i)
          in[c][size_t(j) * nx + i] = on(c, i, j) || on(1 - c, i, j) || on(1 - c, i + si, j) ||
                                      on(1 - c, i, j + sj) || on(1 - c, i + si, j + sj);
    }
    if (layer == 0) rot[0] = in[0], rot[1] = in[1];
  }
}

namespace {

/// One row's runs of one component: each stretch of equal (ca, cb) one Run{i0, i1, ca, cb c dt/dx, cb c dt/dy},
/// and its cb.
template <class Run>
void append_runs(const std::vector<double>& ca, const std::vector<double>& cb, double dt, double dx, double dy,
                 std::vector<Run>& runs, std::vector<double>& run_cb) {
  using R = decltype(Run::ca);
  const int nx = static_cast<int>(ca.size());
  int i0 = 0;
  for (int i = 1; i <= nx; ++i) {
    if (i < nx && ca[i] == ca[i0] && cb[i] == cb[i0]) continue;
    runs.push_back({i0, i, static_cast<R>(ca[i0]), static_cast<R>(cb[i0] * c0 * dt / dx),
                    static_cast<R>(cb[i0] * c0 * dt / dy)});
    run_cb.push_back(cb[i0]);
    i0 = i;
  }
}

}  // namespace

template <class R>
void Simulation<R>::build_media() {
  const Scene& s = scene_;
  const int nx = g_.nx, ny = g_.ny;
  // per row, the dispersive nodes found there (joined in row order below)
  std::vector<std::vector<DispersiveNode>> found(ny);
  std::vector<char> in_tensor[2];  // in-plane nodes stepped by the tensor list
  std::vector<std::vector<TensorNode>> tensor_found(ny);
  mark_tensor_nodes(in_tensor);
  // Row by row: each row's coefficients live only while its runs are made (an array of
  // every node's ca and cb would be six doubles a node, as much as the fields in double).
  std::vector<std::vector<Run>> runs_of_row(ny);
  std::vector<std::vector<double>> cb_of_row(ny);
#pragma omp parallel num_threads(threads_)
  {
    std::vector<double> ca[3], cb[3];
#pragma omp for schedule(static)
    for (int j = 0; j < ny; ++j) {
      for (int c = 0; c < 3; ++c) {
        ca[c].assign(nx, 1.0);
        cb[c].assign(nx, 1.0);
        if (s.bodies.empty()) continue;
        for (int i = 0; i < nx; ++i) {
          const size_t at = static_cast<size_t>(j) * nx + i;
          TensorNode t;
          if (c < 2 && !in_tensor[c].empty() && in_tensor[c][at] && tensor_node(s, g_, c, i, j, t))
            tensor_found[j].push_back(std::move(t));  // swept as vacuum: ca = cb = 1
          else
            node_coefficients(c, i, j, ca[c][i], cb[c][i], found[j]);
        }
      }
      walls_.hold_e_row(j, ca, cb, nx);                          // electric walls
      std::erase_if(tensor_found[j], [&](const TensorNode& t) {  // those an electric wall holds stay out
        return ca[t.comp][t.i] != 1.0 || cb[t.comp][t.i] != 1.0;
      });
      for (int c = 0; c < 3; ++c) append_runs(ca[c], cb[c], g_.dt, g_.dx, g_.dy, runs_of_row[j], cb_of_row[j]);
    }
  }
  join_dispersive_nodes(found);
  std::vector<TensorNode> tensor_nodes;
  for (auto& row : tensor_found)
    for (auto& t : row) tensor_nodes.push_back(std::move(t));
  tensor_ = join_tensor_nodes(tensor_nodes, g_, s.grid.bx == Boundary::periodic, s.grid.by == Boundary::periodic);
  bytes_ += tensor_.index.size() * (sizeof(long) + 10 * sizeof(int) + 10 * sizeof(double)) +
            tensor_.kind.size() * (sizeof(int) + 3 * sizeof(double) + 2 * (sizeof(AdeNode) + sizeof(int))) +
            tensor_.poles.size() * (sizeof(AdePole) + 2 * sizeof(double));

  // the rows' runs joined in row order; a row's three components' runs one after another
  row_runs_.assign(static_cast<size_t>(3) * ny + 1, 0);
  simple_row_.assign(ny, 0);
  for (int j = 0; j < ny; ++j) {
    const int first = static_cast<int>(runs_.size());
    for (size_t k = 0, c = 0; k < runs_of_row[j].size(); ++k) {
      if (runs_of_row[j][k].i0 == 0) row_runs_[3 * j + c++] = static_cast<int>(runs_.size());  // a component's first
      runs_.push_back(runs_of_row[j][k]);
      run_cb_.push_back(cb_of_row[j][k]);
    }
    std::vector<Run>().swap(runs_of_row[j]);
    std::vector<double>().swap(cb_of_row[j]);
    const Run* r = &runs_[first];
    const bool one = runs_.size() - first == 3;
    simple_row_[j] = one && r[0].ca == R(1) && r[1].ca == R(1) && r[2].ca == R(1) && r[0].kx == r[1].kx &&
                     r[1].kx == r[2].kx && r[0].ky == r[1].ky && r[1].ky == r[2].ky;
  }
  row_runs_[3 * ny] = static_cast<int>(runs_.size());
  bytes_ += runs_.size() * (sizeof(Run) + sizeof(double));

  // medium index map of the extent's cells (at the cell centres), for fields.h5: over ranks
  // rank 0 alone writes it, and the others hold none
  map_nx_ = nx - 2 * g_.npml_x;
  map_ny_ = ny - 2 * g_.npml_y;
  if (parallel::rank() != 0) return;
  medium_map_.assign(static_cast<size_t>(map_nx_) * map_ny_, -1);
  if (!s.bodies.empty())
    for (int j = 0; j < map_ny_; ++j)
      for (int i = 0; i < map_nx_; ++i)
        medium_map_[static_cast<size_t>(j) * map_nx_ + i] = medium_at(s, {(i + 0.5) * g_.dx, (j + 0.5) * g_.dy});
}

/// cb of E node (c, i, j) as its run holds it: the same double build_media computed for the
/// node (a run's nodes have equal ca and cb), found by bisection in the row's runs.
template <class R>
double Simulation<R>::node_cb(int c, int i, int j) const {
  const Run* first = runs_.data() + row_runs_[3 * j + c];
  const Run* last = runs_.data() + row_runs_[3 * j + c + 1];
  const Run* r = std::upper_bound(first, last, i, [](int v, const Run& run) { return v < run.i0; }) - 1;
  return run_cb_[static_cast<size_t>(r - runs_.data())];
}

#define TY_INSTANTIATE(R)                                                                                              \
  template double Simulation<R>::node_cb(int, int, int) const;                                                         \
  template void Simulation<R>::build_media();                                                                          \
  template void Simulation<R>::node_coefficients(int, int, int, double&, double&, std::vector<DispersiveNode>&) const; \
  template void Simulation<R>::join_dispersive_nodes(std::vector<std::vector<DispersiveNode>>&);                       \
  template void Simulation<R>::mark_tensor_nodes(std::vector<char>(&)[2]) const;
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

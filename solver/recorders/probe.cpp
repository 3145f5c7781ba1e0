/// \file probe.cpp
/// \brief A probe's stencils and its time-aligned series.
#include "solver/recorders/probe.h"

#include <algorithm>
#include <cmath>

#include "io/scene/units.h"
#include "solver/grid/poynting.h"

namespace ty {

double to_e_time(const double* x, long k, long n) {
  if (k + 1 < n) return 0.5 * (x[k] + x[k + 1]);
  if (n >= 2) return x[k] + 0.5 * (x[k] - x[k - 1]);
  return x[k];
}

ProbeRecorder make_probe(const Output& o, const YeeGrid& g, long total_steps, const CellAt& cell_at) {
  ProbeRecorder p;
  p.name = o.name;
  p.at = o.at;
  p.fields = o.fields;
  for (int c = 0; c < 6; ++c) p.stencil[c] = point_stencil(g, static_cast<Component>(c), o.at);
  if (o.over_line) {  // points at most a cell apart, trapezoid weights
    const double len = std::hypot(o.to.x - o.from.x, o.to.y - o.from.y);
    const int segments = std::max(1, static_cast<int>(std::ceil(len / std::min(g.dx, g.dy))));
    for (int q = 0; q <= segments; ++q) {
      const double s = static_cast<double>(q) / segments;
      const Vec2 at{o.from.x + s * (o.to.x - o.from.x), o.from.y + s * (o.to.y - o.from.y)};
      std::array<PointStencil, 6> st;
      for (int c = 0; c < 6; ++c) st[c] = point_stencil(g, static_cast<Component>(c), at);
      p.line.push_back(st);
      p.line_weight.push_back((q == 0 || q == segments ? 0.5 : 1.0) / segments);
    }
  }
  p.raw.assign(static_cast<size_t>(total_steps) * 6, 0.0);
  for (const auto& f : o.fields)
    if (is_magnetic_field(f)) {
      p.magnetic.push_back(f);
      p.magnetic_series.emplace_back(static_cast<size_t>(total_steps), 0.0);
    }
  if (!p.magnetic.empty() && cell_at) {  // magnetizations live at the Hz nodes
    const PointStencil st = point_stencil(g, Component::Hz, o.at);
    for (int q = 0; q < 4; ++q) {
      const long idx = st.index[q];
      const int j = static_cast<int>(idx / g.stride) - 1, i = static_cast<int>(idx % g.stride - g.lead);
      p.cells[q] = cell_at(i, j);
      p.cell_weight[q] = st.weight[q];
    }
  }
  p.taken.assign(static_cast<size_t>(p.slots()), 0.0);
  return p;
}

std::vector<double> ProbeRecorder::series(const std::string& field) const {
  const long n = count;
  std::vector<double> out(static_cast<size_t>(n));
  for (size_t f = 0; f < magnetic.size(); ++f)
    if (magnetic[f] == field) {  // sampled at (k+1/2) dt
      for (long k = 0; k < n; ++k) out[k] = to_e_time(magnetic_series[f].data(), k, n);
      return out;
    }
  std::vector<double> comp[6];
  for (int c = 0; c < 6; ++c) {
    comp[c].resize(static_cast<size_t>(n));
    for (long k = 0; k < n; ++k) comp[c][k] = raw[static_cast<size_t>(k) * 6 + c];
  }
  auto aligned = [&](int c, long k) {  // component c at the E time of record k, SI
    return c < 3 ? comp[c][k] : to_e_time(comp[c].data(), k, n) / constants::eta0;
  };
  static const char* names[6] = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz"};
  for (int c = 0; c < 6; ++c)
    if (field == names[c]) {
      for (long k = 0; k < n; ++k) out[k] = aligned(c, k);
      return out;
    }
  for (long k = 0; k < n; ++k) {
    const double E[3] = {aligned(0, k), aligned(1, k), aligned(2, k)};
    const double H[3] = {aligned(3, k), aligned(4, k), aligned(5, k)};
    const auto S = poynting(E, H);
    out[k] = field == "Sx" ? S[0] : field == "Sy" ? S[1] : std::hypot(S[0], S[1]);
  }
  return out;
}

}  // namespace ty

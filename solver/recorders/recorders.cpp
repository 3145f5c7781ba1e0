/// \file recorders.cpp
/// \brief Probe stencils and series, snapshot layouts.
#include "solver/recorders/recorders.h"

#include <algorithm>
#include <cmath>

#include "io/scene/units.h"

namespace ty {

int dft_every(const Scene& s, double f_max, double dt, long window_steps) {
  for (const Source& src : s.sources) f_max = std::max({f_max, src.frequency, source_band(src).hi});
  if (f_max <= 0) return 1;
  const long by_band = static_cast<long>(std::floor(1.0 / (8.0 * f_max * dt)));
  return static_cast<int>(std::max(1L, std::min(by_band, window_steps / 400)));
}


PointStencil point_stencil(const YeeGrid& g, Component c, Vec2 p) {
  const double fi = g.fi(c, p.x), fj = g.fj(c, p.y);
  int i = static_cast<int>(std::floor(fi)), j = static_cast<int>(std::floor(fj));
  i = std::clamp(i, 0, g.nx - 2);
  j = std::clamp(j, 0, g.ny - 2);
  const double tx = std::clamp(fi - i, 0.0, 1.0), ty = std::clamp(fj - j, 0.0, 1.0);
  PointStencil s;
  s.index = {g.at(i, j), g.at(i + 1, j), g.at(i, j + 1), g.at(i + 1, j + 1)};
  s.weight = {(1 - tx) * (1 - ty), tx * (1 - ty), (1 - tx) * ty, tx * ty};
  return s;
}

bool is_magnetic_field(const std::string& f) { return f[0] == 'M' || f[0] == 'L' || f[0] == 'd'; }

const char* field_units(const std::string& f) {
  if (f[0] == 'M') return "T";
  if (f[0] == 'L' || f[0] == 'd') return "1";
  if (f[0] == 'E') return "V/m";
  if (f[0] == 'H') return "A/m";
  if (f[0] == 'S') return "W/m^2";
  return "";
}

std::vector<double> ProbeRecorder::series(const std::string& field) const {
  const long n = count;
  for (size_t f = 0; f < magnetic.size(); ++f)
    if (magnetic[f] == field) return std::vector<double>(magnetic_series[f].begin(), magnetic_series[f].begin() + n);
  auto raw_of = [&](int c, long k) { return raw[static_cast<size_t>(k) * 6 + c]; };
  auto aligned = [&](int c, long k) {  // component c at the E time of record k, SI
    if (c < 3) return raw_of(c, k);
    double h;
    if (k + 1 < n) h = 0.5 * (raw_of(c, k) + raw_of(c, k + 1));
    else if (n >= 2) h = raw_of(c, k) + 0.5 * (raw_of(c, k) - raw_of(c, k - 1));
    else h = raw_of(c, k);
    return h / constants::eta0;
  };
  std::vector<double> out(static_cast<size_t>(n));
  static const char* names[6] = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz"};
  for (int c = 0; c < 6; ++c)
    if (field == names[c]) {
      for (long k = 0; k < n; ++k) out[k] = aligned(c, k);
      return out;
    }
  for (long k = 0; k < n; ++k) {
    const double ex = aligned(0, k), ey = aligned(1, k), ez = aligned(2, k);
    const double hx = aligned(3, k), hy = aligned(4, k), hz = aligned(5, k);
    const double sx = ey * hz - ez * hy, sy = ez * hx - ex * hz;
    out[k] = field == "Sx" ? sx : field == "Sy" ? sy : std::hypot(sx, sy);
  }
  return out;
}

SnapshotPlan plan_snapshots(const Scene& s, const Output& o, const YeeGrid& g, long total_steps) {
  SnapshotPlan plan;
  // region in internal coordinates: the extent unless given
  Vec2 lo{0, 0}, hi{s.grid.extent.x, s.grid.extent.y};
  if (o.region.given) {
    lo = {o.region.centre.x - 0.5 * o.region.size.x, o.region.centre.y - 0.5 * o.region.size.y};
    hi = {o.region.centre.x + 0.5 * o.region.size.x, o.region.centre.y + 0.5 * o.region.size.y};
  }
  const double eps = 1e-9;
  for (const auto& name : o.fields) {
    SnapshotField f;
    f.name = name;
    Component c = Component::Ez;
    static const char* names[6] = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz"};
    for (int k = 0; k < 6; ++k)
      if (name == names[k]) c = static_cast<Component>(k);
    if (is_magnetic_field(name)) c = Component::Hz;  // magnetizations live at the cell centres
    f.node = c;
    f.units = field_units(name);
    // H and M frames lag the E time by half a step; S is formed at the E time
    const bool half_step = is_magnetic_field(name) || (!is_electric(c) && name[0] != 'S');
    f.time_offset = half_step ? -0.5 * g.dt : 0.0;
    f.stride = o.stride;
    const int ia = std::max(0, static_cast<int>(std::ceil(g.fi(c, lo.x) - eps)));
    const int ib = std::min(g.nx - 1, static_cast<int>(std::floor(g.fi(c, hi.x) + eps)));
    const int ja = std::max(0, static_cast<int>(std::ceil(g.fj(c, lo.y) - eps)));
    const int jb = std::min(g.ny - 1, static_cast<int>(std::floor(g.fj(c, hi.y) + eps)));
    f.i0 = ia;
    f.j0 = ja;
    f.ni = std::max(0, (ib - ia) / o.stride + 1);
    f.nj = std::max(0, (jb - ja) / o.stride + 1);
    for (int a = 0; a < f.ni; ++a) f.x.push_back(g.x(c, ia + a * o.stride) - s.origin_shift.x);
    for (int b = 0; b < f.nj; ++b) f.y.push_back(g.y(c, ja + b * o.stride) - s.origin_shift.y);
    plan.fields.push_back(f);
  }
  const long frames = static_cast<long>(std::floor(s.time.stop / o.every + 1e-9));
  for (long k = 1; k <= frames; ++k) {
    // the first step whose E time (n+1) dt reaches k*every (to within half a step)
    long n = static_cast<long>(std::ceil(k * o.every / g.dt - 0.5)) - 1;
    n = std::clamp(n, 0L, total_steps - 1);
    if (!plan.steps.empty() && n <= plan.steps.back()) continue;
    plan.steps.push_back(n);
    plan.times.push_back((n + 1) * g.dt);
  }
  return plan;
}

}  // namespace ty

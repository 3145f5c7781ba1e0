/// \file snapshots.cpp
/// \brief Snapshot layouts: the nodes of each field inside the region, and the frame steps.
#include "solver/recorders/snapshots.h"

#include <algorithm>
#include <cmath>

#include <stdexcept>

namespace ty {

void SnapshotSink::frame_rows(std::size_t, std::size_t, int, int, const float*) {
  throw std::logic_error("this snapshot sink takes whole frames only (not over MPI ranks)");
}
void SnapshotSink::frame_rows(std::size_t, std::size_t, int, int, const double*) {
  throw std::logic_error("this snapshot sink takes whole frames only (not over MPI ranks)");
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
    // H, M and S frames lag the E time by half a step (snapshots.h)
    const bool half_step = is_magnetic_field(name) || !is_electric(c) || name[0] == 'S';
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

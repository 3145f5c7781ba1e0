/// \file spectral_map.cpp
/// \brief Region, windows and storage of a spectral map.
#include "solver/recorders/spectral_map.h"

#include <algorithm>
#include <cmath>

#include "solver/recorders/recorders.h"

namespace ty {

SpectralMap make_spectral_map(const Scene& s, const Output& o, const YeeGrid& g, long total_steps, WindowRule rule,
                              int every, long block) {
  SpectralMap m;
  m.name = o.name;
  m.fields = o.fields;
  m.stride = o.stride;
  Vec2 lo{0, 0}, hi{s.grid.extent.x, s.grid.extent.y};
  if (o.region.given) {
    lo = {o.region.centre.x - 0.5 * o.region.size.x, o.region.centre.y - 0.5 * o.region.size.y};
    hi = {o.region.centre.x + 0.5 * o.region.size.x, o.region.centre.y + 0.5 * o.region.size.y};
  }
  const double eps = 1e-9;
  // Ez nodes with room for the neighbours the averages read (i-1, j-1)
  const int ia = std::max(1, static_cast<int>(std::ceil(g.fi(Component::Ez, lo.x) - eps)));
  const int ib = std::min(g.nx - 1, static_cast<int>(std::floor(g.fi(Component::Ez, hi.x) + eps)));
  const int ja = std::max(1, static_cast<int>(std::ceil(g.fj(Component::Ez, lo.y) - eps)));
  const int jb = std::min(g.ny - 1, static_cast<int>(std::floor(g.fj(Component::Ez, hi.y) + eps)));
  m.i0 = ia, m.j0 = ja;
  m.ni = std::max(0, (ib - ia) / o.stride + 1);
  m.nj = std::max(0, (jb - ja) / o.stride + 1);
  for (int a = 0; a < m.ni; ++a) m.x.push_back(g.x(Component::Ez, ia + a * o.stride) - s.origin_shift.x);
  for (int b = 0; b < m.nj; ++b) m.y.push_back(g.y(Component::Ez, ja + b * o.stride) - s.origin_shift.y);
  m.freq = o.frequencies;
  double f_max = 0;
  for (double f : m.freq) f_max = std::max(f_max, f);
  if (every <= 0) every = dft_every(s, f_max, g.dt, static_cast<long>(0.5 * total_steps * g.dt / g.dt));
  m.win = make_windows(m.freq, rule, total_steps, g.dt, every, block);
  m.start = m.win.block > 0 ? 0 : m.win.first(total_steps);
  m.dt = g.dt;
  m.acc.resize(m.freq.size() * static_cast<std::size_t>(m.ni) * m.nj * 6);  // zero (MappedAllocator)
  m.value.resize(static_cast<std::size_t>(m.ni) * m.nj * 6);
  m.b0 = 0, m.b1 = m.nj;
  return m;
}

}  // namespace ty

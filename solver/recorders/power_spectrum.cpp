/// \file power_spectrum.cpp
/// \brief Points and weights of a power-spectrum line.
#include "solver/recorders/power_spectrum.h"

#include <cmath>

namespace ty {

PowerSpectrumRecorder make_power_spectrum(const Scene& s, const Output& o, const YeeGrid& g, long total_steps,
                                          WindowRule rule, int every, long block) {
  PowerSpectrumRecorder r;
  r.name = o.name;
  const double dx = o.to.x - o.from.x, dy = o.to.y - o.from.y, len = std::hypot(dx, dy);
  r.normal = {-dy / len, dx / len};  // z x (to - from)
  const int n = std::max(1, static_cast<int>(std::ceil(len / std::min(g.dx, g.dy))));
  for (int k = 0; k < n; ++k) {  // midpoints of n equal pieces
    const double s = (k + 0.5) / n;
    r.points.push_back({o.from.x + s * dx, o.from.y + s * dy});
    r.weight.push_back(len / n);
    std::array<PointStencil, 6> st;
    for (int c = 0; c < 6; ++c) st[c] = point_stencil(g, static_cast<Component>(c), r.points.back());
    r.stencil.push_back(st);
  }
  for (int k = 0; k < o.count; ++k) r.freq.push_back(o.band_frequency(k));
  if (every <= 0) every = dft_every(s, std::max(o.band_from, o.band_to), g.dt, total_steps);
  r.win = make_windows(r.freq, rule, total_steps, g.dt, every, block);
  r.dt = g.dt;
  r.acc.assign(r.freq.size() * r.points.size() * 6, 0.0);
  r.value.assign(r.points.size() * 6, 0.0);
  return r;
}

WindowRule power_spectrum_rule(const Scene& s) {
  for (const Source& src : s.sources)
    if (!std::isfinite(source_end(src))) return WindowRule::last_half;
  return WindowRule::whole_run;
}

}  // namespace ty

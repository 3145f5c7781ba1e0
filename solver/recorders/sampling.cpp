/// \file sampling.cpp
/// \brief Point stencils, DFT sampling intervals, field names and units.
#include "solver/recorders/sampling.h"

#include <algorithm>
#include <cmath>

namespace ty {

int dft_every(const Scene& s, double f_max, double dt, long window_steps) {
  for (const Source& src : s.sources) f_max = std::max({f_max, src.frequency, source_band(src).hi});
  if (f_max <= 0) return 1;
  const long by_band = static_cast<long>(std::floor(1.0 / (8.0 * f_max * dt)));
  return static_cast<int>(std::max(1L, std::min(by_band, window_steps / 400)));
}

long DftWindows::first(long total) const {
  long k = total;
  for (long L : length) k = std::min(k, L == 0 ? 0 : total - L);
  return k;
}

DftWindows make_windows(const std::vector<double>& freq, WindowRule rule, long total, double dt, int every,
                        long block) {
  DftWindows w;
  w.every = every;
  w.block = rule == WindowRule::blocks ? block : 0;
  w.planned = total;
  const double span = rule == WindowRule::blocks ? block * dt : 0.5 * total * dt;  // the time a window must fit in
  for (double f : freq) {
    if (rule == WindowRule::whole_run) {
      w.length.push_back(0);
      continue;
    }
    // the last whole number of periods that fits, rounded to whole sampling intervals
    const double periods = std::floor(span * f);
    const double win = periods >= 1 ? periods / f : (rule == WindowRule::blocks ? block : total) * dt;
    const long cap = (rule == WindowRule::blocks ? block : total) / every * every;
    w.length.push_back(std::clamp(every * std::lround(win / (every * dt)), static_cast<long>(every), std::max(cap, static_cast<long>(every))));
  }
  return w;
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

}  // namespace ty

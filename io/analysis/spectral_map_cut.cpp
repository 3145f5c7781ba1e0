/// \file spectral_map_cut.cpp
/// \brief Checked reads of a spectral map for the measurements (see spectral_map_cut.h).
#include "io/analysis/spectral_map_cut.h"

#include <fmt/format.h>

#include <cmath>

#include "io/scene/diagnostics.h"

namespace ty {

IntensityMap read_intensity(const SpectralMapFile& map, double f) {
  const size_t k = map.frequency_index(f);
  return {map.x(), map.y(), map.intensity(k), map.frequencies()[k]};
}

LineCut read_line_cut(const SpectralMapFile& map, bool line_is_y, double at, size_t k) {
  const auto& axis = line_is_y ? map.y() : map.x();
  const char name = line_is_y ? 'y' : 'x';
  size_t idx = 0;
  for (size_t q = 0; q < axis.size(); ++q)
    if (std::abs(axis[q] - at) < std::abs(axis[idx] - at)) idx = q;
  const double spacing = axis.size() > 1 ? std::abs(axis[1] - axis[0]) : 0.0;
  if (axis.empty() || std::abs(axis[idx] - at) > 0.5 * spacing * (1 + 1e-9))
    throw BadInput(
        fmt::format("{}: error: the line {}={:.6g} mm lies outside the map '{}', which spans {} = {:.6g} to "
                    "{:.6g} mm",
                    map.file(), name, at * 1e3, map.name(), name, axis.empty() ? NAN : axis.front() * 1e3,
                    axis.empty() ? NAN : axis.back() * 1e3));
  const size_t nx = map.x().size();
  LineCut c;
  c.at = axis[idx];
  c.s = line_is_y ? map.x() : map.y();
  const char* names[3] = {"Ex", "Ey", "Ez"};
  for (int comp = 0; comp < 3; ++comp) {
    if (!map.has(names[comp])) continue;
    const auto E = map.field(names[comp], k);
    for (size_t q = 0; q < c.s.size(); ++q) c.E[comp].push_back(E[line_is_y ? idx * nx + q : q * nx + idx]);
  }
  return c;
}

void check_region_inside(const SpectralMapFile& map, const FlowRegion& r) {
  const auto& x = map.x();
  const auto& y = map.y();
  if (x.empty() || y.empty())
    throw BadInput(fmt::format("{}: error: the map '{}' has no nodes", map.file(), map.name()));
  const double hx = x.size() > 1 ? 0.5 * std::abs(x[1] - x[0]) : 0.0,
               hy = y.size() > 1 ? 0.5 * std::abs(y[1] - y[0]) : 0.0;
  const double tol = 1e-9 * (hx + hy);
  const bool inside = r.sx > 0 && r.sy > 0 && r.cx - 0.5 * r.sx >= x.front() - hx - tol &&
                      r.cx + 0.5 * r.sx <= x.back() + hx + tol && r.cy - 0.5 * r.sy >= y.front() - hy - tol &&
                      r.cy + 0.5 * r.sy <= y.back() + hy + tol;
  if (!inside)
    throw BadInput(fmt::format(
        "{}: error: the region x = {:.6g} to {:.6g} mm, y = {:.6g} to {:.6g} mm is not inside the "
        "map '{}' (x = {:.6g} to {:.6g} mm, y = {:.6g} to {:.6g} mm)",
        map.file(), (r.cx - 0.5 * r.sx) * 1e3, (r.cx + 0.5 * r.sx) * 1e3, (r.cy - 0.5 * r.sy) * 1e3,
        (r.cy + 0.5 * r.sy) * 1e3, map.name(), x.front() * 1e3, x.back() * 1e3, y.front() * 1e3, y.back() * 1e3));
}

void check_same_nodes(const SpectralMapFile& a, const SpectralMapFile& b) {
  if (a.x() != b.x() || a.y() != b.y())
    throw BadInput(
        fmt::format("{}: error: the map '{}' has other nodes than in {} (not the same scene's reference run?)",
                    b.file(), b.name(), a.file()));
}

}  // namespace ty

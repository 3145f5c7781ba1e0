/// \file measure_focus.cpp
/// \brief `terayee measure focus RUN --map NAME`: the focal spot in a spectral map: the
/// intensity maximum (|E|^2 of the map's E components), its position refined by a
/// parabola through the neighbouring samples, the full widths at half maximum across and
/// along the axis (linear interpolation of the half-maximum crossings), the peak relative
/// to the incident beam's (with --reference, the reference run's peak in the same map),
/// and the distance from a face (--face, a coordinate along the axis). Table, CSV, JSON,
/// and focus-profiles.csv: the intensity through the peak across and along the axis.
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>
#include <iostream>

#include "io/scene/diagnostics.h"
#include "io/run/spectral_map_file.h"
#include "tools/commands.h"

namespace ty {
namespace {

struct Map {
  std::vector<double> x, y, I;  // intensity [y][x] at one frequency
  double f = 0;
  double at(size_t i, size_t j) const { return I[j * x.size() + i]; }
};

Map read_intensity(const std::string& run, const std::string& name, double freq) {
  const SpectralMapFile map(run, name);
  const size_t k = map.frequency_index(freq);
  return {map.x(), map.y(), map.intensity(k), map.frequencies()[k]};
}

// vertex of the parabola through (-1, a), (0, b), (1, c), in units of the spacing
double vertex(double a, double b, double c) {
  const double d = a - 2 * b + c;
  return d < 0 ? 0.5 * (a - c) / d : 0.0;
}

// full width at half of `half2` (twice the half maximum) along a line of samples through k
double fwhm(const std::vector<double>& s, const std::vector<double>& v, size_t k, double half) {
  size_t a = k, b = k;
  while (a > 0 && v[a - 1] > half) --a;
  while (b + 1 < v.size() && v[b + 1] > half) ++b;
  if (a == 0 || b + 1 == v.size()) return std::nan("");  // the spot reaches the map's edge
  const double left = s[a - 1] + (half - v[a - 1]) / (v[a] - v[a - 1]) * (s[a] - s[a - 1]);
  const double right = s[b] + (half - v[b]) / (v[b + 1] - v[b]) * (s[b + 1] - s[b]);
  return right - left;
}

}  // namespace

int measure_focus(const std::string& run, const std::string& map, const std::string& reference, double freq,
                  const std::string& axis, double face, bool has_face) {
  const Map m = read_intensity(run, map, freq);
  const size_t nx = m.x.size(), ny = m.y.size();
  size_t bi = 0, bj = 0;
  for (size_t j = 0; j < ny; ++j)
    for (size_t i = 0; i < nx; ++i)
      if (m.at(i, j) > m.at(bi, bj)) bi = i, bj = j;
  double px = m.x[bi], py = m.y[bj];
  if (bi > 0 && bi + 1 < nx) px += vertex(m.at(bi - 1, bj), m.at(bi, bj), m.at(bi + 1, bj)) * (m.x[1] - m.x[0]);
  if (bj > 0 && bj + 1 < ny) py += vertex(m.at(bi, bj - 1), m.at(bi, bj), m.at(bi, bj + 1)) * (m.y[1] - m.y[0]);
  std::vector<double> row(nx), col(ny);
  for (size_t i = 0; i < nx; ++i) row[i] = m.at(i, bj);
  for (size_t j = 0; j < ny; ++j) col[j] = m.at(bi, j);
  const double peak = m.at(bi, bj);
  const double wx = fwhm(m.x, row, bi, 0.5 * peak), wy = fwhm(m.y, col, bj, 0.5 * peak);
  const bool along_x = axis == "x";
  nlohmann::json j;
  j["map"] = map;
  j["frequency"] = m.f;
  j["peak-position"] = {px, py};
  j["peak-intensity"] = peak;
  j["fwhm-along-axis"] = along_x ? wx : wy;
  j["fwhm-across-axis"] = along_x ? wy : wx;
  std::cout << fmt::format("focus in map '{}' at {:.6g} GHz (axis {}):\n", map, m.f / 1e9, axis);
  std::cout << fmt::format("  peak at ({:.6g}, {:.6g}) mm, |E|^2 = {:.6g} (V/m)^2\n", px * 1e3, py * 1e3, peak);
  std::cout << fmt::format("  FWHM across the axis {:.6g} um, along it {:.6g} um\n", (along_x ? wy : wx) * 1e6,
                           (along_x ? wx : wy) * 1e6);
  if (!reference.empty()) {
    const Map r = read_intensity(reference, map, m.f);
    double rp = 0;
    for (double v : r.I) rp = std::max(rp, v);
    j["peak-over-incident"] = peak / rp;
    std::cout << fmt::format("  peak / incident peak (reference run) = {:.6g}\n", peak / rp);
  }
  if (has_face) {
    const double d = (along_x ? px : py) - face;
    j["distance-from-face"] = d;
    std::cout << fmt::format("  distance from the face at {:.6g} mm: {:.6g} um\n", face * 1e3, d * 1e6);
  }
  std::ofstream(run + "/focus.json") << j.dump(2) << "\n";
  // the intensity through the peak, across and along the axis (for `terayee render --plot focus`)
  std::ofstream prof(run + "/focus-profiles.csv");
  prof << "direction,s_m,intensity\n";
  for (int across = 1; across >= 0; --across) {
    const bool use_row = (across == 1) == along_x ? false : true;  // a row runs along x
    const auto& s = use_row ? m.x : m.y;
    const auto& v = use_row ? row : col;
    for (size_t q = 0; q < s.size(); ++q)
      prof << fmt::format("{},{:.10g},{:.10g}\n", across ? "across" : "along", s[q], v[q]);
  }
  std::ofstream csv(run + "/focus.csv");
  csv << "frequency_Hz,x_m,y_m,peak,fwhm_across_m,fwhm_along_m\n"
      << fmt::format("{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g}\n", m.f, px, py, peak, along_x ? wy : wx,
                     along_x ? wx : wy);
  return 0;
}

}  // namespace ty

/// \file render_bloch_map.cpp
/// \brief `terayee render DIR --plot bloch-map [--y reflectance|transmittance]`: a sweep over
/// the Bloch sides' wavenumber (`--vary grid.bloch.wavenumber=...` with `--measure "spectrum
/// --reference auto"`) drawn as two maps: the column over frequency and k_x as swept, and the
/// same resampled to frequency and the angle in vacuum, theta = asin(c k_x / 2 pi f)
/// (linear interpolation in k_x at each frequency between the two nearest swept values; blank
/// where theta needs a k_x outside the sweep). Points of the first map below the light line
/// (2 pi f < c |k_x|, no propagating wave in vacuum) are blank. Each picture has its data
/// beside it (FILE.csv: x, y, z in SI, the angle in rad).
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <map>
#include <nlohmann/json.hpp>
#include <sstream>

#include "io/pictures/plot.h"
#include "io/scene/constants.h"
#include "io/scene/diagnostics.h"
#include "tools/commands.h"

namespace fs = std::filesystem;

namespace ty {
namespace {

constexpr const char* kKey = "grid.bloch.wavenumber";

/// Column `name` of a point's spectrum.csv against its frequency_Hz column.
bool read_spectrum(const fs::path& file, const std::string& name, std::vector<double>& f, std::vector<double>& v) {
  std::ifstream in(file);
  std::string line;
  if (!in || !std::getline(in, line)) return false;
  std::vector<std::string> head;
  for (std::stringstream ss(line); std::getline(ss, line, ',');) head.push_back(line);
  const auto col = std::find(head.begin(), head.end(), name) - head.begin();
  if (head.empty() || head[0] != "frequency_Hz" || col == static_cast<long>(head.size())) return false;
  while (std::getline(in, line)) {
    std::vector<double> row;
    for (std::stringstream ss(line); std::getline(ss, line, ',');) row.push_back(std::strtod(line.c_str(), nullptr));
    if (static_cast<long>(row.size()) <= col) return false;
    f.push_back(row[0]), v.push_back(row[col]);
  }
  return !f.empty();
}

/// Linear interpolation of z(k) over ascending k at q; NaN outside [k.front(), k.back()].
double interpolate(const std::vector<double>& k, const std::vector<double>& z, double q) {
  if (k.empty() || q < k.front() || q > k.back()) return NAN;
  const size_t b = std::upper_bound(k.begin(), k.end(), q) - k.begin();
  if (b == k.size()) return z.back();
  if (b == 0) return z.front();
  const double t = (q - k[b - 1]) / (k[b] - k[b - 1]);
  return (1 - t) * z[b - 1] + t * z[b];
}

}  // namespace

int plot_bloch_map(const RenderOptions& o, const std::string& dir) {
  const std::string column = o.y_column.empty() ? "reflectance" : o.y_column;
  const std::string file = o.run + "/results.json";
  std::ifstream in(file);
  const auto j = in ? nlohmann::json::parse(in, nullptr, false) : nlohmann::json();
  if (j.is_discarded() || !j.contains("points") || !j.contains("swept"))
    throw BadInput(fmt::format("{}: error: no sweep results table (run `terayee sweep` first)", file));
  const auto swept = j["swept"].get<std::vector<std::string>>();
  if (swept.size() != 1 || swept[0] != kKey)
    throw BadInput(fmt::format("{}: error: --plot bloch-map needs a sweep over {} alone", file, kKey));
  // k_x -> the column over frequency
  std::map<double, std::vector<double>> by_k;
  std::vector<double> freq;
  for (const auto& p : j["points"]) {
    const std::string name = p.value("point", ""), text = p["swept"].value(kKey, "");
    char* end = nullptr;
    const double k = std::strtod(text.c_str(), &end);
    std::vector<double> f, v;
    if (end == text.c_str() || !read_spectrum(fs::path(o.run) / "points" / name / "spectrum.csv", column, f, v))
      throw BadInput(
          fmt::format("{}: error: point '{}' has no {} in points/{}/spectrum.csv (measure each point with "
                      "--measure \"spectrum --reference auto\")",
                      file, name, column, name));
    if (freq.empty()) freq = f;
    if (f != freq) throw BadInput(fmt::format("{}: error: point '{}' has another band than the others", file, name));
    by_k[k] = v;
  }
  std::vector<double> ks;
  for (const auto& [k, v] : by_k) ks.push_back(k);
  const double c0 = constants::c0, two_pi = 2 * constants::pi;
  MapPlot mk;
  mk.x = ks, mk.y = freq;
  for (size_t fi = 0; fi < freq.size(); ++fi)
    for (double k : ks) mk.z.push_back(two_pi * freq[fi] > c0 * std::abs(k) ? by_k[k][fi] : NAN);
  mk.title = fmt::format("{} over k_x and frequency", column);
  mk.xlabel = "k_x (rad/mm)", mk.ylabel = "frequency (THz)", mk.zlabel = column;
  mk.x_scale = 1e-3, mk.y_scale = 1e-12;
  fs::create_directories(dir);
  const std::string pk = (fs::path(dir) / (column + "-k." + o.format)).string();
  write_map_plot(mk, pk);
  std::cout << fmt::format("plot -> {} (data: {})\n", pk, plot_data_path(pk));
  // resampled to the angle in vacuum: 1 degree steps across what the sweep reaches
  MapPlot ma;
  for (int d = -89; d <= 89; ++d) ma.x.push_back(d * constants::pi / 180);
  ma.y = freq;
  for (size_t fi = 0; fi < freq.size(); ++fi) {
    std::vector<double> z;
    for (double k : ks) z.push_back(by_k[k][fi]);
    for (double th : ma.x) ma.z.push_back(interpolate(ks, z, two_pi * freq[fi] * std::sin(th) / c0));
  }
  // keep the angles the sweep reaches at some frequency
  const size_t na = ma.x.size(), nf = freq.size();
  size_t lo = na, hi = 0;
  for (size_t a = 0; a < na; ++a)
    for (size_t fi = 0; fi < nf; ++fi)
      if (std::isfinite(ma.z[fi * na + a])) lo = std::min(lo, a), hi = std::max(hi, a);
  if (lo > hi)
    throw BadInput(fmt::format("{}: error: the swept wavenumbers reach no angle at these frequencies", file));
  std::vector<double> x(ma.x.begin() + lo, ma.x.begin() + hi + 1), z;
  for (size_t fi = 0; fi < nf; ++fi)
    for (size_t a = lo; a <= hi; ++a) z.push_back(ma.z[fi * na + a]);
  ma.x = x, ma.z = z;
  ma.title = fmt::format("{} over the angle in vacuum and frequency", column);
  ma.xlabel = "angle from the normal (deg)", ma.ylabel = "frequency (THz)", ma.zlabel = column;
  ma.x_scale = 180 / constants::pi, ma.y_scale = 1e-12;
  const std::string pa = (fs::path(dir) / (column + "-angle." + o.format)).string();
  write_map_plot(ma, pa);
  std::cout << fmt::format("plot -> {} (data: {})\n", pa, plot_data_path(pa));
  return 0;
}

}  // namespace ty

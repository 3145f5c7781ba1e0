/// \file render_sweep.cpp
/// \brief `terayee render DIR --plot sweep --x KEY --y COLUMN [--with-map] [--predicted CSV]`:
/// a column of a sweep's results table (DIR/results.json, written by `terayee sweep`) against
/// one swept value. With more swept keys, one line for each combination of the others'
/// values (legend); `--with-map` over a grid of two keys also draws the column in colour over
/// both keys. `--predicted` adds a dashed line from a CSV: the swept value, then the
/// predicted number in the column's units. The data beside each picture (FILE.csv) are the
/// table's own numbers in SI; the picture scales them to a readable unit.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <map>
#include <nlohmann/json.hpp>
#include <set>
#include <sstream>

#include "io/pictures/plot.h"
#include "io/scene/diagnostics.h"
#include "io/scene/units.h"
#include "tools/commands.h"

namespace fs = std::filesystem;

namespace ty {
namespace {

/// A swept value as a number: its SI value, and the number and unit as written ("-2 T").
struct SweptNumber {
  double si = NAN, written = NAN;
  std::string unit;
  Kind kind = Kind::dimensionless;
};

bool swept_number(const std::string& text, SweptNumber& v) {
  const char* s = text.c_str();
  char* end = nullptr;
  v.written = std::strtod(s, &end);
  if (end == s) return false;
  v.unit = std::string(end);
  v.unit.erase(0, v.unit.find_first_not_of(' '));
  for (Kind k : {Kind::dimensionless, Kind::length, Kind::time, Kind::frequency, Kind::magnetic_field, Kind::angle,
                 Kind::electric_field, Kind::current, Kind::voltage, Kind::temperature, Kind::conductivity}) {
    std::string why;
    const auto q = parse_quantity(text, k, why);
    if (q && q->relative == Quantity::Relative::none) {
      v.si = q->value, v.kind = k;
      return std::isfinite(v.si);
    }
  }
  return false;
}

std::string join(const std::vector<std::string>& v) {
  std::string s;
  for (const auto& x : v) s += fmt::format("{}{}", s.empty() ? "" : ", ", x);
  return s.empty() ? "(none)" : s;
}

std::string file_safe(const std::string& s) {
  std::string out;
  for (char c : s) out += std::isalnum(static_cast<unsigned char>(c)) || c == '.' || c == '-' ? c : '_';
  return out;
}

/// A readable scale for values in `unit` whose largest magnitude is `top`: the SI prefix
/// that puts it in [1, 1000), for the units that take one.
std::pair<double, std::string> readable(double top, const std::string& unit) {
  if (unit != "m" && unit != "Hz" && unit != "s" && unit != "T") return {1.0, unit};
  static const std::pair<double, const char*> prefixes[] = {{1e-15, "f"}, {1e-12, "p"}, {1e-9, "n"}, {1e-6, "µ"},
                                                            {1e-3, "m"},  {1, ""},      {1e3, "k"},  {1e6, "M"},
                                                            {1e9, "G"},   {1e12, "T"}};
  if (!(top > 0)) return {1.0, unit};
  auto best = prefixes[5];
  for (auto p : prefixes)
    if (top >= p.first) best = p;
  return {1 / best.first, best.second + unit};
}

std::string labelled(const std::string& name, const std::string& unit) {
  return unit.empty() ? name : fmt::format("{} ({})", name, unit);
}

/// The swept values of one key at every point, as numbers, and how to draw them.
struct Axis {
  std::vector<SweptNumber> at;  // per point
  double scale = 1;
  std::string label;
};

Axis numeric_axis(const nlohmann::json& points, const std::string& key, const std::string& option) {
  Axis a;
  std::set<std::string> units;
  for (const auto& p : points) {
    const std::string text = p["swept"].value(key, "");
    SweptNumber v;
    if (!swept_number(text, v))
      throw BadInput(
          fmt::format("terayee render: error: {} {}: the value '{}' is not a number with a unit", option, key, text));
    units.insert(v.unit);
    a.at.push_back(v);
  }
  a.label = key;
  if (a.at.empty()) return a;
  if (units.size() == 1) {  // drawn in the unit the sweep was written in
    for (const auto& v : a.at)
      if (v.si != 0) a.scale = v.written / v.si;
    a.label = labelled(key, a.at[0].unit);
  } else {
    const std::string si = format_si(1, a.at[0].kind);
    a.label = labelled(key, si.substr(si.find(' ') == std::string::npos ? si.size() : si.find(' ') + 1));
  }
  return a;
}

/// A CSV of (swept value, predicted number in SI), header first.
PlotSeries read_predicted(const std::string& file) {
  std::ifstream in(file);
  if (!in) throw BadInput(fmt::format("terayee render: error: --predicted: cannot read '{}'", file));
  PlotSeries s{"predicted", {}, {}, PlotSeries::Style::dashed, 6};
  std::string line;
  std::getline(in, line);
  for (int n = 2; std::getline(in, line); ++n) {
    const auto comma = line.find(',');
    SweptNumber v;
    char* end = nullptr;
    const double y = comma == std::string::npos ? NAN : std::strtod(line.c_str() + comma + 1, &end);
    if (line.empty()) continue;
    if (comma == std::string::npos || !swept_number(line.substr(0, comma), v) || end == line.c_str() + comma + 1)
      throw BadInput(
          fmt::format("{}:{}: error: expected VALUE,NUMBER (the swept value, the prediction in SI)", file, n));
    s.x.push_back(v.si), s.y.push_back(y);
  }
  return s;
}

std::string output(const std::string& dir, const std::string& stem, const RenderOptions& o) {
  fs::create_directories(dir);
  return (fs::path(dir) / (file_safe(stem) + "." + o.format)).string();
}

void draw_map(const RenderOptions& o, const std::string& dir, const nlohmann::json& points, const Axis& ax,
              const std::string& other, double y_scale, const std::string& y_unit) {
  const Axis ay = numeric_axis(points, other, "--with-map: the other swept key");
  MapPlot m;
  std::map<double, size_t> xi, yi;
  for (const auto& v : ax.at) xi[v.si] = 0;
  for (const auto& v : ay.at) yi[v.si] = 0;
  for (auto& [v, k] : xi) k = m.x.size(), m.x.push_back(v);
  for (auto& [v, k] : yi) k = m.y.size(), m.y.push_back(v);
  m.z.assign(m.x.size() * m.y.size(), NAN);
  for (size_t q = 0; q < points.size(); ++q) {
    const auto& c = points[q]["measured"];
    if (c.contains(o.y_column) && c[o.y_column].is_number())
      m.z[yi[ay.at[q].si] * m.x.size() + xi[ax.at[q].si]] = c[o.y_column].get<double>();
  }
  m.x_scale = ax.scale, m.y_scale = ay.scale, m.z_scale = y_scale;
  m.xlabel = ax.label, m.ylabel = ay.label, m.zlabel = labelled(o.y_column, y_unit);
  m.title = fmt::format("{} over {} and {}", o.y_column, o.x_key, other);
  const std::string path = output(dir, "sweep-" + o.y_column + "-map", o);
  write_map_plot(m, path);
  std::cout << fmt::format("plot -> {} (data: {})\n", path, plot_data_path(path));
}

/// The sweep's table, checked against --x, --y and --with-map: every wrong name at once.
struct Table {
  nlohmann::json j;
  std::vector<std::string> others;  ///< the swept keys other than --x
  bool zip = false;
};

Table read_checked_table(const RenderOptions& o) {
  const std::string file = o.run + "/results.json";
  std::ifstream in(file);
  if (!in)
    throw BadInput(fmt::format("{}: error: no results table (run `terayee sweep` or `terayee sweep --collect`)", file));
  Table t;
  t.j = nlohmann::json::parse(in, nullptr, false);
  const auto& j = t.j;
  if (j.is_discarded() || !j.contains("swept") || !j.contains("units") || !j.contains("points"))
    throw BadInput(fmt::format("{}: error: not a sweep's results table", file));
  const auto swept = j["swept"].get<std::vector<std::string>>();
  std::vector<std::string> columns;  // those with a number at some point
  for (auto it = j["units"].begin(); it != j["units"].end(); ++it)
    for (const auto& p : j["points"])
      if (p.contains("measured") && p["measured"].contains(it.key()) && p["measured"][it.key()].is_number()) {
        columns.push_back(it.key());
        break;
      }
  std::vector<std::string> errors;
  if (std::find(swept.begin(), swept.end(), o.x_key) == swept.end())
    errors.push_back(fmt::format("--x '{}' is not a swept key; the sweep varies: {}", o.x_key, join(swept)));
  if (std::find(columns.begin(), columns.end(), o.y_column) == columns.end())
    errors.push_back(
        fmt::format("--y '{}' is not a column of numbers in the results; those are: {}", o.y_column, join(columns)));
  for (const auto& k : swept)
    if (k != o.x_key) t.others.push_back(k);
  if (std::ifstream sj(o.run + "/sweep.json"); sj)
    t.zip = nlohmann::json::parse(sj, nullptr, false).value("zip", false);
  if (o.with_map && (t.others.size() != 1 || t.zip))
    errors.push_back(fmt::format("--with-map needs a grid of two swept keys; the sweep varies {}{}", join(swept),
                                 t.zip ? " in step (--zip)" : ""));
  if (!errors.empty()) {
    std::string msg;
    for (const auto& e : errors) msg += fmt::format("{}{}: error: {}", msg.empty() ? "" : "\n", file, e);
    throw BadInput(msg);
  }
  return t;
}

/// One line per combination of the other keys' values (keys in step: one line), each in
/// the order of its x values; points without a number are left out.
std::vector<PlotSeries> lines_of(const RenderOptions& o, const Table& t, const Axis& ax) {
  const auto& points = t.j["points"];
  std::vector<PlotSeries> lines;
  std::map<std::string, size_t> line_of;
  for (size_t q = 0; q < points.size(); ++q) {
    const auto& c = points[q]["measured"];
    if (!c.contains(o.y_column) || !c[o.y_column].is_number()) continue;  // failed or not measured
    std::string name;
    if (!t.zip)
      for (const auto& k : t.others)
        name += fmt::format("{}{} = {}", name.empty() ? "" : ", ", k, points[q]["swept"].value(k, ""));
    auto [it, fresh] = line_of.emplace(name, lines.size());
    if (fresh) lines.push_back({name, {}, {}, PlotSeries::Style::line_points, static_cast<int>(lines.size())});
    lines[it->second].x.push_back(ax.at[q].si), lines[it->second].y.push_back(c[o.y_column].get<double>());
  }
  for (auto& s : lines) {
    std::vector<size_t> order(s.x.size());
    for (size_t k = 0; k < order.size(); ++k) order[k] = k;
    std::sort(order.begin(), order.end(), [&](size_t a, size_t b) { return s.x[a] < s.x[b]; });
    PlotSeries sorted = s;
    for (size_t k = 0; k < order.size(); ++k) sorted.x[k] = s.x[order[k]], sorted.y[k] = s.y[order[k]];
    s = sorted;
  }
  if (lines.size() == 1 && lines[0].label.empty()) lines[0].label = "measured";
  return lines;
}

/// The frame: the end points inside it, not on it, and room above the curves for the legend.
void frame(PlotPanel& p) {
  double x0 = INFINITY, x1 = -INFINITY, y0 = INFINITY, y1 = -INFINITY;
  for (const auto& s : p.series)
    for (size_t k = 0; k < s.x.size(); ++k)
      if (std::isfinite(s.y[k])) {
        x0 = std::min(x0, s.x[k] * p.x_scale), x1 = std::max(x1, s.x[k] * p.x_scale);
        y0 = std::min(y0, s.y[k] * p.y_scale), y1 = std::max(y1, s.y[k] * p.y_scale);
      }
  if (x1 > x0) p.xmin = x0 - 0.04 * (x1 - x0), p.xmax = x1 + 0.04 * (x1 - x0);
  if (y1 > y0) p.ymin = y0 - 0.06 * (y1 - y0), p.ymax = y1 + (0.1 + 0.08 * p.series.size()) * (y1 - y0);
}

}  // namespace

int plot_sweep(const RenderOptions& o, const std::string& dir) {
  const Table t = read_checked_table(o);
  const auto& points = t.j["points"];
  const Axis ax = numeric_axis(points, o.x_key, "--x");
  PlotPanel p;
  p.series = lines_of(o, t, ax);
  if (!o.predicted.empty()) p.series.push_back(read_predicted(o.predicted));
  double top = 0;
  for (const auto& s : p.series)
    for (double y : s.y) top = std::max(top, std::abs(y));
  const auto [y_scale, y_unit] = readable(top, t.j["units"].value(o.y_column, ""));
  p.x_scale = ax.scale, p.y_scale = y_scale;
  frame(p);
  p.xlabel = ax.label, p.ylabel = labelled(o.y_column, y_unit);
  Plot plot;
  plot.title = fmt::format("{} against {}", o.y_column, o.x_key);
  plot.panels = {p};
  const std::string path = output(dir, "sweep-" + o.y_column + "-vs-" + o.x_key, o);
  write_plot(plot, path);
  std::cout << fmt::format("plot -> {} (data: {})\n", path, plot_data_path(path));
  if (o.with_map) draw_map(o, dir, points, ax, t.others[0], y_scale, y_unit);
  return 0;
}

}  // namespace ty

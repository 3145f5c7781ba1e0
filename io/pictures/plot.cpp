/// \file plot.cpp
/// \brief PLplot (its C API, devices pngcairo, pdfcairo, svgcairo) drawing plot.h's panels:
/// white page, dark axes, series in the colour-blind-safe palette of Okabe & Ito ("Color
/// Universal Design", 2008), a legend inside the upper right corner, shaded x bands behind
/// the curves; maps as filled cells in terayee's sequential colour map (colour_map.h) with
/// a colour bar. PLplot keeps one global stream; plots are drawn one at a time.
#include "io/pictures/plot.h"

#include "io/pictures/colour_map.h"
#include "io/run/atomic_file.h"

#include <fmt/format.h>
#include <plplot.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <stdexcept>

namespace ty {
namespace {

constexpr int kInk = 1, kFirstSeries = 2, kSeriesColours = 7, kShade = 9;
constexpr const char* kMarker = "#(228)";  // a Hershey glyph, drawn and in the legend alike

void palette() {
  plscol0(0, 255, 255, 255);  // background
  plscol0(kInk, 30, 30, 30);
  const int okabe_ito[kSeriesColours][3] = {{0, 114, 178},   {213, 94, 0},  {0, 158, 115}, {204, 121, 167},
                                            {230, 159, 0}, {86, 180, 233}, {0, 0, 0}};
  for (int k = 0; k < kSeriesColours; ++k) plscol0(kFirstSeries + k, okabe_ito[k][0], okabe_ito[k][1], okabe_ito[k][2]);
  plscol0(kShade, 222, 226, 240);
}

std::string escape(const std::string& s) {  // '#' starts PLplot's text escapes
  std::string out;
  for (char c : s) out += c == '#' ? std::string("##") : std::string(1, c);
  return out;
}

int colour_of(const PlotSeries& s, size_t k) {
  return kFirstSeries + static_cast<int>((s.colour >= 0 ? static_cast<size_t>(s.colour) : k) % kSeriesColours);
}

void range(const PlotPanel& p, double& x0, double& x1, double& y0, double& y1) {
  x0 = y0 = INFINITY, x1 = y1 = -INFINITY;
  const double lo = std::isfinite(p.xmin) ? p.xmin : -INFINITY, hi = std::isfinite(p.xmax) ? p.xmax : INFINITY;
  for (const auto& s : p.series)  // the y range of what lies inside the x range
    for (size_t q = 0; q < s.x.size() && q < s.y.size(); ++q)
      if (std::isfinite(s.x[q]) && std::isfinite(s.y[q]) && s.x[q] >= lo && s.x[q] <= hi) {
        x0 = std::min(x0, s.x[q]), x1 = std::max(x1, s.x[q]);
        y0 = std::min(y0, s.y[q]), y1 = std::max(y1, s.y[q]);
      }
  if (!std::isfinite(x0)) x0 = 0, x1 = 1, y0 = 0, y1 = 1;
  if (std::isfinite(p.xmin)) x0 = p.xmin;
  if (std::isfinite(p.xmax)) x1 = p.xmax;
  const double pad = 0.06 * (y1 - y0);
  y0 = std::isfinite(p.ymin) ? p.ymin : y0 - pad;
  y1 = std::isfinite(p.ymax) ? p.ymax : y1 + pad;
  if (!(x1 > x0)) x0 -= 0.5, x1 += 0.5;
  if (!(y1 > y0)) y0 -= 0.5, y1 += 0.5;
}

/// The panel as drawn: its series' values times the panel's scales.
PlotPanel drawn(const PlotPanel& p) {
  PlotPanel d = p;
  for (auto& s : d.series) {
    for (double& x : s.x) x *= p.x_scale;
    for (double& y : s.y) y *= p.y_scale;
  }
  return d;
}

void draw_panel(const PlotPanel& p, const std::string& title) {
  pladv(0);
  plvsta();
  double x0, x1, y0, y1;
  range(p, x0, x1, y0, y1);
  plwind(x0, x1, y0, y1);
  for (auto [a, b] : p.shaded) {  // bands first, behind everything
    PLFLT xs[4] = {std::max(a, x0), std::min(b, x1), std::min(b, x1), std::max(a, x0)};
    PLFLT ys[4] = {y0, y0, y1, y1};
    if (xs[1] <= xs[0]) continue;
    plcol0(kShade);
    plfill(4, xs, ys);
  }
  plcol0(kInk);
  plwidth(1);
  plbox("bcnst", 0, 0, "bcnstv", 0, 0);
  const std::string heading = title.empty() ? p.title : p.title.empty() ? title : title + ": " + p.title;
  pllab(escape(p.xlabel).c_str(), escape(p.ylabel).c_str(), escape(heading).c_str());
  for (double m : p.marks) {
    PLFLT xs[2] = {m, m}, ys[2] = {y0, y1};
    pllsty(3);
    plline(2, xs, ys);
    pllsty(1);
  }
  std::vector<PLINT> opts, colours, styles, symbols_n;
  std::vector<PLFLT> widths, scales;
  std::vector<std::string> texts;
  std::vector<const char*> text_ptrs, symbols;
  if (!p.shaded.empty() && !p.shaded_label.empty()) {
    opts.push_back(PL_LEGEND_COLOR_BOX), colours.push_back(kShade), styles.push_back(1), widths.push_back(1);
    texts.push_back(escape(p.shaded_label));
  }
  for (size_t k = 0; k < p.series.size(); ++k) {
    const PlotSeries& s = p.series[k];
    const int c = colour_of(s, k);
    plcol0(c);
    plwidth(2);
    pllsty(s.style == PlotSeries::Style::dashed ? 2 : 1);
    const size_t n = std::min(s.x.size(), s.y.size());
    const bool marked = s.style == PlotSeries::Style::points || s.style == PlotSeries::Style::line_points;
    if (marked) {
      std::vector<PLFLT> xs, ys;
      for (size_t q = 0; q < n; ++q)
        if (std::isfinite(s.y[q])) xs.push_back(s.x[q]), ys.push_back(s.y[q]);
      if (!xs.empty()) plstring(static_cast<PLINT>(xs.size()), xs.data(), ys.data(), kMarker);  // as in the legend
    }
    if (s.style != PlotSeries::Style::points) {
      for (size_t a = 0; a < n;) {  // a line broken where the data are missing
        while (a < n && !std::isfinite(s.y[a])) ++a;
        size_t b = a;
        while (b < n && std::isfinite(s.y[b])) ++b;
        if (b - a >= 2) plline(static_cast<PLINT>(b - a), s.x.data() + a, s.y.data() + a);
        a = b;
      }
    }
    pllsty(1);
    if (!s.label.empty()) {
      opts.push_back(s.style == PlotSeries::Style::points        ? PL_LEGEND_SYMBOL
                     : s.style == PlotSeries::Style::line_points ? PL_LEGEND_LINE | PL_LEGEND_SYMBOL
                                                                 : PL_LEGEND_LINE);
      colours.push_back(c), styles.push_back(s.style == PlotSeries::Style::dashed ? 2 : 1), widths.push_back(2);
      texts.push_back(escape(s.label));
    }
  }
  if (texts.empty()) return;
  for (auto& t : texts) text_ptrs.push_back(t.c_str()), symbols.push_back(kMarker);
  scales.assign(texts.size(), 0.8);
  symbols_n.assign(texts.size(), 1);
  std::vector<PLINT> patterns(texts.size(), 0), text_colours(texts.size(), kInk);
  std::vector<PLFLT> box_scales(texts.size(), 0.8);
  PLFLT w, h;
  plcol0(kInk);
  pllegend(&w, &h, PL_LEGEND_BACKGROUND | PL_LEGEND_BOUNDING_BOX, PL_POSITION_TOP | PL_POSITION_RIGHT | PL_POSITION_INSIDE,
           0.02, 0.02, 0.08, 0, kInk, 1, 0, 0, static_cast<PLINT>(texts.size()), opts.data(), 1.0, 0.8, 1.8, 0.0,
           text_colours.data(), text_ptrs.data(), colours.data(), patterns.data(), box_scales.data(), widths.data(),
           colours.data(), styles.data(), widths.data(), colours.data(), scales.data(), symbols_n.data(),
           symbols.data());
}

std::string csv_field(const std::string& s) {
  if (s.find_first_of(",\"\n") == std::string::npos) return s;
  std::string q = "\"";
  for (char c : s) q += c == '"' ? std::string("\"\"") : std::string(1, c);
  return q + "\"";
}


/// The data beside a plot, into its temporary name (renamed with the picture).
void write_data(const std::string& tmp, const std::string& data, const std::string& text) {
  std::ofstream out(tmp);
  out << text;
  out.close();
  if (!out) {
    discard_temporary(tmp);
    throw std::runtime_error(fmt::format("cannot write '{}'", data));
  }
}

const char* device_of(const std::string& path) {
  const std::string ext = std::filesystem::path(path).extension().string();
  const char* device = ext == ".png" ? "pngcairo" : ext == ".pdf" ? "pdfcairo" : ext == ".svg" ? "svgcairo" : nullptr;
  if (!device) throw std::runtime_error(fmt::format("'{}': plots are .png, .pdf or .svg", path));
  return device;
}

void open_page(const char* device, const std::string& tmp, int width, int height, int panels) {
  plsdev(device);
  plsfnam(tmp.c_str());
  plspage(0, 0, width, height, 0, 0);
  palette();
  plssub(1, panels);
  plinit();
  plschr(0, 1.0);
}

/// Ends the page; renames the picture and its data into place, or discards both.
void close_page(const std::string& tmp, const std::string& path, const std::string& data_tmp, const std::string& data) {
  plend();
  std::error_code ec;
  if (!std::filesystem::exists(tmp) || std::filesystem::file_size(tmp, ec) == 0) {
    discard_temporary(tmp), discard_temporary(data_tmp);
    throw std::runtime_error(fmt::format("PLplot wrote nothing to '{}'", path));
  }
  commit_file(tmp, path);
  commit_file(data_tmp, data);
}

/// Cell edges halfway between ascending values, the outer ones half a step beyond.
std::vector<double> edges(const std::vector<double>& v) {
  std::vector<double> e(v.size() + 1);
  for (size_t k = 1; k < v.size(); ++k) e[k] = 0.5 * (v[k - 1] + v[k]);
  const double h0 = v.size() > 1 ? v[1] - v[0] : 1, h1 = v.size() > 1 ? v.back() - v[v.size() - 2] : 1;
  e.front() = v.front() - 0.5 * h0, e.back() = v.back() + 0.5 * h1;
  return e;
}

void draw_map(const MapPlot& m) {
  const ColourMap& cm = ColourMap::sequential();
  std::vector<PLINT> r(ColourMap::kSize), g(ColourMap::kSize), b(ColourMap::kSize);
  for (int k = 0; k < ColourMap::kSize; ++k) {
    const Rgb c = cm.at((k + 0.5) / ColourMap::kSize);
    r[k] = static_cast<PLINT>(std::lround(255 * c.r)), g[k] = static_cast<PLINT>(std::lround(255 * c.g));
    b[k] = static_cast<PLINT>(std::lround(255 * c.b));
  }
  plscmap1(r.data(), g.data(), b.data(), ColourMap::kSize);
  std::vector<double> xs = m.x, ys = m.y;
  for (double& x : xs) x *= m.x_scale;
  for (double& y : ys) y *= m.y_scale;
  const auto ex = edges(xs), ey = edges(ys);
  double z0 = INFINITY, z1 = -INFINITY;
  for (double z : m.z)
    if (std::isfinite(z)) z0 = std::min(z0, z * m.z_scale), z1 = std::max(z1, z * m.z_scale);
  if (!std::isfinite(z0)) z0 = 0, z1 = 1;
  if (!(z1 > z0)) z0 -= 0.5, z1 += 0.5;
  pladv(0);
  plvpor(0.1, 0.8, 0.12, 0.9);
  plwind(std::min(ex.front(), ex.back()), std::max(ex.front(), ex.back()), std::min(ey.front(), ey.back()),
         std::max(ey.front(), ey.back()));
  for (size_t j = 0; j < ys.size(); ++j)
    for (size_t i = 0; i < xs.size(); ++i) {
      const double z = m.z[j * xs.size() + i] * m.z_scale;
      if (!std::isfinite(z)) continue;
      PLFLT cx[4] = {ex[i], ex[i + 1], ex[i + 1], ex[i]}, cy[4] = {ey[j], ey[j], ey[j + 1], ey[j + 1]};
      plcol1((z - z0) / (z1 - z0));
      plfill(4, cx, cy);
    }
  plcol0(kInk);
  plwidth(1);
  plbox("bcnst", 0, 0, "bcnstv", 0, 0);
  pllab(escape(m.xlabel).c_str(), escape(m.ylabel).c_str(), escape(m.title).c_str());
  const std::string label = escape(m.zlabel);
  const char* labels[1] = {label.c_str()};
  const char* axis[1] = {"bcvtm"};
  PLINT label_opts[1] = {PL_COLORBAR_LABEL_RIGHT}, sub_ticks[1] = {0}, n_values[1] = {2};
  PLFLT ticks[1] = {0}, range[2] = {z0, z1};
  const PLFLT* values[1] = {range};
  PLFLT w, h;
  plcolorbar(&w, &h, PL_COLORBAR_GRADIENT, PL_POSITION_RIGHT | PL_POSITION_OUTSIDE | PL_POSITION_VIEWPORT, 0.04, 0,
             0.04, 0.78, 0, kInk, 1, 0, 0, kInk, 1, 1, label_opts, labels, 1, axis, ticks, sub_ticks, n_values, values);
}

}  // namespace

std::string plot_data_path(const std::string& path) {
  return std::filesystem::path(path).replace_extension(".csv").string();
}

void write_plot(const Plot& plot, const std::string& path) {
  const char* device = device_of(path);
  if (plot.panels.empty()) throw std::runtime_error("a plot needs at least one panel");
  const std::string tmp = temporary_name(path), data = plot_data_path(path), data_tmp = temporary_name(data);
  std::string csv = "panel,series,x,y\n";
  for (size_t p = 0; p < plot.panels.size(); ++p)
    for (const auto& s : plot.panels[p].series)
      for (size_t q = 0; q < s.x.size() && q < s.y.size(); ++q)
        csv += fmt::format("{},{},{:.10g},{:.10g}\n", p, csv_field(s.label), s.x[q], s.y[q]);
  write_data(data_tmp, data, csv);
  open_page(device, tmp, plot.width, plot.height, static_cast<int>(plot.panels.size()));
  for (size_t p = 0; p < plot.panels.size(); ++p) draw_panel(drawn(plot.panels[p]), p == 0 ? plot.title : "");
  close_page(tmp, path, data_tmp, data);
}

void write_map_plot(const MapPlot& m, const std::string& path) {
  const size_t nx = m.x.size(), ny = m.y.size();
  if (nx == 0 || ny == 0 || m.z.size() != nx * ny) throw std::runtime_error("a map needs z at every (x, y)");
  const std::string tmp = temporary_name(path), data = plot_data_path(path), data_tmp = temporary_name(data);
  std::string csv = "x,y,z\n";
  for (size_t j = 0; j < ny; ++j)
    for (size_t i = 0; i < nx; ++i) csv += fmt::format("{:.10g},{:.10g},{:.10g}\n", m.x[i], m.y[j], m.z[j * nx + i]);
  write_data(data_tmp, data, csv);
  open_page(device_of(path), tmp, m.width, m.height, 1);
  draw_map(m);
  close_page(tmp, path, data_tmp, data);
}

}  // namespace ty

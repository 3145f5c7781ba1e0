/// \file plot.cpp
/// \brief PLplot (its C API, devices pngcairo, pdfcairo, svgcairo) drawing plot.h's panels:
/// white page, dark axes, series in the colour-blind-safe palette of Okabe & Ito ("Color
/// Universal Design", 2008), a legend inside the upper right corner, shaded x bands behind
/// the curves. PLplot keeps one global stream; plots are drawn one at a time.
#include "io/pictures/plot.h"

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
    if (s.style == PlotSeries::Style::points) {
      std::vector<PLFLT> xs, ys;
      for (size_t q = 0; q < n; ++q)
        if (std::isfinite(s.y[q])) xs.push_back(s.x[q]), ys.push_back(s.y[q]);
      plssym(0, 0.8);
      if (!xs.empty()) plpoin(static_cast<PLINT>(xs.size()), xs.data(), ys.data(), 4);
    } else {
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
      opts.push_back(s.style == PlotSeries::Style::points ? PL_LEGEND_SYMBOL : PL_LEGEND_LINE);
      colours.push_back(c), styles.push_back(s.style == PlotSeries::Style::dashed ? 2 : 1), widths.push_back(2);
      texts.push_back(escape(s.label));
    }
  }
  if (texts.empty()) return;
  for (auto& t : texts) text_ptrs.push_back(t.c_str()), symbols.push_back("#(228)");
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

}  // namespace

std::string plot_data_path(const std::string& path) {
  return std::filesystem::path(path).replace_extension(".csv").string();
}

void write_plot(const Plot& plot, const std::string& path) {
  namespace fs = std::filesystem;
  const std::string ext = fs::path(path).extension().string();
  const char* device = ext == ".png" ? "pngcairo" : ext == ".pdf" ? "pdfcairo" : ext == ".svg" ? "svgcairo" : nullptr;
  if (!device) throw std::runtime_error(fmt::format("'{}': plots are .png, .pdf or .svg", path));
  if (plot.panels.empty()) throw std::runtime_error("a plot needs at least one panel");
  const std::string tmp = temporary_name(path), data = plot_data_path(path), data_tmp = temporary_name(data);
  {
    std::ofstream csv(data_tmp);
    csv << "panel,series,x,y\n";
    for (size_t p = 0; p < plot.panels.size(); ++p)
      for (const auto& s : plot.panels[p].series)
        for (size_t q = 0; q < s.x.size() && q < s.y.size(); ++q)
          csv << fmt::format("{},{},{:.10g},{:.10g}\n", p, csv_field(s.label), s.x[q], s.y[q]);
    csv.close();
    if (!csv) {
      discard_temporary(data_tmp);
      throw std::runtime_error(fmt::format("cannot write '{}'", data));
    }
  }
  plsdev(device);
  plsfnam(tmp.c_str());
  plspage(0, 0, plot.width, plot.height, 0, 0);
  palette();
  plssub(1, static_cast<PLINT>(plot.panels.size()));
  plinit();
  plschr(0, 1.0);
  for (size_t p = 0; p < plot.panels.size(); ++p) draw_panel(plot.panels[p], p == 0 ? plot.title : "");
  plend();
  std::error_code ec;
  if (!fs::exists(tmp) || fs::file_size(tmp, ec) == 0) {
    discard_temporary(tmp), discard_temporary(data_tmp);
    throw std::runtime_error(fmt::format("PLplot wrote nothing to '{}'", path));
  }
  commit_file(tmp, path);
  commit_file(data_tmp, data);
}

}  // namespace ty

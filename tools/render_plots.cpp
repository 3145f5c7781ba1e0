/// \file render_plots.cpp
/// \brief `terayee render RUN --plot spectrum|probes|shift|focus`: line plots of what the
/// run recorded and of what `terayee measure` wrote into the run folder:
///   spectrum  R, T and A against frequency (spectrum.csv), beside the transfer-matrix R and T
///             of `terayee medium --csv` or `medium --stack --csv` (--predicted), with the bands where the Ez wave's
///             effective permeability of the scene's magnetic media is negative shaded;
///   probes    each probe's recorded fields against time (one panel a field);
///   shift     the incident and reflected beams' intensity along the line (shift-profiles.csv),
///             with the specular reflection (a perfect mirror on the face) and the measured centroids marked;
///   focus     the intensity through the focal spot across and along the axis, FWHM marked.
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <map>
#include <sstream>

#include "io/analysis/measurement_files.h"
#include "io/analysis/negative_permeability.h"
#include "io/analysis/power_spectrum_line.h"
#include "io/pictures/plot.h"
#include "io/run/hdf5_file.h"
#include "io/scene/diagnostics.h"
#include "io/scene/scene_reader.h"
#include "io/scene/units.h"
#include "tools/commands.h"

namespace fs = std::filesystem;

namespace ty {
namespace {

std::vector<double> scaled(const std::vector<double>& v, double f) {
  std::vector<double> out(v);
  for (double& x : out) x *= f;
  return out;
}

std::string picture(const std::string& dir, const std::string& stem, const RenderOptions& o) {
  fs::create_directories(dir);
  return (fs::path(dir) / (stem + "." + o.format)).string();
}

void done(const std::string& path) {
  std::cout << fmt::format("plot -> {} (data: {})\n", path, plot_data_path(path));
}

int plot_spectrum(const RenderOptions& o, const std::string& dir) {
  const std::string file = o.run + "/spectrum.csv";
  const Table t = read_table(file, "`terayee measure spectrum RUN --reference REF`");
  const auto f = scaled(t.col("frequency_Hz", file), 1e-9);
  PlotPanel p;
  p.xlabel = "frequency (GHz)";
  p.ylabel = "fraction of the incident power";
  const std::pair<const char*, const char*> cols[3] = {
      {"reflectance", "R measured"}, {"transmittance", "T measured"}, {"absorptance", "A measured"}};
  for (int c = 0; c < 3; ++c)
    if (t.num.count(cols[c].first)) p.series.push_back({cols[c].second, f, t.num.at(cols[c].first), PlotSeries::Style::line, c});
  if (!o.predicted.empty()) {
    const Table m = read_table(o.predicted, "`terayee medium ... --csv`");
    const auto fm = scaled(m.col("frequency_Hz", o.predicted), 1e-9);
    // `medium --stack --csv` gives the stack's reflectance and transmittance; `medium --medium`
    // the one medium's |r| and T at +angle
    const bool stack = m.num.count("reflectance") > 0;
    std::vector<double> R = m.col(stack ? "reflectance" : "r_plus_abs", o.predicted);
    if (!stack)
      for (double& r : R) r *= r;
    p.series.push_back({"R transfer matrix", fm, R, PlotSeries::Style::dashed, 0});
    p.series.push_back(
        {"T transfer matrix", fm, m.col(stack ? "transmittance" : "T_plus", o.predicted), PlotSeries::Style::dashed, 1});
  }
  const Scene s = read_scene(o.run + "/scene.yaml");
  const int normal = power_spectrum_normal_axis(o.run);  // x unless a line says y
  // the wave the sources launch: Hz when every source is an Hz wave
  bool hz = !s.sources.empty();
  for (const Source& src : s.sources) hz = hz && src.component == Component::Hz;
  if (!f.empty())
    p.shaded = negative_mu_bands(s, f.front() * 1e9, f.back() * 1e9, normal, hz ? Component::Hz : Component::Ez);
  p.shaded_label = hz ? "no real k (Hz wave)" : "no real k (Ez wave: Re μ_V < 0)";
  p.ymin = std::min(0.0, -0.02);
  p.ymax = 1.05;
  Plot plot;
  plot.title = s.title + ": spectrum";
  plot.panels = {p};
  const std::string path = picture(dir, "spectrum", o);
  write_plot(plot, path);
  done(path);
  return 0;
}

int plot_probes(const RenderOptions& o, const std::string& dir) {
  const std::string file = o.run + "/fields.h5";
  const h5::File h = h5::File::open(file);
  if (!h.exists("/probes")) throw BadInput(fmt::format("{}: error: the run recorded no probes", file));
  const Scene s = read_scene(o.run + "/scene.yaml");
  for (const auto& name : h.members("/probes")) {
    const std::string base = "/probes/" + name;
    const auto t = scaled(h.read(base + "/time"), 1e12);
    const auto at = h.read(base + "/at");
    Plot plot;
    plot.title = fmt::format("{}: probe '{}' at ({:.4g}, {:.4g}) mm", s.title, name, at[0] * 1e3, at[1] * 1e3);
    for (const auto& field : h.members(base)) {
      if (field == "time" || field == "at") continue;
      PlotPanel p;
      p.xlabel = "time (ps)";
      p.ylabel = fmt::format("{} ({})", field, h.read_attribute(base + "/" + field, "units"));
      p.series.push_back({field, t, h.read(base + "/" + field), PlotSeries::Style::line, static_cast<int>(plot.panels.size())});
      plot.panels.push_back(p);
    }
    if (plot.panels.empty()) continue;
    plot.height = std::max(600, 260 * static_cast<int>(plot.panels.size()));
    const std::string path = picture(dir, "probe-" + name, o);
    write_plot(plot, path);
    done(path);
  }
  return 0;
}

int plot_shift(const RenderOptions& o, const std::string& dir) {
  const Profiles pr = read_profiles(o.run, "shift", "beam");
  const nlohmann::json& j = pr.summary;
  const auto& beams = pr.tag;
  const auto &sv = pr.s, &iv = pr.intensity;
  std::map<std::string, PlotSeries> series;
  std::map<std::string, double> peak;
  for (size_t q = 0; q < beams.size(); ++q) {
    series[beams[q]].x.push_back(sv[q] * 1e3);
    series[beams[q]].y.push_back(iv[q]);
    peak[beams[q]] = std::max(peak[beams[q]], iv[q]);
  }
  PlotPanel p;
  p.xlabel = "position along the line (mm)";
  p.ylabel = "|E|² / its peak";
  const bool reversed = j.contains("reversed");
  const std::pair<const char*, const char*> names[4] = {{"incident", "incident (reference run)"},
                                                        {"specular", "specular (a perfect mirror on the face)"},
                                                        {"reflected", reversed ? "reflected, bias +" : "reflected"},
                                                        {"reflected-reversed", "reflected, bias reversed"}};
  int colour = 0;
  for (auto [key, label] : names) {
    if (!series.count(key)) continue;
    PlotSeries s = series[key];
    for (double& y : s.y) y /= std::max(peak[key], 1e-300);
    s.label = label;
    s.colour = colour++;
    s.style = std::string(key) == "incident" || std::string(key) == "specular" ? PlotSeries::Style::dashed : PlotSeries::Style::line;
    p.series.push_back(s);
  }
  p.marks.push_back(j["run"]["specular-centroid"].get<double>() * 1e3);
  p.marks.push_back(j["run"]["reflected-centroid"].get<double>() * 1e3);
  if (reversed) p.marks.push_back(j["reversed"]["reflected-centroid"].get<double>() * 1e3);
  std::string title = fmt::format("lateral shift {:.1f} ± {:.1f} µm", j["run"]["shift"].get<double>() * 1e6,
                                  j["run"]["uncertainty"].get<double>() * 1e6);
  if (reversed)
    title = fmt::format("shifts {:.1f} µm (+), {:.1f} µm (reversed); non-reciprocal part {:.1f} µm",
                        j["run"]["shift"].get<double>() * 1e6, j["reversed"]["shift"].get<double>() * 1e6,
                        j["non-reciprocal"].get<double>() * 1e6);
  p.title = title;
  p.ymin = 0;
  p.ymax = 1.1;
  // below: the reflected beams' tops, around the specular centroid, where the shift shows
  PlotPanel zoom = p;
  zoom.title = "near the specular centroid (dotted), and the reflected centroids (dotted)";
  const double w = j["run"]["reflected-width"].get<double>() * 1e3;
  zoom.xmin = p.marks[0] - 0.25 * w, zoom.xmax = p.marks[0] + 0.25 * w;
  zoom.ymin = zoom.ymax = NAN;
  std::erase_if(zoom.series, [](const PlotSeries& s) { return s.label.rfind("incident", 0) == 0; });  // elsewhere
  for (auto& s : zoom.series) {  // only the points inside the window
    PlotSeries in = s;
    in.x.clear(), in.y.clear();
    for (size_t q = 0; q < s.x.size(); ++q)
      if (s.x[q] >= zoom.xmin && s.x[q] <= zoom.xmax) in.x.push_back(s.x[q]), in.y.push_back(s.y[q]);
    s = in;
  }
  Plot plot;
  plot.panels = {p, zoom};
  plot.height = 850;
  const std::string path = picture(dir, "shift", o);
  write_plot(plot, path);
  done(path);
  return 0;
}

int plot_focus(const RenderOptions& o, const std::string& dir) {
  const Profiles pr = read_profiles(o.run, "focus", "direction");
  const nlohmann::json& j = pr.summary;
  const auto& dirs = pr.tag;
  const auto &sv = pr.s, &iv = pr.intensity;
  const double peak = j["peak-intensity"].get<double>();
  // which coordinate each profile runs along: across/along the axis of focus.json
  const auto pos = j["peak-position"];
  Plot plot;
  plot.title = fmt::format("focal spot at ({:.4g}, {:.4g}) mm, {:.6g} GHz", pos[0].get<double>() * 1e3,
                           pos[1].get<double>() * 1e3, j["frequency"].get<double>() / 1e9);
  for (const char* which : {"across", "along"}) {
    PlotPanel p;
    PlotSeries s;
    s.label = fmt::format("|E|² {} the axis", which);
    for (size_t q = 0; q < dirs.size(); ++q)
      if (dirs[q] == which) s.x.push_back(sv[q] * 1e3), s.y.push_back(iv[q] / peak);
    if (s.x.empty()) continue;
    size_t k = 0;
    for (size_t q = 0; q < s.y.size(); ++q)
      if (s.y[q] > s.y[k]) k = q;
    const double w = j[fmt::format("fwhm-{}-axis", which)].is_number() ? j[fmt::format("fwhm-{}-axis", which)].get<double>() : NAN;
    p.xlabel = fmt::format("position {} the axis (mm)", which);
    p.ylabel = "|E|² / peak";
    if (std::isfinite(w)) {
      p.marks = {s.x[k] - 0.5 * w * 1e3, s.x[k] + 0.5 * w * 1e3};
      p.title = fmt::format("FWHM {} the axis {:.1f} µm (dotted)", which, w * 1e6);
    }
    p.series.push_back(s);
    p.series.push_back({"half maximum", {s.x.front(), s.x.back()}, {0.5, 0.5}, PlotSeries::Style::dashed, 6});
    p.ymin = 0;
    p.ymax = 1.1;
    plot.panels.push_back(p);
  }
  plot.height = 800;
  const std::string path = picture(dir, "focus", o);
  write_plot(plot, path);
  done(path);
  return 0;
}

}  // namespace

int render_plot(const RenderOptions& o, const std::string& out_dir) {
  if (o.plot == "spectrum") return plot_spectrum(o, out_dir);
  if (o.plot == "probes") return plot_probes(o, out_dir);
  if (o.plot == "shift") return plot_shift(o, out_dir);
  if (o.plot == "focus") return plot_focus(o, out_dir);
  throw BadInput(fmt::format("terayee render: error: no plot '{}'", o.plot));
}

}  // namespace ty

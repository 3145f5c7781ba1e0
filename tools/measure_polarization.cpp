/// \file measure_polarization.cpp
/// \brief `terayee measure polarization RUN [RUN2] --reference REF [REF2] --probe NAME` (or
/// --line NAME, a power-spectrum line): the 2x2
/// Jones matrix of transmission (or, with --reflected, of reflection) in the (Ez-wave, Hz-wave)
/// basis, one column per run driven by that input polarization against its reference run
/// (io/analysis/spectroscopy/jones_measurement.h), and the Faraday (Kerr) rotation and
/// ellipticity of each measured column (polarization.h). Where the run's scene holds one sample
/// slab across a plane wave's path, the 4x4 transfer matrix's prediction is printed beside it
/// (jones_prediction.h). Writes --json, --csv and --plot (measured and predicted rotation and
/// ellipticity against frequency).
#include <fmt/format.h>

#include <cmath>
#include <filesystem>
#include <iostream>
#include <nlohmann/json.hpp>
#include <optional>
#include <sstream>

#include "io/analysis/spectroscopy/jones_measurement.h"
#include "io/analysis/spectroscopy/jones_prediction.h"
#include "io/analysis/spectroscopy/trace_spectrum.h"
#include "io/pictures/plot.h"
#include "io/run/atomic_file.h"
#include "io/scene/constants.h"
#include "io/scene/diagnostics.h"
#include "io/scene/scene_reader.h"
#include "tools/commands.h"

namespace ty {

namespace {

using cd = std::complex<double>;
constexpr double kDeg = 180 / constants::pi;
const char* const kElement[2][2] = {{"zz", "zu"}, {"uz", "uu"}};  // [out][in]
const char* const kInput[2] = {"Ez-input", "Hz-input"};

/// The prediction's geometry from the run's scene: the sample slab, the probe's distance to
/// its front face. std::nullopt (with the reason printed) where the scene does not allow one.
struct Geometry {
  SlabModel model;
  double probe_to_front = 0;  ///< m
};

/// Where the probe or line `name` crosses the axis, internal coordinates (NaN: not found).
double output_position(const Scene& scene, const std::string& name, int axis) {
  for (const Output& o : scene.outputs)
    if (o.name == name) {
      const Vec2 p = o.kind == Output::Kind::probe ? o.at : o.from;
      return axis == 0 ? p.x : p.y;
    }
  return std::nan("");
}

std::optional<Geometry> geometry_of(const std::string& run, const std::string& name, bool reflected) {
  const std::string file = run + "/scene.yaml";
  std::string why = "the run folder has no scene.yaml";
  if (std::filesystem::exists(file)) {
    const Scene scene = read_scene(file);
    if (const auto sample = scene_sample(scene, why)) {
      if (!reflected && sample->slab.thickness == 0) {
        why = "the sample is a half-space: nothing is transmitted";
      } else {
        Geometry g;
        g.model = sample->model;
        g.probe_to_front = std::abs(sample->slab.front - output_position(scene, name, sample->axis));
        if (!reflected || std::isfinite(g.probe_to_front)) return g;
        why = fmt::format("the scene has no output '{}'", name);
      }
    }
  }
  std::cout << fmt::format("no transfer-matrix prediction: {}\n", why);
  return std::nullopt;
}

nlohmann::json element_json(const std::vector<double>& freq, const std::vector<cd>& v) {
  nlohmann::json re, im, amp, ph;
  for (const cd& z : v)
    re.push_back(z.real()), im.push_back(z.imag()), amp.push_back(std::abs(z)), ph.push_back(std::arg(z));
  return {{"real", re}, {"imag", im}, {"amplitude", amp}, {"phase", ph}, {"phase-unwrapped", unwrapped_phase(freq, v)}};
}

/// Everything one source of J (measured or predicted) gives: J's elements and each column's state.
struct Table {
  std::vector<Jones> J;
  std::vector<PolarizationState> state[2];
};

Table table_of(const std::vector<Jones>& J, const bool columns[2], bool reflected) {
  Table t;
  t.J = J;
  for (int in = 0; in < 2; ++in)
    if (columns[in])
      for (const Jones& j : J) t.state[in].push_back(jones_rotation(j, in, reflected));
  return t;
}

nlohmann::json table_json(const std::vector<double>& freq, const Table& t, const bool columns[2], bool reflected) {
  nlohmann::json j;
  for (int in = 0; in < 2; ++in) {
    if (!columns[in]) continue;
    for (int out = 0; out < 2; ++out) {
      std::vector<cd> v;
      for (const Jones& J : t.J) v.push_back(J[out][in]);
      j["jones"][kElement[out][in]] = element_json(freq, v);
    }
    nlohmann::json th, et, thd, etd;
    for (const auto& s : t.state[in])
      th.push_back(s.theta), et.push_back(s.eta), thd.push_back(s.theta * kDeg), etd.push_back(s.eta * kDeg);
    j[reflected ? "kerr" : "faraday"][kInput[in]] = {
        {"rotation-rad", th}, {"rotation-deg", thd}, {"ellipticity-rad", et}, {"ellipticity-deg", etd}};
  }
  return j;
}

std::string csv_of(const std::vector<double>& freq, const Table& m, const Table* p, const bool columns[2]) {
  std::ostringstream csv;
  csv << "frequency_Hz";
  const std::vector<std::pair<std::string, const Table*>> sets =
      p ? std::vector<std::pair<std::string, const Table*>>{{"", &m}, {"predicted_", p}}
        : std::vector<std::pair<std::string, const Table*>>{{"", &m}};
  for (const auto& [prefix, t] : sets)
    for (int in = 0; in < 2; ++in) {
      if (!columns[in]) continue;
      for (int out = 0; out < 2; ++out)
        csv << fmt::format(",{0}J_{1}_real,{0}J_{1}_imag,{0}J_{1}_amplitude,{0}J_{1}_phase_rad", prefix,
                           kElement[out][in]);
      csv << fmt::format(",{0}{1}_rotation_rad,{0}{1}_ellipticity_rad,{0}{1}_rotation_deg,{0}{1}_ellipticity_deg",
                         prefix, in == 0 ? "ez" : "hz");
    }
  csv << "\n";
  for (size_t k = 0; k < freq.size(); ++k) {
    csv << fmt::format("{:.10g}", freq[k]);
    for (const auto& [prefix, t] : sets)
      for (int in = 0; in < 2; ++in) {
        if (!columns[in]) continue;
        for (int out = 0; out < 2; ++out) {
          const cd z = t->J[k][out][in];
          csv << fmt::format(",{:.10g},{:.10g},{:.10g},{:.10g}", z.real(), z.imag(), std::abs(z), std::arg(z));
        }
        const auto s = t->state[in][k];
        csv << fmt::format(",{:.10g},{:.10g},{:.10g},{:.10g}", s.theta, s.eta, s.theta * kDeg, s.eta * kDeg);
      }
    csv << "\n";
  }
  return csv.str();
}

void print_table(const std::vector<double>& freq, const Table& m, const Table* p, const bool columns[2],
                 bool reflected) {
  const char* what = reflected ? "Kerr" : "Faraday";
  std::string head = fmt::format("{:>14s}", "frequency/GHz");
  for (int in = 0; in < 2; ++in)
    if (columns[in]) {
      const char* w = in == 0 ? "Ez" : "Hz";
      head += fmt::format("  {:>10s} {:>10s}", fmt::format("{}:rot/deg", w), fmt::format("{}:ell/deg", w));
      if (p) head += fmt::format(" {:>10s} {:>10s}", "predicted", "predicted");
    }
  std::cout << fmt::format(
                   "{} rotation and ellipticity of each input (deg; polarization.h: counterclockwise for an "
                   "observer facing the wave is positive)\n",
                   what)
            << head << "\n";
  for (size_t k = 0; k < freq.size(); ++k) {
    std::string row = fmt::format("{:14.4f}", freq[k] / 1e9);
    for (int in = 0; in < 2; ++in)
      if (columns[in]) {
        row += fmt::format("  {:10.4f} {:10.4f}", m.state[in][k].theta * kDeg, m.state[in][k].eta * kDeg);
        if (p) row += fmt::format(" {:10.4f} {:10.4f}", p->state[in][k].theta * kDeg, p->state[in][k].eta * kDeg);
      }
    std::cout << row << "\n";
  }
}

void write_overlay_plot(const std::string& path, const std::vector<double>& freq, const Table& m, const Table* p,
                        const bool columns[2], bool reflected) {
  PlotPanel rot, ell;
  rot.xlabel = ell.xlabel = "frequency (GHz)";
  rot.ylabel = fmt::format("{} rotation (deg)", reflected ? "Kerr" : "Faraday");
  ell.ylabel = "ellipticity (deg)";
  for (int in = 0; in < 2; ++in) {
    if (!columns[in]) continue;
    for (int which = 0; which < (p ? 2 : 1); ++which) {
      const Table& t = which == 0 ? m : *p;
      PlotSeries a, b;
      a.label = b.label =
          fmt::format("{} input, {}", in == 0 ? "Ez" : "Hz", which == 0 ? "measured" : "transfer matrix");
      a.style = b.style = which == 0 ? PlotSeries::Style::points : PlotSeries::Style::line;
      a.colour = b.colour = 2 * in + which;
      for (size_t k = 0; k < freq.size(); ++k) {
        a.x.push_back(freq[k] / 1e9), a.y.push_back(t.state[in][k].theta * kDeg);
        b.x.push_back(freq[k] / 1e9), b.y.push_back(t.state[in][k].eta * kDeg);
      }
      rot.series.push_back(a), ell.series.push_back(b);
    }
  }
  Plot plot;
  plot.title = reflected ? "Kerr rotation and ellipticity" : "Faraday rotation and ellipticity";
  plot.panels = {rot, ell};
  plot.height = 800;
  write_plot(plot, path);
  std::cout << fmt::format("plot -> {} (data: {})\n", path, plot_data_path(path));
}

}  // namespace

int measure_polarization(const PolarizationOptions& o) {
  const std::string cmd = "terayee measure polarization";
  if (o.probe.empty() == o.line.empty()) throw BadInput(fmt::format("{}: error: give one of --probe and --line", cmd));
  if (!o.line.empty() && o.to > o.from)
    throw BadInput(fmt::format("{}: error: --from and --to are for a probe: a line has its own frequencies", cmd));
  if (o.runs.size() != o.references.size())
    throw BadInput(fmt::format("{}: error: {} run(s) but {} --reference: give one reference per run, in the same order",
                               cmd, o.runs.size(), o.references.size()));
  if (!o.plot.empty() && !o.csv.empty() && plot_data_path(o.plot) == o.csv)
    throw BadInput(
        fmt::format("{}: error: --csv {} is where --plot writes its own data: choose another name", cmd, o.csv));
  std::vector<double> freq;
  if (o.to > o.from)
    for (int m = 0; m < o.count; ++m) freq.push_back(o.from + (o.to - o.from) * m / (o.count - 1));
  std::vector<PolarizedSpectra> inputs;
  for (size_t q = 0; q < o.runs.size(); ++q)
    inputs.push_back(o.line.empty() ? probe_spectra(o.runs[q], o.references[q], o.probe, freq, o.count)
                                    : line_spectra(o.runs[q], o.references[q], o.line, freq));
  if (inputs.size() == 2 && inputs[0].input == inputs[1].input)
    throw BadInput(
        fmt::format("{}: error: both runs are driven by the {} wave (from their references): the second "
                    "column of J needs a run driven by the other polarization",
                    cmd, inputs[0].input == 0 ? "Ez" : "Hz"));
  const std::string name = o.line.empty() ? o.probe : o.line;
  const auto geo = geometry_of(o.runs[0], name, o.reflected);
  const JonesSpectrum js = measure_jones(inputs, freq, o.reflected, geo ? geo->probe_to_front : -1.0);
  const Table measured = table_of(js.J, js.columns, o.reflected);
  std::optional<Table> predicted;
  if (geo) {
    std::vector<Jones> J;
    for (double f : freq) {
      const JonesPrediction p = predict_jones(geo->model, f);
      J.push_back(o.reflected ? p.r : with_vacuum_path(p.t, f, geo->model.thickness));
    }
    predicted = table_of(J, js.columns, o.reflected);
  }
  const Table* pred = predicted ? &*predicted : nullptr;
  print_table(freq, measured, pred, js.columns, o.reflected);
  nlohmann::json j = table_json(freq, measured, js.columns, o.reflected);
  j["runs"] = o.runs, j["references"] = o.references;
  j[o.line.empty() ? "probe" : "line"] = name;
  j["geometry"] = o.reflected ? "reflected" : "transmitted";
  j["convention"] =
      "fields ~ exp(-i omega t); Jones basis (E.z, E.u), u = z x k of the incident wave; J[out][in]; rotation "
      "counterclockwise for an observer facing the wave is positive (docs/measurements.md)";
  j["referred-to"] = o.reflected && geo ? "the sample's front face" : o.line.empty() ? "the probe" : "the line";
  j["frequency"] = freq;
  if (pred) j["predicted"] = table_json(freq, *pred, js.columns, o.reflected);
  if (!o.json.empty()) write_text_atomically(o.json, j.dump(2) + "\n");
  if (!o.csv.empty()) write_text_atomically(o.csv, csv_of(freq, measured, pred, js.columns));
  if (!o.plot.empty()) write_overlay_plot(o.plot, freq, measured, pred, js.columns, o.reflected);
  return 0;
}

}  // namespace ty

/// \file medium_stack.cpp
/// \brief `terayee medium SCENE --stack`: the 4x4 transfer matrix's R and T of the layered stack
/// the scene's plane wave meets (io/analysis/spectroscopy/scene_stack.h), at the scene's Bloch
/// k_x, over a band: by default the frequencies of the scene's first power-spectrum line (those
/// `measure spectrum` reports, so the columns line up), else the plane sources' band. Both input
/// waves, the cross-polarized reflection, the complex r, and with --polarization the Jones
/// matrices with the Kerr and Faraday rotation (tools/medium_jones.h).
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <iostream>

#include "io/analysis/spectroscopy/scene_stack.h"
#include "io/run/atomic_file.h"
#include "io/scene/scene_reader.h"
#include "tools/commands.h"
#include "tools/medium_jones.h"

namespace ty {
namespace {

constexpr const char* kWave[2] = {"Ez", "Hz"};

/// The frequencies: --from/--to/--count, else the first power-spectrum line's, else the plane
/// sources' band (its low end raised to 1% of the high one where it reaches 0).
std::vector<double> frequencies(const Scene& scene, const MediumOptions& o, std::string& from_where) {
  double lo = o.from, hi = o.to;
  int n = o.count;
  from_where = "--from, --to";
  if (lo <= 0) {
    const Output* line = nullptr;
    for (const Output& out : scene.outputs)
      if (!line && out.kind == Output::Kind::power_spectrum) line = &out;
    if (line && !o.count_given) {  // the line's own frequencies, so the rows line up with spectrum.csv
      from_where = fmt::format("power spectrum '{}'", line->name);
      std::vector<double> f;
      for (int q = 0; q < line->count; ++q) f.push_back(line->band_frequency(q));
      return f;
    }
    if (line) {
      lo = line->band_from, hi = line->band_to, from_where = fmt::format("power spectrum '{}'", line->name);
    } else {
      lo = INFINITY, hi = 0;
      for (const Source& s : scene.sources) {
        const Band2 b = source_band(s);
        lo = std::min(lo, b.lo), hi = std::max(hi, b.hi);
      }
      if (!(lo > 0)) lo = 0.01 * hi;
      from_where = "the sources' band";
    }
  }
  std::vector<double> f;
  for (int q = 0; q < n; ++q) f.push_back(n == 1 ? lo : lo + (hi - lo) * q / (n - 1));
  return f;
}

std::string where(const Scene& scene, const SceneStack& s, double v) {  // a coordinate in the user's frame
  return fmt::format("{} = {:.6g} um", s.axis == 0 ? "x" : "y",
                     (v - (s.axis == 0 ? scene.origin_shift.x : scene.origin_shift.y)) * 1e6);
}

void print_stack(const Scene& scene, const SceneStack& s, const std::string& band) {
  const char* dir = s.direction > 0 ? "+" : "-";
  std::cout << fmt::format("stack along {}{} from the plane wave launched at {} ({} wave), k_x = {:.8g} rad/m{}; "
                           "frequencies: {}\n",
                           dir, s.axis == 0 ? "x" : "y", where(scene, s, s.launch), kWave[s.polarization], s.kx,
                           scene.grid.bx == Boundary::bloch ? " (Bloch sides)" : "", band);
  std::cout << fmt::format("  incidence: {} (n = {:.6g}), half-space\n", part_name(s, s.incidence), s.n_in);
  for (size_t k = 0; k < s.layers.size(); ++k)
    std::cout << fmt::format("  layer {}: {}, {:.6g} um ({} to {})\n", k + 1, part_name(s, s.layers[k]),
                             (s.layers[k].to - s.layers[k].from) * 1e6, where(scene, s, s.layers[k].from),
                             where(scene, s, s.layers[k].to));
  std::cout << fmt::format("  exit: {}, half-space\n", part_name(s, s.exit));
  for (const std::string& n : s.notes) std::cout << "  note: " << n << "\n";
  std::cout << fmt::format("{:>11s} {:>8s} {:>8s} {:>8s} {:>8s} {:>8s} {:>8s} {:>8s}\n", "f/GHz", "k_x c/w", "R", "T",
                           "R Ez", "T Ez", "R Hz", "T Hz");
  std::cout << fmt::format("  (R, T: the {} wave the sources launch, R of both reflected waves; k_x c/w beyond the "
                           "incidence index: the incident wave is evanescent, no R)\n",
                           kWave[s.polarization]);
}

void print_row(const SceneStack& s, const StackPrediction& p) {
  const auto v = [&](double x) {  // no "-0.00000" where a rounding error of 0 is shown
    return p.propagating ? fmt::format(" {:8.5f}", std::abs(x) < 5e-6 ? 0.0 : x) : fmt::format(" {:>8s}", "-");
  };
  std::cout << fmt::format("{:11.4f} {:8.4f}", p.f / 1e9, s.kx * constants::c0 / (2 * constants::pi * p.f)) +
                   v(p.reflectance(s.polarization)) + v(p.response.T[s.polarization]) + v(p.reflectance(0)) +
                   v(p.response.T[0]) + v(p.reflectance(1)) + v(p.response.T[1]) + "\n";
}

constexpr const char* kCsvHeader =
    "frequency_Hz,kx_rad_per_m,reflectance,transmittance,R_Ez_Ez,R_Ez_Hz,T_Ez,R_Hz_Hz,R_Hz_Ez,T_Hz,r_Ez_Ez_re,"
    "r_Ez_Ez_im,r_Ez_Hz_re,r_Ez_Hz_im,r_Hz_Hz_re,r_Hz_Hz_im,r_Hz_Ez_re,r_Hz_Ez_im";

std::string csv_line(const SceneStack& s, const StackPrediction& p) {
  const StackResponse& r = p.response;
  return fmt::format("{:.10g},{:.10g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g}", p.f, s.kx,
                     p.reflectance(s.polarization), r.T[s.polarization], r.R[0][0], r.R[0][1], r.T[0], r.R[1][1],
                     r.R[1][0], r.T[1]) +
         fmt::format(",{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g},{:.8g}", r.r[0][0].real(), r.r[0][0].imag(),
                     r.r[0][1].real(), r.r[0][1].imag(), r.r[1][1].real(), r.r[1][1].imag(), r.r[1][0].real(),
                     r.r[1][0].imag());
}

nlohmann::json json_row(const SceneStack& s, const StackPrediction& p) {
  const auto num = [&](double v) { return std::isfinite(v) ? nlohmann::json(v) : nlohmann::json(); };
  const StackResponse& r = p.response;
  nlohmann::json row;
  row["frequency"] = p.f;
  row["reflectance"] = num(p.reflectance(s.polarization)), row["transmittance"] = num(r.T[s.polarization]);
  for (int in = 0; in < 2; ++in) {
    nlohmann::json w;
    for (int out = 0; out < 2; ++out) {
      w["R"][kWave[out]] = num(r.R[in][out]);
      w["r"][kWave[out]] = {{"real", r.r[in][out].real()}, {"imag", r.r[in][out].imag()}};
    }
    w["T"] = num(r.T[in]);
    row[std::string(kWave[in]) + "-input"] = w;
  }
  return row;
}

nlohmann::json json_stack(const SceneStack& s) {
  const auto part = [&](const StackPart& p) {
    nlohmann::json j{{"medium", part_name(s, p)}};
    if (&p != &s.incidence && &p != &s.exit) j["thickness"] = p.to - p.from;
    return j;
  };
  nlohmann::json layers = nlohmann::json::array();
  for (const StackPart& p : s.layers) layers.push_back(part(p));
  return {{"axis", s.axis == 0 ? "x" : "y"}, {"direction", s.direction}, {"wavenumber", s.kx},
          {"polarization", kWave[s.polarization]}, {"incidence", part(s.incidence)}, {"incidence-index", s.n_in},
          {"layers", layers}, {"exit", part(s.exit)}, {"notes", s.notes}};
}

JonesPrediction jones_of(const StackPrediction& p) {
  JonesPrediction j;
  j.r = p.r, j.t = p.t, j.has_t = p.has_t;
  for (int in = 0; in < 2; ++in) j.kerr[in] = p.kerr[in], j.faraday[in] = p.faraday[in];
  return j;
}

}  // namespace

int medium_stack_command(const MediumOptions& o) {
  const Scene scene = read_scene(o.scene, o.sets);
  const SceneStack s = scene_stack(scene);
  std::string band;
  const std::vector<double> freq = frequencies(scene, o, band);
  print_stack(scene, s, band);
  std::string csv = std::string(kCsvHeader) + (o.polarization ? jones_csv_header() : "") + "\n";
  nlohmann::json rows = nlohmann::json::array();
  std::vector<StackPrediction> all;
  for (const double f : freq) {
    const StackPrediction p = predict_stack(s, f);
    print_row(s, p);
    csv += csv_line(s, p) + (o.polarization ? jones_csv(jones_of(p)) : "") + "\n";
    nlohmann::json row = json_row(s, p);
    if (o.polarization) row["polarization"] = jones_json(jones_of(p));
    rows.push_back(row);
    all.push_back(p);
  }
  if (o.polarization) {
    print_jones_header(!all.empty() && all.front().has_t);
    for (const StackPrediction& p : all) print_jones_row(p.f, jones_of(p));
  }
  if (!o.csv.empty()) write_text_atomically(o.csv, csv);
  if (!o.json.empty())
    write_text_atomically(o.json, nlohmann::json{{"stack", json_stack(s)}, {"rows", rows}}.dump(2) + "\n");
  return 0;
}

}  // namespace ty

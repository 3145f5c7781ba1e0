/// \file measure_material_command.cpp
/// \brief `terayee measure material RUN --reference REF --probe NAME --thickness D`: the
/// time-domain spectroscopy of a slab: t(f) at a probe behind it against the reference run,
/// its unwrapped phase, the slab's n + i kappa, with --permittivity its mu, and with a
/// reflected probe before it both eps and mu (io/analysis/spectroscopy/tds_analysis.h and
/// slab_retrieval.h hold the numerics and their sources). Prints a table; --json FILE holds
/// `frequency` (Hz) and the complex arrays as {real: [...], imag: [...]}. --detector CRYSTAL
/// --detector-thickness D: the traces as an EO crystal records them (eo_detector.h) before
/// anything else; --traces FILE writes the traces analysed.
#include <fmt/format.h>

#include <cmath>
#include <iostream>
#include <nlohmann/json.hpp>

#include "io/analysis/spectroscopy/eo_detector.h"
#include "io/analysis/spectroscopy/slab_retrieval.h"
#include "io/analysis/spectroscopy/slab_transfer.h"
#include "io/analysis/spectroscopy/tds_analysis.h"
#include "io/run/atomic_file.h"
#include "io/scene/constants.h"
#include "io/scene/diagnostics.h"
#include "tools/commands.h"

namespace ty {

namespace {

nlohmann::json complex_array(const std::vector<std::complex<double>>& v) {
  nlohmann::json re = nlohmann::json::array(), im = nlohmann::json::array();
  for (const auto& z : v) re.push_back(z.real()), im.push_back(z.imag());
  return {{"real", re}, {"imag", im}};
}

bool is_magnetic_h(const std::string& field) { return !field.empty() && field[0] == 'H'; }

/// The probe's trace, as the EO detector of --detector records it (eo_detector.h).
ProbeTrace detected_trace(const MaterialOptions& o, const std::string& run, const std::string& probe) {
  ProbeTrace p = read_probe_trace(run, probe, o.field);
  if (!o.detector.empty()) p.value = eo_detected(eo_crystal(o.detector), o.detector_thickness, p.time, p.value);
  return p;
}

void write_traces(const MaterialOptions& o, const ProbeTrace& s, const ProbeTrace& r) {
  std::string csv = fmt::format("time_s,sample_{0},reference_{0}\n", o.field);
  for (size_t k = 0; k < s.time.size(); ++k) csv += fmt::format("{:.10g},{:.10g},{:.10g}\n", s.time[k], s.value[k], r.value[k]);
  write_text_atomically(o.traces, csv);
}

}  // namespace

int measure_material(const MaterialOptions& o) {
  const ProbeTrace s = detected_trace(o, o.run, o.probe), r = detected_trace(o, o.reference, o.probe);
  if (!o.traces.empty()) write_traces(o, s, r);
  TdsOptions t;
  t.window = o.window, t.thickness = o.thickness, t.from = o.from, t.to = o.to, t.count = o.count;
  t.permittivity = o.permittivity;
  const bool both = !o.reflected_probe.empty();
  if (both && o.permittivity)
    throw BadInput(
        "terayee measure material: error: --permittivity and --reflected-probe: give one (with r and t "
        "both eps and mu are retrieved)");
  if (both && o.window != "all")
    throw BadInput(
        "terayee measure material: error: --reflected-probe needs --window all (the retrieval of eps "
        "and mu from r and t models every echo)");
  const TdsResult res = analyse_transmission(s, r, t);
  nlohmann::json j;
  j["run"] = o.run, j["reference"] = o.reference, j["probe"] = o.probe, j["field"] = o.field;
  j["thickness"] = o.thickness;
  if (!o.detector.empty())
    j["detector"] = {{"crystal", eo_crystal(o.detector).name}, {"thickness", o.detector_thickness},
                     {"response", "eo_detector.h: Gallot & Grischkowsky, JOSA B 16, 1204 (1999)"}};
  j["window"] = res.window.describe();
  j["echoes-modelled"] = res.echoes;
  j["convention"] = "fields ~ exp(-i omega t); n = n' + i kappa, kappa > 0 for loss; t = sample / reference";
  j["frequency"] = res.freq;
  j["t"] = complex_array(res.t);
  std::vector<double> amp;
  for (const auto& z : res.t) amp.push_back(std::abs(z));
  j["t-amplitude"] = amp;
  j["t-phase-unwrapped"] = res.phase;
  j["n"] = complex_array(res.n);
  j["newton-iterations"] = res.iterations;
  std::vector<std::complex<double>> eps, mu = res.mu, n_shown = res.n;
  if (both) {
    const ProbeTrace rs = detected_trace(o, o.run, o.reflected_probe), rr = detected_trace(o, o.reference, o.reflected_probe);
    const double at = o.front_axis == 'x' ? rs.x : rs.y;
    std::vector<std::complex<double>> t_slab;
    for (size_t m = 0; m < res.freq.size(); ++m)  // undo the reference's vacuum path: H = t_slab e^{-i k0 d}
      t_slab.push_back(res.t[m] * std::polar(1.0, 2 * constants::pi * res.freq[m] / constants::c0 * o.thickness));
    const auto rf = front_face_reflection(rs, rr, res.freq, res.window, std::abs(o.front - at), is_magnetic_h(o.field));
    const EpsMu em = retrieve_eps_mu(res.freq, rf, t_slab, o.thickness);
    eps = em.eps, mu = em.mu, n_shown = em.n;
    j["r"] = complex_array(rf);
    j["epsilon"] = complex_array(eps);
    j["n"] = complex_array(em.n);
    j["n-from-t"] = complex_array(res.n);
  }
  if (!mu.empty()) j["mu"] = complex_array(mu);
  if (o.permittivity) j["epsilon"] = complex_array(std::vector<std::complex<double>>(res.freq.size(), *o.permittivity));

  std::cout << fmt::format("window: {}\n", res.window.describe());
  if (res.n_estimate > 0) std::cout << fmt::format("index from the pulses' delay: {:.4f}\n", res.n_estimate);
  std::cout << fmt::format("{:>14s}{:>10s}{:>12s}{:>10s}{:>10s}{}\n", "frequency/GHz", "|t|", "phase/rad", "n", "kappa",
                           mu.empty() ? "" : "       mu'       mu''");
  for (size_t m = 0; m < res.freq.size(); ++m) {
    const auto& n = n_shown[m];
    std::string row = fmt::format("{:14.4f}{:10.5f}{:12.5f}{:10.5f}{:10.5f}", res.freq[m] / 1e9, amp[m], res.phase[m],
                                  n.real(), n.imag());
    if (!mu.empty()) row += fmt::format("{:10.5f}{:10.5f}", mu[m].real(), mu[m].imag());
    if (res.iterations[m] < 0) row += "  (Newton did not converge)";
    std::cout << row << "\n";
  }
  if (!o.json.empty()) write_text_atomically(o.json, j.dump(2) + "\n");
  return 0;
}

}  // namespace ty

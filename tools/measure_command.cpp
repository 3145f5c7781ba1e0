/// \file measure_command.cpp
/// \brief `terayee measure spectrum RUN --reference REF`: reflectance, transmittance and
/// absorptance against frequency (io/analysis/spectrum.h: the formulas and which line's
/// reference power is the incident power). Prints a table and writes RUN/spectrum.csv and
/// .json; the complex t and r (amplitude, unwrapped phase) go to RUN/spectrum-complex.csv
/// and the JSON's "complex" entry.
#include <fmt/format.h>

#include <fstream>
#include <iostream>
#include <sstream>
#include <nlohmann/json.hpp>

#include "io/run/atomic_file.h"
#include "io/analysis/spectroscopy/line_spectrum.h"
#include "io/analysis/spectroscopy/trace_spectrum.h"
#include "io/analysis/spectrum.h"
#include "io/scene/diagnostics.h"
#include "tools/commands.h"

namespace ty {

namespace {

/// Complex t and r (io/analysis/spectroscopy/line_spectrum.h) into RUN/spectrum-complex.csv
/// and the JSON's "complex" entry: real, imaginary, amplitude and unwrapped phase (rad).
void write_complex_spectrum(const std::string& run, const LinePair* r, const LinePair* t, bool r_incident,
                            const std::vector<double>& freq, nlohmann::json& j) {
  const int c = dominant_polarization(t ? t->reference : r->reference);
  const ComplexSpectrum cs = complex_spectrum(r, t, c, r_incident);
  const char* wave = c == 2 ? "Ez" : "Hz";
  std::ostringstream csv;
  csv << "frequency_Hz";
  j["complex"]["polarization"] = wave;
  j["complex"]["convention"] = "fields ~ exp(-i omega t); t and r of the transverse E, referred to their lines";
  std::vector<std::pair<std::string, std::vector<std::complex<double>>>> cols;
  if (!cs.t.empty()) cols.emplace_back("t", cs.t);
  if (!cs.r.empty()) cols.emplace_back("r", cs.r);
  std::vector<std::vector<double>> phases;
  for (const auto& [name, v] : cols) {
    csv << fmt::format(",{0}_real,{0}_imag,{0}_amplitude,{0}_phase_rad", name);
    phases.push_back(unwrapped_phase(freq, v));
    nlohmann::json re, im, amp;
    for (const auto& z : v) re.push_back(z.real()), im.push_back(z.imag()), amp.push_back(std::abs(z));
    j["complex"][name] = {{"real", re}, {"imag", im}, {"amplitude", amp}, {"phase", phases.back()}};
  }
  csv << "\n";
  for (size_t k = 0; k < freq.size(); ++k) {
    csv << fmt::format("{:.10g}", freq[k]);
    for (size_t q = 0; q < cols.size(); ++q) {
      const auto z = cols[q].second[k];
      csv << fmt::format(",{:.10g},{:.10g},{:.10g},{:.10g}", z.real(), z.imag(), std::abs(z), phases[q][k]);
    }
    csv << "\n";
  }
  write_text_atomically(run + "/spectrum-complex.csv", csv.str());
  std::cout << fmt::format("complex t{} of the {} wave (exp(-i omega t)) in {}/spectrum-complex.csv\n",
                           cs.r.empty() ? "" : " and r", wave, run);
}

}  // namespace

int measure_spectrum(const std::string& run, const std::string& ref, std::string reflected, std::string transmitted) {
  if (reflected.empty() && has_power_spectrum_line(run, "reflected")) reflected = "reflected";
  if (transmitted.empty() && has_power_spectrum_line(run, "transmitted")) transmitted = "transmitted";
  if (reflected.empty() && transmitted.empty())
    throw BadInput(
        fmt::format("{}: error: name the power-spectrum lines with --reflected and/or --transmitted (no lines "
                    "named 'reflected' or 'transmitted')",
                    run));
  auto pair = [&](const std::string& name) {
    return LinePair{read_power_spectrum_line(run, name), read_power_spectrum_line(ref, name)};
  };
  LinePair r, t;
  if (!reflected.empty()) r = pair(reflected);
  if (!transmitted.empty()) t = pair(transmitted);
  const SpectrumResult s =
      reflectance_transmittance(reflected.empty() ? nullptr : &r, transmitted.empty() ? nullptr : &t);
  const auto &freq = s.freq, &R = s.R, &T = s.T;
  const bool both = s.has_both();
  if (!R.empty() && s.R_incident_line != reflected)
    std::cout << fmt::format(
        "the reference run's power through '{}' is negligible: R is normalised to the incident "
        "power through '{}'\n",
        reflected, s.R_incident_line);
  if (!T.empty() && s.T_incident_line != transmitted)
    std::cout << fmt::format(
        "the reference run's power through '{}' is negligible: T is normalised to the incident "
        "power through '{}'\n",
        transmitted, s.T_incident_line);
  std::ostringstream csv;
  csv << "frequency_Hz" << (R.empty() ? "" : ",reflectance") << (T.empty() ? "" : ",transmittance")
      << (both ? ",absorptance" : "") << "\n";
  std::cout << fmt::format("{:>14s}{}{}{}\n", "frequency/GHz", R.empty() ? "" : "  reflectance",
                           T.empty() ? "" : "  transmittance", both ? "  absorptance" : "");
  nlohmann::json j;
  j["reference"] = ref;
  j["reflected-line"] = reflected;
  j["transmitted-line"] = transmitted;
  if (!R.empty()) j["reflectance-incident-line"] = s.R_incident_line;
  if (!T.empty()) j["transmittance-incident-line"] = s.T_incident_line;
  for (size_t k = 0; k < freq.size(); ++k) {
    std::string row = fmt::format("{:14.6f}", freq[k] / 1e9);
    csv << fmt::format("{:.10g}", freq[k]);
    nlohmann::json e;
    e["frequency"] = freq[k];
    if (!R.empty())
      row += fmt::format("  {:11.6f}", R[k]), csv << fmt::format(",{:.10g}", R[k]), e["reflectance"] = R[k];
    if (!T.empty())
      row += fmt::format("  {:13.6f}", T[k]), csv << fmt::format(",{:.10g}", T[k]), e["transmittance"] = T[k];
    if (both) {
      const double A = 1 - R[k] - T[k];
      row += fmt::format("  {:11.6f}", A), csv << fmt::format(",{:.10g}", A), e["absorptance"] = A;
    }
    csv << "\n";
    std::cout << row << "\n";
    j["spectrum"].push_back(e);
  }
  write_text_atomically(run + "/spectrum.csv", csv.str());
  write_complex_spectrum(run, reflected.empty() ? nullptr : &r, transmitted.empty() ? nullptr : &t,
                         !R.empty() && s.R_incident_line == reflected, freq, j);
  write_text_atomically(run + "/spectrum.json", j.dump(2) + "\n");
  return 0;
}

}  // namespace ty

/// \file measure_command.cpp
/// \brief `terayee measure spectrum RUN --reference REF`: reflectance, transmittance and
/// absorptance against frequency (io/analysis/spectrum.h: the formulas and which line's
/// reference power is the incident power). Prints a table and writes RUN/spectrum.csv and
/// .json.
#include <fmt/format.h>

#include <fstream>
#include <iostream>
#include <nlohmann/json.hpp>

#include "io/analysis/spectrum.h"
#include "io/scene/diagnostics.h"
#include "tools/commands.h"

namespace ty {

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
  std::ofstream csv(run + "/spectrum.csv");
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
  std::ofstream(run + "/spectrum.json") << j.dump(2) << "\n";
  return 0;
}

}  // namespace ty

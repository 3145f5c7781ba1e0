/// \file measure_focus.cpp
/// \brief `terayee measure focus RUN --map NAME`: the focal spot in a spectral map
/// (io/analysis/focus.h), the peak relative to the incident beam's (with --reference, the
/// reference run's peak in the same map), and the distance from a face (--face, a
/// coordinate along the axis). Table, CSV, JSON, and focus-profiles.csv: the intensity
/// through the peak across and along the axis.
#include <fmt/format.h>

#include <fstream>
#include <iostream>
#include <sstream>
#include <nlohmann/json.hpp>

#include "io/run/atomic_file.h"
#include "io/analysis/spectral_map_cut.h"
#include "tools/commands.h"

namespace ty {

int measure_focus(const std::string& run, const std::string& map, const std::string& reference, double freq,
                  const std::string& axis, double face, bool has_face) {
  const SpectralMapFile file(run, map);
  const IntensityMap m = read_intensity(file, freq);
  const Focus f = find_focus(m);
  const bool along_x = axis == "x";
  const double along = along_x ? f.fwhm_x : f.fwhm_y, across = along_x ? f.fwhm_y : f.fwhm_x;
  double incident_peak = 0;
  if (!reference.empty()) {
    const SpectralMapFile ref(reference, map);
    check_same_nodes(file, ref);
    incident_peak = peak_of(read_intensity(ref, m.frequency));
  }
  nlohmann::json j;
  j["map"] = map;
  j["frequency"] = m.frequency;
  j["peak-position"] = {f.x, f.y};
  j["peak-intensity"] = f.peak;
  j["fwhm-along-axis"] = along;
  j["fwhm-across-axis"] = across;
  std::cout << fmt::format("focus in map '{}' at {:.6g} GHz (axis {}):\n", map, m.frequency / 1e9, axis);
  std::cout << fmt::format("  peak at ({:.6g}, {:.6g}) mm, |E|^2 = {:.6g} (V/m)^2\n", f.x * 1e3, f.y * 1e3, f.peak);
  std::cout << fmt::format("  FWHM across the axis {:.6g} um, along it {:.6g} um\n", across * 1e6, along * 1e6);
  if (!reference.empty()) {
    j["peak-over-incident"] = f.peak / incident_peak;
    std::cout << fmt::format("  peak / incident peak (reference run) = {:.6g}\n", f.peak / incident_peak);
  }
  if (has_face) {
    const double d = (along_x ? f.x : f.y) - face;
    j["distance-from-face"] = d;
    std::cout << fmt::format("  distance from the face at {:.6g} mm: {:.6g} um\n", face * 1e3, d * 1e6);
  }
  write_text_atomically(run + "/focus.json", j.dump(2) + "\n");
  // the intensity through the peak, across and along the axis (for `terayee render --plot focus`)
  std::ostringstream prof;
  prof << "direction,s_m,intensity\n";
  for (int across_axis = 1; across_axis >= 0; --across_axis) {
    const bool use_row = (across_axis == 1) != along_x;  // a row runs along x
    const auto& s = use_row ? m.x : m.y;
    const auto& v = use_row ? f.row : f.column;
    for (size_t q = 0; q < s.size(); ++q)
      prof << fmt::format("{},{:.10g},{:.10g}\n", across_axis ? "across" : "along", s[q], v[q]);
  }
  write_text_atomically(run + "/focus-profiles.csv", prof.str());
  std::ostringstream csv;
  csv << "frequency_Hz,x_m,y_m,peak,fwhm_across_m,fwhm_along_m\n"
      << fmt::format("{:.10g},{:.10g},{:.10g},{:.10g},{:.10g},{:.10g}\n", m.frequency, f.x, f.y, f.peak, across, along);
  write_text_atomically(run + "/focus.csv", csv.str());
  return 0;
}

}  // namespace ty

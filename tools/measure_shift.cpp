/// \file measure_shift.cpp
/// \brief `terayee measure shift RUN --reference REF --map NAME --line y=V --interface V
/// --angle A`: the lateral (Goos-Hänchen) shift of a reflected beam (io/analysis/shift.h).
/// With --reversed RUN2 --reversed-reference REF2 (the same scene, bias reversed) it also
/// gives the non-reciprocal part (the difference) and the reciprocal part (the mean).
/// Writes RUN/shift.json and RUN/shift-profiles.csv (the beams' |E|^2 along the line).
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>
#include <iostream>

#include "io/analysis/shift.h"
#include "tools/commands.h"

namespace ty {
namespace {

using Shift = LateralShift;

/// The shift in one run and its reference run, every argument checked against the maps.
Shift measure(const std::string& run, const std::string& ref, const ShiftOptions& o) {
  const bool line_is_y = o.line_axis == 'y';
  const SpectralMapFile a(run, o.map), r(ref, o.map);
  check_same_nodes(a, r);
  const LineCut ca = read_line_cut(a, line_is_y, o.line, a.frequency_index(o.frequency));
  const LineCut cr = read_line_cut(r, line_is_y, o.line, r.frequency_index(o.frequency));
  return lateral_shift(ca, cr, line_is_y, o.line, o.interface, o.angle);
}

}  // namespace

int measure_shift(const ShiftOptions& o) {
  const Shift s = measure(o.run, o.reference, o);
  nlohmann::json j;
  auto report = [&](const Shift& x, const char* label) {
    std::cout << fmt::format("{}: incident centroid {:.6g} um (width {:.6g} um), reflected {:.6g} um (width {:.6g} um)\n",
                             label, x.incident.centroid * 1e6, x.incident.width * 1e6, x.reflected.centroid * 1e6,
                             x.reflected.width * 1e6);
    std::cout << fmt::format("  geometric reflection {:.6g} um; lateral shift {:.6g} +- {:.3g} um along t = z x n\n",
                             x.geometric * 1e6, x.shift * 1e6, x.uncertainty * 1e6);
    nlohmann::json e;
    e["incident-centroid"] = x.incident.centroid, e["incident-width"] = x.incident.width;
    e["reflected-centroid"] = x.reflected.centroid, e["reflected-width"] = x.reflected.width;
    e["geometric"] = x.geometric, e["shift"] = x.shift, e["uncertainty"] = x.uncertainty;
    return e;
  };
  j["run"] = report(s, "run");
  Shift b;
  if (!o.reversed.empty()) {
    b = measure(o.reversed, o.reversed_reference, o);
    j["reversed"] = report(b, "bias reversed");
    const double u = std::hypot(s.uncertainty, b.uncertainty);
    j["non-reciprocal"] = s.shift - b.shift;
    j["reciprocal"] = 0.5 * (s.shift + b.shift);
    std::cout << fmt::format("non-reciprocal part (difference) {:.6g} um, reciprocal part (mean) {:.6g} um, +- {:.3g} um\n",
                             (s.shift - b.shift) * 1e6, 0.5 * (s.shift + b.shift) * 1e6, u * 1e6);
  }
  std::ofstream(o.run + "/shift.json") << j.dump(2) << "\n";
  // the beams' intensity along the line (for `terayee render --plot shift`)
  std::ofstream prof(o.run + "/shift-profiles.csv");
  prof << "beam,s_m,intensity\n";
  auto profile = [&](const Shift& x, const std::string& tag) {
    for (size_t q = 0; q < x.s.size(); ++q)
      prof << fmt::format("incident{},{:.10g},{:.10g}\n", tag, x.s[q], x.incident_profile[q]);
    for (size_t q = 0; q < x.s.size(); ++q)
      prof << fmt::format("reflected{},{:.10g},{:.10g}\n", tag, x.s[q], x.reflected_profile[q]);
  };
  profile(s, "");
  if (!o.reversed.empty()) profile(b, "-reversed");
  return 0;
}

}  // namespace ty

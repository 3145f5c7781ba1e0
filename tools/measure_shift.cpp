/// \file measure_shift.cpp
/// \brief `terayee measure shift RUN --reference REF --map NAME --line y=V --interface V
/// --angle A`: the lateral (Goos-Hänchen) shift of a reflected beam. Along a line parallel
/// to the interface on the incidence side, the incident beam is the reference run's map and
/// the reflected beam the difference of the two runs' maps (the scattered field); their
/// intensity centroids and widths (2 sigma of |E|^2) are measured, and the shift is the
/// reflected centroid less the geometric-optics one, x_inc + 2 h tan(theta) along
/// t = z x n (h the line's distance from the interface), with an uncertainty of half a cell
/// in where the discrete interface lies (dx tan(theta)) plus the centroids' sampling.
/// With --reversed RUN2 --reversed-reference REF2 (the same scene, bias reversed) it also
/// gives the non-reciprocal part (the difference) and the reciprocal part (the mean).
/// Writes RUN/shift.json and RUN/shift-profiles.csv (the beams' |E|^2 along the line).
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <complex>
#include <fstream>
#include <iostream>

#include "io/scene/diagnostics.h"
#include "io/run/spectral_map_file.h"
#include "tools/commands.h"

namespace ty {
namespace {

struct Cut {
  std::vector<double> s;                     // coordinate along the line (along t)
  std::vector<std::complex<double>> E[3];    // the map's E components on the line
};

Cut read_cut(const std::string& run, const std::string& name, bool line_is_y, double at, double f0) {
  const SpectralMapFile map(run, name);
  const size_t k = map.frequency_index(f0);
  const auto& x = map.x();
  const auto& y = map.y();
  const size_t nx = x.size();
  // nearest row (line y = at) or column (x = at)
  size_t idx = 0;
  const auto& axis = line_is_y ? y : x;
  for (size_t q = 0; q < axis.size(); ++q)
    if (std::abs(axis[q] - at) < std::abs(axis[idx] - at)) idx = q;
  Cut c;
  c.s = line_is_y ? x : y;
  const char* names[3] = {"Ex", "Ey", "Ez"};
  for (int comp = 0; comp < 3; ++comp) {
    if (!map.has(names[comp])) continue;
    const auto E = map.field(names[comp], k);
    for (size_t q = 0; q < c.s.size(); ++q) c.E[comp].push_back(E[line_is_y ? idx * nx + q : q * nx + idx]);
  }
  return c;
}

struct Beam {
  double centroid = 0, width = 0;
};

Beam moments(const std::vector<double>& s, const std::vector<double>& I) {
  double m0 = 0, m1 = 0, m2 = 0;
  for (size_t q = 0; q < s.size(); ++q) m0 += I[q], m1 += I[q] * s[q], m2 += I[q] * s[q] * s[q];
  Beam b;
  b.centroid = m1 / m0;
  b.width = 2 * std::sqrt(std::max(0.0, m2 / m0 - b.centroid * b.centroid));
  return b;
}

struct Shift {
  std::vector<double> s, incident_profile, reflected_profile;  // |E|^2 along the line
  Beam incident, reflected;
  double geometric = 0, shift = 0, uncertainty = 0;
};

Shift measure(const std::string& run, const std::string& ref, const std::string& map, bool line_is_y, double line,
              double interface, double theta, double f0) {
  const Cut a = read_cut(run, map, line_is_y, line, f0), r = read_cut(ref, map, line_is_y, line, f0);
  std::vector<double> Ii(a.s.size(), 0.0), Ir(a.s.size(), 0.0);
  for (int c = 0; c < 3; ++c)
    for (size_t q = 0; q < a.E[c].size(); ++q) {
      Ii[q] += std::norm(r.E[c][q]);
      Ir[q] += std::norm(a.E[c][q] - r.E[c][q]);
    }
  Shift out;
  out.s = a.s, out.incident_profile = Ii, out.reflected_profile = Ir;
  out.incident = moments(a.s, Ii);
  out.reflected = moments(a.s, Ir);
  // t = z x n: for a line y = const (normal y) t = -x; for x = const (normal x) t = +y
  const double t_sign = line_is_y ? -1.0 : 1.0;
  const double h = std::abs(interface - line);
  out.geometric = out.incident.centroid + t_sign * 2 * h * std::tan(theta);
  out.shift = t_sign * (out.reflected.centroid - out.geometric);
  const double ds = a.s.size() > 1 ? std::abs(a.s[1] - a.s[0]) : 0.0;
  out.uncertainty = ds * std::abs(std::tan(theta)) + 0.1 * ds;
  return out;
}

}  // namespace

int measure_shift(const ShiftOptions& o) {
  const bool line_is_y = o.line_axis == 'y';
  const Shift s = measure(o.run, o.reference, o.map, line_is_y, o.line, o.interface, o.angle, o.frequency);
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
    b = measure(o.reversed, o.reversed_reference, o.map, line_is_y, o.line, o.interface, o.angle, o.frequency);
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

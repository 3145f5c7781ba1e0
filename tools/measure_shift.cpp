/// \file measure_shift.cpp
/// \brief `terayee measure shift RUN --reference REF --map NAME --line y=V --interface V`: the
/// lateral (Goos-Hänchen) shift of a reflected beam against the exact specular reflection of
/// the same incident beam (io/analysis/shift.h), the face being the node plane where the
/// body's face acts (solver/grid/face_plane.h, from the run's own scene and grid).
/// With --reversed RUN2 --reversed-reference REF2 (the same scene, bias reversed) it also
/// gives the non-reciprocal part (the difference) and the reciprocal part (the mean).
/// Writes RUN/shift.json and RUN/shift-profiles.csv (the beams' |E|^2 along the line).
#include <fmt/format.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <iostream>
#include <sstream>
#include <nlohmann/json.hpp>

#include "io/run/atomic_file.h"
#include "io/analysis/shift.h"
#include "io/analysis/shift_geometry.h"
#include "io/scene/scene_reader.h"
#include "io/scene/units.h"
#include "tools/commands.h"

namespace ty {
namespace {

using Shift = LateralShift;

/// The face, the incidence side's index and the grid, from the run's scene (RUN/scene.yaml).
ShiftGeometry geometry(const std::string& run, const ShiftOptions& o, double omega, const LineCut& incident) {
  if (!std::filesystem::exists(run + "/scene.yaml"))
    throw BadInput(
        fmt::format("{}: error: no scene.yaml (measure shift takes the face plane and the grid from the "
                    "run's own scene)",
                    run));
  return shift_geometry(read_scene(run + "/scene.yaml"), o.line_axis, o.interface, omega, incident);
}

/// The shift in one run and its reference run, every argument checked against the maps.
Shift measure(const std::string& run, const std::string& ref, const ShiftOptions& o) {
  const bool line_is_y = o.line_axis == 'y';
  const SpectralMapFile a(run, o.map), r(ref, o.map);
  check_same_nodes(a, r);
  const size_t k = a.frequency_index(o.frequency);
  const LineCut ca = read_line_cut(a, line_is_y, o.line, k);
  const LineCut cr = read_line_cut(r, line_is_y, o.line, r.frequency_index(o.frequency));
  return lateral_shift(ca, cr, line_is_y, geometry(run, o, 2 * constants::pi * a.frequencies()[k], cr));
}

nlohmann::json report(const Shift& x, const char* label) {
  std::cout << fmt::format("{}: incident centroid {:.6g} um (width {:.6g} um), reflected {:.6g} um (width {:.6g} um)\n",
                           label, x.incident.centroid * 1e6, x.incident.width * 1e6, x.reflected.centroid * 1e6,
                           x.reflected.width * 1e6);
  std::cout << fmt::format(
      "  specular reflection {:.6g} um (a perfect mirror on the face plane {:.6g} um beyond the "
      "line); lateral shift on the line {:.6g} +- {:.3g} um, at the face {:.6g} +- {:.3g} um, "
      "along t = z x n\n",
      x.specular.centroid * 1e6, x.line_distance * 1e6, x.shift * 1e6, x.uncertainty * 1e6, x.face_shift * 1e6,
      x.face_uncertainty * 1e6);
  nlohmann::json e;
  e["incident-centroid"] = x.incident.centroid, e["incident-width"] = x.incident.width;
  e["reflected-centroid"] = x.reflected.centroid, e["reflected-width"] = x.reflected.width;
  e["specular-centroid"] = x.specular.centroid, e["line-distance"] = x.line_distance;
  e["shift"] = x.shift, e["uncertainty"] = x.uncertainty;
  e["face-shift"] = x.face_shift, e["face-uncertainty"] = x.face_uncertainty;
  return e;
}

}  // namespace

int measure_shift(const ShiftOptions& o) {
  const Shift s = measure(o.run, o.reference, o);
  nlohmann::json j;
  j["run"] = report(s, "run");
  Shift b;
  if (!o.reversed.empty()) {
    b = measure(o.reversed, o.reversed_reference, o);
    j["reversed"] = report(b, "bias reversed");
    const double u = std::hypot(s.uncertainty, b.uncertainty);
    j["non-reciprocal"] = s.shift - b.shift;
    j["reciprocal"] = 0.5 * (s.shift + b.shift);
    std::cout << fmt::format(
        "non-reciprocal part (difference) {:.6g} um, reciprocal part (mean) {:.6g} um, +- {:.3g} um\n",
        (s.shift - b.shift) * 1e6, 0.5 * (s.shift + b.shift) * 1e6, u * 1e6);
  }
  write_text_atomically(o.run + "/shift.json", j.dump(2) + "\n");
  // the beams' intensity along the line (for `terayee render --plot shift`)
  std::ostringstream prof;
  prof << "beam,s_m,intensity\n";
  auto profile = [&](const Shift& x, const std::string& tag) {
    const std::pair<const char*, const std::vector<double>*> beams[3] = {
        {"incident", &x.incident_profile}, {"specular", &x.specular_profile}, {"reflected", &x.reflected_profile}};
    for (auto [name, I] : beams)
      for (size_t q = 0; q < x.s.size(); ++q) prof << fmt::format("{}{},{:.10g},{:.10g}\n", name, tag, x.s[q], (*I)[q]);
  };
  profile(s, "");
  if (!o.reversed.empty()) profile(b, "-reversed");
  write_text_atomically(o.run + "/shift-profiles.csv", prof.str());
  return 0;
}

}  // namespace ty

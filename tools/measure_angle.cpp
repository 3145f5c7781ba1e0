/// \file measure_angle.cpp
/// \brief `terayee measure angle RUN --map NAME --region CX,CY,SX,SY`: the direction of
/// power flow of a beam inside a region of a spectral map (io/analysis/angle.h): its
/// refraction angle from the interface normal (--normal x|y), its sign against the
/// incidence angle (--incidence, same convention: positive towards t = z x n), and the
/// direction of the beam's centre line.
#include <fmt/format.h>

#include <cmath>
#include <fstream>
#include <iostream>
#include <nlohmann/json.hpp>

#include "io/run/atomic_file.h"
#include "io/analysis/spectral_map_cut.h"
#include "io/scene/constants.h"
#include "io/scene/diagnostics.h"
#include "tools/commands.h"

namespace ty {

int measure_angle(const std::string& run, const std::string& map, const std::vector<double>& region,
                  const std::string& normal, double incidence, bool has_incidence) {
  const SpectralMapFile m(run, map);
  if (!m.has("Sx") || !m.has("Sy"))
    throw BadInput(fmt::format("{}: error: the map '{}' needs the fields Sx and Sy", m.file(), map));
  const FlowRegion r{region[0], region[1], region[2], region[3]};
  check_region_inside(m, r);
  std::vector<double> sx, sy;  // <S> = Re(1/2 E x H*) at the map's first frequency
  for (const auto& v : m.field("Sx", 0)) sx.push_back(v.real());
  for (const auto& v : m.field("Sy", 0)) sy.push_back(v.real());
  const FlowAngle a = power_flow_angle(m.x(), m.y(), sx, sy, r, normal == "x");
  nlohmann::json j;
  j["map"] = map;
  j["power-flow-angle-rad"] = a.flow;
  j["refraction-angle-rad"] = a.refraction;
  j["centre-line-refraction-angle-rad"] = a.line_refraction;
  std::cout << fmt::format("power flow in the region: {:.4f} deg from +x; {:.4f} deg from the normal {}\n",
                           a.flow * 180 / constants::pi, a.refraction * 180 / constants::pi, normal);
  std::cout << fmt::format("beam centre line: {:.4f} deg from the normal\n", a.line_refraction * 180 / constants::pi);
  if (has_incidence) {
    const bool negative = a.refraction * incidence < 0;
    j["negative-refraction"] = negative;
    std::cout << fmt::format("incidence {:.4f} deg: refraction is {}\n", incidence * 180 / constants::pi,
                             negative ? "NEGATIVE (opposite side of the normal)" : "positive");
  }
  write_text_atomically(run + "/angle.json", j.dump(2) + "\n");
  return 0;
}

}  // namespace ty

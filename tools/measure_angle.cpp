/// \file measure_angle.cpp
/// \brief `terayee measure angle RUN --map NAME --region CX,CY,SX,SY`: the direction of
/// power flow of a beam inside a region, from the spectral map's time-averaged Poynting
/// vector <S> = 1/2 Re(E x H*), weighted by the intensity |<S>|:
///   angle = atan2(sum |S| S_y, sum |S| S_x)  (from +x towards +y),
/// its refraction angle from the interface normal (--normal x|y), its sign against the
/// incidence angle (--incidence, same convention: positive towards t = z x n), and the
/// direction of the beam's centre line (the line through the intensity centroids of the
/// region's rows or columns across the normal).
#include <fmt/format.h>
#include <nlohmann/json.hpp>

#include <cmath>
#include <fstream>
#include <iostream>

#include "io/scene/diagnostics.h"
#include "io/run/spectral_map_file.h"
#include "io/scene/units.h"
#include "tools/commands.h"

namespace ty {

int measure_angle(const std::string& run, const std::string& map, const std::vector<double>& region,
                  const std::string& normal, double incidence, bool has_incidence) {
  const SpectralMapFile m(run, map);
  const std::string& file = m.file();
  if (!m.has("Sx") || !m.has("Sy"))
    throw BadInput(fmt::format("{}: error: the map '{}' needs the fields Sx and Sy", file, map));
  const auto& x = m.x();
  const auto& y = m.y();
  std::vector<double> sx, sy;  // <S> = Re(1/2 E x H*) at the map's first frequency
  for (const auto& v : m.field("Sx", 0)) sx.push_back(v.real());
  for (const auto& v : m.field("Sy", 0)) sy.push_back(v.real());
  const size_t nx = x.size(), ny = y.size();
  const double cx = region[0], cy = region[1], hx = 0.5 * region[2], hy = 0.5 * region[3];
  double ax = 0, ay = 0, wsum = 0;
  // centroid line: along the normal, the intensity centroid of each line across it
  std::vector<double> along, across;
  const bool nx_normal = normal == "x";
  const size_t outer = nx_normal ? nx : ny, inner = nx_normal ? ny : nx;
  for (size_t a = 0; a < outer; ++a) {
    double m0 = 0, m1 = 0;
    for (size_t b = 0; b < inner; ++b) {
      const size_t i = nx_normal ? a : b, j = nx_normal ? b : a;
      if (std::abs(x[i] - cx) > hx || std::abs(y[j] - cy) > hy) continue;
      const size_t k = j * nx + i;
      const double w = std::hypot(sx[k], sy[k]);
      ax += w * sx[k], ay += w * sy[k], wsum += w;
      m0 += w, m1 += w * (nx_normal ? y[j] : x[i]);
    }
    if (m0 > 0) along.push_back(nx_normal ? x[a] : y[a]), across.push_back(m1 / m0);
  }
  if (wsum <= 0) throw BadInput(fmt::format("{}: error: no power flows in the region", file));
  const double flow = std::atan2(ay, ax);
  // centre line by least squares
  double line = std::nan("");
  if (along.size() >= 2) {
    double ma = 0, mc = 0;
    for (size_t k = 0; k < along.size(); ++k) ma += along[k], mc += across[k];
    ma /= along.size(), mc /= along.size();
    double sxy = 0, sxx = 0;
    for (size_t k = 0; k < along.size(); ++k) sxy += (along[k] - ma) * (across[k] - mc), sxx += std::pow(along[k] - ma, 2);
    const double slope = sxy / sxx;
    line = nx_normal ? std::atan2(slope, 1.0) : std::atan2(1.0, slope);
  }
  // refraction angle from the normal, positive towards t = z x n (t = +y for n = +x, -x for n = +y)
  const double nxv = nx_normal ? 1 : 0, nyv = nx_normal ? 0 : 1, tx = -nyv, ty = nxv;
  auto from_normal = [&](double a) {
    const double c = std::cos(a), s = std::sin(a);
    double r = std::atan2(c * tx + s * ty, c * nxv + s * nyv);
    if (r > constants::pi / 2) r -= constants::pi;
    if (r < -constants::pi / 2) r += constants::pi;
    return r;
  };
  const double refr = from_normal(flow), refr_line = std::isnan(line) ? line : from_normal(line);
  nlohmann::json j;
  j["map"] = map;
  j["power-flow-angle-rad"] = flow;
  j["refraction-angle-rad"] = refr;
  j["centre-line-refraction-angle-rad"] = refr_line;
  std::cout << fmt::format("power flow in the region: {:.4f} deg from +x; {:.4f} deg from the normal {}\n",
                           flow * 180 / constants::pi, refr * 180 / constants::pi, normal);
  std::cout << fmt::format("beam centre line: {:.4f} deg from the normal\n", refr_line * 180 / constants::pi);
  if (has_incidence) {
    const bool negative = refr * incidence < 0;
    j["negative-refraction"] = negative;
    std::cout << fmt::format("incidence {:.4f} deg: refraction is {}\n", incidence * 180 / constants::pi,
                             negative ? "NEGATIVE (opposite side of the normal)" : "positive");
  }
  std::ofstream(run + "/angle.json") << j.dump(2) << "\n";
  return 0;
}

}  // namespace ty

/// \file angle.cpp
/// \brief The direction of power flow in a region (see angle.h).
#include "io/analysis/angle.h"

#include <cmath>

#include "io/scene/constants.h"
#include "io/scene/diagnostics.h"

namespace ty {
namespace {

/// The slope of the least-squares line through (a, c) (NaN with fewer than two points).
double fitted_slope(const std::vector<double>& a, const std::vector<double>& c) {
  if (a.size() < 2) return std::nan("");
  double ma = 0, mc = 0;
  for (size_t k = 0; k < a.size(); ++k) ma += a[k], mc += c[k];
  ma /= a.size(), mc /= a.size();
  double sxy = 0, sxx = 0;
  for (size_t k = 0; k < a.size(); ++k) sxy += (a[k] - ma) * (c[k] - mc), sxx += std::pow(a[k] - ma, 2);
  return sxy / sxx;
}

}  // namespace

FlowAngle power_flow_angle(const std::vector<double>& x, const std::vector<double>& y, const std::vector<double>& sx,
                           const std::vector<double>& sy, const FlowRegion& region, bool nx_normal) {
  const size_t nx = x.size(), ny = y.size();
  const double hx = 0.5 * region.sx, hy = 0.5 * region.sy;
  double ax = 0, ay = 0, wsum = 0;
  // centroid line: along the normal, the intensity centroid of each line across it
  std::vector<double> along, across;
  const size_t outer = nx_normal ? nx : ny, inner = nx_normal ? ny : nx;
  for (size_t a = 0; a < outer; ++a) {
    double m0 = 0, m1 = 0;
    for (size_t b = 0; b < inner; ++b) {
      const size_t i = nx_normal ? a : b, j = nx_normal ? b : a;
      if (std::abs(x[i] - region.cx) > hx || std::abs(y[j] - region.cy) > hy) continue;
      const size_t k = j * nx + i;
      const double w = std::hypot(sx[k], sy[k]);
      ax += w * sx[k], ay += w * sy[k], wsum += w;
      m0 += w, m1 += w * (nx_normal ? y[j] : x[i]);
    }
    if (m0 > 0) along.push_back(nx_normal ? x[a] : y[a]), across.push_back(m1 / m0);
  }
  if (wsum <= 0) throw BadInput("terayee measure angle: error: no power flows in the region");
  FlowAngle out;
  out.flow = std::atan2(ay, ax);
  const double slope = fitted_slope(along, across);
  const double line = std::isnan(slope) ? slope : nx_normal ? std::atan2(slope, 1.0) : std::atan2(1.0, slope);
  // refraction angle from the normal, positive towards t = z x n (t = +y for n = +x, -x for n = +y)
  const double nxv = nx_normal ? 1 : 0, nyv = nx_normal ? 0 : 1, tx = -nyv, ty = nxv;
  auto from_normal = [&](double a) {
    const double c = std::cos(a), s = std::sin(a);
    double r = std::atan2(c * tx + s * ty, c * nxv + s * nyv);
    if (r > constants::pi / 2) r -= constants::pi;
    if (r < -constants::pi / 2) r += constants::pi;
    return r;
  };
  out.refraction = from_normal(out.flow);
  out.line_refraction = std::isnan(line) ? line : from_normal(line);
  return out;
}

}  // namespace ty

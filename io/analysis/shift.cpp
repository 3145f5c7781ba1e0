/// \file shift.cpp
/// \brief The lateral shift of a reflected beam (see shift.h).
#include "io/analysis/shift.h"

#include <algorithm>
#include <cmath>

namespace ty {

BeamMoments beam_moments(const std::vector<double>& s, const std::vector<double>& I) {
  double m0 = 0, m1 = 0, m2 = 0;
  for (size_t q = 0; q < s.size(); ++q) m0 += I[q], m1 += I[q] * s[q], m2 += I[q] * s[q] * s[q];
  BeamMoments b;
  b.centroid = m1 / m0;
  b.width = 2 * std::sqrt(std::max(0.0, m2 / m0 - b.centroid * b.centroid));
  return b;
}

LateralShift lateral_shift(const LineCut& a, const LineCut& r, bool line_is_y, double line, double interface,
                           double theta) {
  std::vector<double> Ii(a.s.size(), 0.0), Ir(a.s.size(), 0.0);
  for (int c = 0; c < 3; ++c)
    for (size_t q = 0; q < a.E[c].size(); ++q) {
      Ii[q] += std::norm(r.E[c][q]);
      Ir[q] += std::norm(a.E[c][q] - r.E[c][q]);
    }
  LateralShift out;
  out.s = a.s, out.incident_profile = Ii, out.reflected_profile = Ir;
  out.incident = beam_moments(a.s, Ii);
  out.reflected = beam_moments(a.s, Ir);
  // t = z x n: for a line y = const (normal y) t = -x; for x = const (normal x) t = +y
  const double t_sign = line_is_y ? -1.0 : 1.0;
  const double h = std::abs(interface - line);
  out.geometric = out.incident.centroid + t_sign * 2 * h * std::tan(theta);
  out.shift = t_sign * (out.reflected.centroid - out.geometric);
  const double ds = a.s.size() > 1 ? std::abs(a.s[1] - a.s[0]) : 0.0;
  out.uncertainty = ds * std::abs(std::tan(theta)) + 0.1 * ds;
  return out;
}

}  // namespace ty

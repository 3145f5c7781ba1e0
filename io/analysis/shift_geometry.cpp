/// \file shift_geometry.cpp
/// \brief The face plane, the grid and the incidence side's index of a shift measurement.
#include "io/analysis/shift_geometry.h"

#include <cmath>
#include <complex>
#include <vector>

#include "io/scene/medium_lookup.h"
#include "materials/permittivity/permittivity.h"
#include "solver/grid/face_plane.h"

namespace ty {
namespace {

/// The incidence side's index: its medium's eps for the polarization the beam carries (Ez,
/// or the in-plane E along the face, whichever holds more of the beam's intensity).
double incidence_index(const Scene& s, int normal, double along, double omega, const LineCut& incident) {
  const Vec2 p = normal == 1 ? Vec2{along + s.origin_shift.x, incident.at + s.origin_shift.y}
                             : Vec2{incident.at + s.origin_shift.x, along + s.origin_shift.y};
  const int m = medium_at(s, p);
  if (m < 0) return 1;
  double ez = 0, eh = 0;
  for (size_t q = 0; q < incident.s.size(); ++q) {
    if (!incident.E[2].empty()) ez += std::norm(incident.E[2][q]);
    for (int c = 0; c < 2; ++c)
      if (!incident.E[c].empty()) eh += std::norm(incident.E[c][q]);
  }
  const Mat3c eps = medium_permittivity(s.media[m], omega);
  const int c = ez >= eh ? 2 : 1 - normal;
  return std::sqrt(eps(c, c).real());
}

}  // namespace

ShiftGeometry shift_geometry(const Scene& s, char line_axis, double interface, double omega, const LineCut& incident) {
  const YeeGrid g = grid_for(s, 1);
  const int normal = line_axis == 'y' ? 1 : 0;
  std::vector<double> I(incident.s.size(), 0.0);
  for (int c = 0; c < 3; ++c)
    for (size_t q = 0; q < incident.E[c].size(); ++q) I[q] += std::norm(incident.E[c][q]);
  const double along = beam_moments(incident.s, I).centroid;
  const FacePlane f = face_plane(s, g, normal, interface, incident.at, along);
  ShiftGeometry x;
  x.face = f.at, x.half_cell = f.half_cell, x.omega = omega;
  x.d_t = normal == 1 ? g.dx : g.dy, x.d_n = normal == 1 ? g.dy : g.dx, x.dt = g.dt;
  x.index = incidence_index(s, normal, along, omega, incident);
  return x;
}

}  // namespace ty

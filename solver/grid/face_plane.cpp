/// \file face_plane.cpp
/// \brief The node plane where a body's face acts (see face_plane.h).
#include "solver/grid/face_plane.h"

#include <cmath>

#include "io/scene/medium_lookup.h"
#include "materials/dielectric.h"

namespace ty {

FacePlane face_plane(const Scene& s, const YeeGrid& g, int normal, double edge, double from, double along) {
  const double d = normal == 0 ? g.dx : g.dy;
  const double shift_n = normal == 0 ? s.origin_shift.x : s.origin_shift.y;  // internal = user + shift
  const double shift_t = normal == 0 ? s.origin_shift.y : s.origin_shift.x;
  const int npml = normal == 0 ? g.npml_x : g.npml_y;
  const double dir = edge >= from ? 1.0 : -1.0;  // from the wave's side into the body
  // internal coordinate of tangential-E node plane k (the Ez nodes' rows or columns)
  auto plane = [&](long k) { return (k - npml) * d; };
  auto point = [&](double n) { return normal == 0 ? Vec2{n, along + shift_t} : Vec2{along + shift_t, n}; };
  FacePlane f;
  f.half_cell = 0.5 * d;
  const double e = edge + shift_n;
  const int beyond = medium_at(s, point(e + 0.25 * d * dir));
  f.conductor = beyond >= 0 && s.media[beyond].perfect_conductor;
  long k = std::lround(e / d) + npml;  // the node plane nearest the edge
  if (f.conductor) {
    // the first node plane, walking in from the wave's side, whose E node lies in the conductor
    k -= static_cast<long>(dir);
    for (int step = 0; step < 4; ++step, k += static_cast<long>(dir)) {
      const int m = medium_at(s, point(plane(k)));
      if (m >= 0 && s.media[m].perfect_conductor) break;
    }
  }
  f.at = plane(k) - shift_n;
  return f;
}

}  // namespace ty

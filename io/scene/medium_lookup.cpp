/// \file medium_lookup.cpp
/// \brief The medium at a point: the last body holding it, or vacuum; and that body.
#include "io/scene/medium_lookup.h"

#include <algorithm>

namespace ty {

int body_at(const Scene& s, Vec2 p) {
  p.x = std::clamp(p.x, 0.0, s.grid.extent.x);
  p.y = std::clamp(p.y, 0.0, s.grid.extent.y);
  for (int b = static_cast<int>(s.bodies.size()) - 1; b >= 0; --b)
    if (s.bodies[b].shape.contains(p)) return b;
  return -1;
}

int medium_at(const Scene& s, Vec2 p) {
  const int b = body_at(s, p);
  return b < 0 ? -1 : s.bodies[b].medium;
}

}  // namespace ty

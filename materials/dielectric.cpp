/// \file dielectric.cpp
/// \brief Update coefficients of lossy dielectrics and the medium lookup of a scene.
#include "materials/dielectric.h"

#include <algorithm>

#include "io/scene/units.h"

namespace ty {

ECoefficients dielectric_update(double eps_r, double sigma, double dt) {
  const double q = sigma * dt / (2.0 * constants::eps0 * eps_r);
  return {(1.0 - q) / (1.0 + q), 1.0 / (eps_r * (1.0 + q))};
}

int medium_at(const Scene& s, Vec2 p) {
  p.x = std::clamp(p.x, 0.0, s.grid.extent.x);
  p.y = std::clamp(p.y, 0.0, s.grid.extent.y);
  for (int b = static_cast<int>(s.bodies.size()) - 1; b >= 0; --b)
    if (s.bodies[b].shape.contains(p)) return s.bodies[b].medium;
  return -1;
}

}  // namespace ty

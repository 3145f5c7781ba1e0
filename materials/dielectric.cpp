/// \file dielectric.cpp
/// \brief Update coefficients of lossy dielectrics (the medium lookup is io/scene/medium_lookup).
#include "materials/dielectric.h"

#include <algorithm>

#include "io/scene/units.h"

namespace ty {

ECoefficients dielectric_update(double eps_r, double sigma, double dt) {
  const double q = sigma * dt / (2.0 * constants::eps0 * eps_r);
  return {(1.0 - q) / (1.0 + q), 1.0 / (eps_r * (1.0 + q))};
}

}  // namespace ty

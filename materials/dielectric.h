/// \file dielectric.h
/// \brief Non-magnetic media on the grid: the E-update coefficients of a lossy
/// dielectric or a perfect conductor (the medium at a point: io/scene/medium_lookup.h).
///
/// Semi-implicit conductivity (Taflove & Hagness, Computational Electrodynamics, 3rd
/// ed., eqs. 3.28-3.29): with q = sigma*dt / (2*eps0*eps_r),
///   E^{n+1} = ca E^n + cb (c dt) curl(eta0 H)^{n+1/2},  ca = (1-q)/(1+q),  cb = 1/(eps_r (1+q)).
/// A perfect conductor has ca = cb = 0, so its tangential E stays zero.
#pragma once
#include "io/scene/scene.h"

namespace ty {

struct ECoefficients {
  double ca = 1.0;  ///< multiplies the old E
  double cb = 1.0;  ///< multiplies (c dt) times the curl of eta0*H; 1/eps_r without loss
};

ECoefficients dielectric_update(double eps_r, double sigma, double dt);

}  // namespace ty

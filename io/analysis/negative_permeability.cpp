/// \file negative_permeability.cpp
/// \brief Bands of negative Voigt permeability of a scene's magnets (see negative_permeability.h).
#include "io/analysis/negative_permeability.h"

#include "io/scene/constants.h"
#include "materials/magnetic/ground_state.h"
#include "materials/magnetic/linear_response.h"
#include "materials/magnetic/magnet.h"

namespace ty {

std::vector<std::pair<double, double>> negative_mu_bands(const Scene& s, double f0, double f1, int normal) {
  std::vector<std::pair<double, double>> out;
  for (const Medium& med : s.media) {
    if (!med.magnet) continue;
    const MagnetModel M(*med.magnet, s.bias);
    const GroundStates gs = find_ground_states(M);
    auto muv = [&](double f) {
      const Mat3c mu = Mat3c::Identity() + susceptibility(M, gs.ground, 2 * constants::pi * f);
      return voigt_permeability(mu, normal).real();
    };
    for (const Band& b : negative_bands(muv, f0, f1, 4000)) out.push_back({b.from / 1e9, b.to / 1e9});
  }
  return out;
}

}  // namespace ty

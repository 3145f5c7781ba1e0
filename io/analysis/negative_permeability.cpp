/// \file negative_permeability.cpp
/// \brief Bands where a scene's magnets carry no wave at normal incidence (see negative_permeability.h).
#include "io/analysis/negative_permeability.h"

#include "io/scene/constants.h"
#include "materials/layered/wave_character.h"
#include "materials/magnetic/ground_state.h"
#include "materials/magnetic/linear_response.h"
#include "materials/magnetic/magnet.h"
#include "materials/permittivity/permittivity.h"

namespace ty {

std::vector<std::pair<double, double>> negative_mu_bands(const Scene& s, double f0, double f1, int normal,
                                                         Component pol) {
  std::vector<std::pair<double, double>> out;
  for (const Medium& med : s.media) {
    if (!med.magnet) continue;
    const MagnetModel M(*med.magnet, s.bias);
    const GroundStates gs = find_ground_states(M);
    auto n2 = [&](double f) {
      const double w = 2 * constants::pi * f;
      const Mat3c mu = Mat3c::Identity() + susceptibility(M, gs.ground, w);
      const NormalModes m = normal_modes(medium_permittivity(med, w), mu, normal);
      return (m.coupled ? m.n2[0] : m.n2[pol == Component::Hz ? 1 : 0]).real();  // coupled: either wave
    };
    for (const Band& b : negative_bands(n2, f0, f1, 4000)) out.push_back({b.from / 1e9, b.to / 1e9});
  }
  return out;
}

}  // namespace ty

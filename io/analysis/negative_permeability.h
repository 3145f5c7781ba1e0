/// \file negative_permeability.h
/// \brief The frequency bands where a wave cannot propagate at normal incidence in a scene's
/// magnetic media, from each medium's linear response about its ground state under the
/// scene's bias and its permittivity: (k/k0)^2 of the wave (materials/layered/wave_character.h)
/// negative. For the Ez wave with the bias along z that is mu_V = (mu_xx mu_yy - mu_xy mu_yx) /
/// mu_nn < 0, for the Hz wave mu'_zz < 0 (a bias in the plane), and where the bias has a part
/// along the normal the two waves couple and a band is where either is evanescent. Shaded on
/// spectrum plots.
#pragma once
#include <utility>
#include <vector>

#include "io/scene/scene.h"

namespace ty {

/// Bands (GHz) within [f0, f1] (Hz) where the wave of polarization `pol` (Component::Ez or
/// Component::Hz) of any magnetic medium of the scene is evanescent at normal incidence on an
/// interface of normal 0 (x) or 1 (y).
std::vector<std::pair<double, double>> negative_mu_bands(const Scene& s, double f0, double f1, int normal,
                                                         Component pol = Component::Ez);

}  // namespace ty

/// \file negative_permeability.h
/// \brief The frequency bands where a scene's magnetic media have a negative effective
/// (Voigt) permeability for the wave with E along z, mu_V = (mu_xx mu_yy - mu_xy mu_yx) / mu_nn
/// (materials/magnetic/linear_response), from each medium's
/// linear response about its ground state under the scene's bias: where a slab can refract
/// negatively. Shaded on spectrum plots.
#pragma once
#include <utility>
#include <vector>

#include "io/scene/scene.h"

namespace ty {

/// Bands (GHz) where Re mu_V of any magnetic medium of the scene is negative within
/// [f0, f1] (Hz); normal: 0 (x) or 1 (y), the interface normal.
std::vector<std::pair<double, double>> negative_mu_bands(const Scene& s, double f0, double f1, int normal);

}  // namespace ty

/// \file crystal_magnet.cpp
/// \brief Filling a magnet from a library crystal (crystal_magnet.h).
#include "io/scene/crystals/crystal_magnet.h"

namespace ty {

Magnet crystal_magnet(const Crystal& c, const Rot3& r) {
  Magnet g;
  for (int s = 0; s < c.sublattices; ++s) g.sublattices.push_back({c.saturation.value, c.g.value, c.damping.value});
  for (const auto& a : c.anisotropy) g.anisotropy.push_back({r * a.axis, a.field.value});
  if (c.sublattices == 2) {
    g.lambda = c.exchange.value / c.saturation.value;
    std::array<double, 3> d = c.dm_axis;
    for (double& x : d) x *= c.dzyaloshinskii.value;
    g.dzyaloshinskii = r * d;
  }
  g.order = r * c.order;
  g.thermal.temperature = g.thermal.reference = c.reference;
  g.thermal.spin = c.spin.value;
  g.thermal.ordering = c.ordering.value;
  g.thermal.anisotropy_power = c.anisotropy_power.value;
  return g;
}

}  // namespace ty

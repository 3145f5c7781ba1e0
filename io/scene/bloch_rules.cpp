/// \file bloch_rules.cpp
/// \brief The rules of scenes with Bloch x sides (bloch_rules.h).
#include "io/scene/bloch_rules.h"

#include <cmath>

namespace ty {

void check_bloch(const Scene& s, Diagnostics& d) {
  if (s.grid.bx != Boundary::bloch) return;
  for (const auto& b : s.bodies)
    if (const Medium& m = s.media[b.medium]; m.tensor && !m.tensor->diagonal_in_plane())
      d.error(b.where, "bloch sides: the medium '" + m.name +
                           "' has its in-plane axes rotated off x and y; its coupled Ex-Ey step is not yet paired "
                           "across the seam (use periodic sides, or axes along x and y)");
  for (const auto& src : s.sources)
    if (src.kind != Source::Kind::point && std::abs(std::cos(src.angle)) > 1e-9)
      d.error(src.where,
              "bloch sides: a plane wave or beam must travel along +y or -y; the sides set its "
              "transverse wavenumber k_x (grid.bloch)");
}

}  // namespace ty

/// \file slab_transfer.cpp
/// \brief Airy and Fresnel formulas for a slab at normal incidence (see slab_transfer.h).
#include "io/analysis/spectroscopy/slab_transfer.h"

namespace ty {

namespace {
const cplx I(0, 1);
}

cplx slab_t(cplx n, cplx z, double k0, double d) {
  const cplx q = n * k0 * d;
  return 1.0 / (std::cos(q) - 0.5 * I * (z + 1.0 / z) * std::sin(q));
}

cplx slab_r(cplx n, cplx z, double k0, double d) {
  const cplx q = n * k0 * d;
  return -0.5 * I * (z - 1.0 / z) * std::sin(q) * slab_t(n, z, k0, d);
}

cplx slab_t_echoes(cplx n, cplx z, double k0, double d, bool echoes) {
  const cplx q = n * k0 * d;
  const cplx first = 4.0 * z / ((1.0 + z) * (1.0 + z)) * std::exp(I * q);
  if (!echoes) return first;
  const cplx r21 = (1.0 - z) / (1.0 + z);
  return first / (1.0 - r21 * r21 * std::exp(2.0 * I * q));
}

cplx slab_transfer(cplx n, cplx z, double k0, double d, bool echoes) {
  return slab_t_echoes(n, z, k0, d, echoes) * std::exp(-I * k0 * d);
}

cplx fresnel_r(cplx z) { return (z - 1.0) / (z + 1.0); }

}  // namespace ty

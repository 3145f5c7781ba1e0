/// \file richardson.cpp
/// \brief Richardson extrapolation and the grid convergence index (see richardson.h).
#include "io/analysis/sweep/richardson.h"

#include <cmath>

namespace ty {

std::optional<Extrapolated> richardson(const std::vector<double>& f, double r, double assumed_order) {
  const size_t n = f.size();
  if (n < 2) return std::nullopt;
  Extrapolated e;
  const double f1 = f[n - 1], f2 = f[n - 2];  // finest, next
  e.order = assumed_order;
  double fs = 3.0;  // Roache's safety factor with an assumed order
  if (n >= 3) {
    const double d21 = f2 - f1, d32 = f[n - 3] - f2;
    e.monotone = d21 * d32 > 0;
    if (e.monotone && d21 != 0) {
      const double p = std::log(d32 / d21) / std::log(r);
      if (std::isfinite(p) && p > 0) {
        e.order = p;
        e.order_observed = true;
        fs = 1.25;
      }
    }
  }
  const double rp1 = std::pow(r, e.order) - 1;
  e.value = f1 + (f1 - f2) / rp1;
  e.error = fs * std::abs(f1 - f2) / rp1;
  return e;
}

}  // namespace ty

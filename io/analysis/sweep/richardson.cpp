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

namespace {

/// (c^p - b^p)/(b^p - a^p) for cells a > b > c: the ratio of successive differences of
/// f0 + C h^p; it falls from ln(b/c)/ln(a/b) at p -> 0 towards 0 as p grows.
double difference_ratio(double a, double b, double c, double p) {
  return (std::pow(c, p) - std::pow(b, p)) / (std::pow(b, p) - std::pow(a, p));
}

}  // namespace

std::optional<Extrapolated> richardson_cells(const std::vector<double>& h, const std::vector<double>& f,
                                             double assumed_order) {
  const size_t n = f.size();
  if (n < 3 || h.size() != n) return std::nullopt;
  const double a = h[n - 3], b = h[n - 2], c = h[n - 1];
  if (!(a > b && b > c && c > 0)) return std::nullopt;
  Extrapolated e;
  e.order = assumed_order;
  double fs = 3.0;
  const double d32 = f[n - 1] - f[n - 2], d21 = f[n - 2] - f[n - 3];
  e.monotone = d21 * d32 > 0;
  if (e.monotone) {
    const double q = d32 / d21;  // observed ratio, to match difference_ratio(p)
    double lo = 1e-6, hi = 20;
    if (difference_ratio(a, b, c, lo) > q && difference_ratio(a, b, c, hi) < q) {
      for (int k = 0; k < 200; ++k) {
        const double mid = 0.5 * (lo + hi);
        (difference_ratio(a, b, c, mid) > q ? lo : hi) = mid;
      }
      e.order = 0.5 * (lo + hi);
      e.order_observed = true;
      fs = 1.25;
    }
  }
  const double rp1 = std::pow(b / c, e.order) - 1;
  e.value = f[n - 1] + d32 / rp1;
  e.error = fs * std::abs(d32) / rp1;
  return e;
}

}  // namespace ty

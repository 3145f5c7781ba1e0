/// \file temperature.cpp
/// \brief The Brillouin function, the mean-field magnetization and the scale factors of a
/// magnet's values with temperature (laws and sources in temperature.h).
#include "materials/crystals/temperature.h"

#include <cmath>

#include "io/scene/constants.h"

namespace ty {

double brillouin(double S, double x) {
  if (std::abs(x) < 1e-4) return (S + 1) / (3 * S) * x;  // the series' first term; the next is O(x^3)
  const double a = (2 * S + 1) / (2 * S), b = 1 / (2 * S);
  return a / std::tanh(a * x) - b / std::tanh(b * x);
}

/// Solves m = B_S(3S/(S+1) m / t) by bisection on (0, 1]: f(m) = m - B_S(...) is negative
/// just above 0 for t < 1 (slope 1 - 1/t) and positive at 1. Written out (twelve lines)
/// rather than pulling in a root-finding library for one scalar equation.
double mean_field_magnetization(double S, double t) {
  if (t <= 0) return 1;
  if (t >= 1) return 0;
  const double c = 3 * S / (S + 1) / t;
  double lo = 0, hi = 1;
  for (int it = 0; it < 100 && hi - lo > 1e-15; ++it) {
    const double m = 0.5 * (lo + hi);
    (m - brillouin(S, c * m) < 0 ? lo : hi) = m;
  }
  return 0.5 * (lo + hi);
}

ThermalScale thermal_scale(const Thermal& th) {
  if (!th.active()) return {};
  const double m = mean_field_magnetization(th.spin, th.temperature / th.ordering);
  const double m_ref = mean_field_magnetization(th.spin, th.reference / th.ordering);
  const double r = m / m_ref;
  return {r, std::pow(r, th.anisotropy_power - 1)};
}

double thermal_linewidth(const Thermal& th) {
  const auto& t = th.linewidth;
  if (t.empty()) return 0;
  const double T = th.temperature;
  if (T <= t.front()[0]) return t.front()[1];
  if (T >= t.back()[0]) return t.back()[1];
  size_t k = 1;
  while (t[k][0] < T) ++k;
  const double u = (T - t[k - 1][0]) / (t[k][0] - t[k - 1][0]);
  return (1 - u) * t[k - 1][1] + u * t[k][1];
}

double damping_from_linewidth(double fwhm, double gamma, double b_exchange, double b_anisotropy) {
  // G (1 + alpha^2) = alpha gamma (B_E + B_A), G = pi fwhm: the smaller root in alpha
  const double r = constants::pi * fwhm / (gamma * (b_exchange + b_anisotropy));
  if (r <= 0) return 0;
  if (r >= 0.5) return 1;  // wider than any Gilbert damping of this line can make it
  return (1 - std::sqrt(1 - 4 * r * r)) / (2 * r);
}

}  // namespace ty

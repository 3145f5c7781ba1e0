/// \file cpml.cpp
/// \brief Grading of the convolutional PML (formulas in cpml.h) and, on graded sides, of
/// the graded loss (graded_loss.h).
#include "solver/grid/cpml.h"

#include <cmath>

#include "io/scene/units.h"
#include "solver/grid/graded_loss.h"

namespace ty {

CpmlAxis make_cpml_axis(int n, int npml, double cell, double dt, const Absorber& p, bool graded_low, bool graded_high) {
  CpmlAxis ax;
  if (npml <= 0) return ax;
  ax.graded[0] = graded_low;
  ax.graded[1] = graded_high;
  const double d = npml;  // thickness in cells
  const double sigma_max = p.strength * 0.8 * (p.grading + 1) / (constants::eta0 * cell);
  const double nu_max = graded_loss_peak(p, d * cell);
  auto depth = [&](double pos) {  // depth into the layer, in cells (0 outside)
    if (pos < d) return d - pos;
    if (pos > n - d) return pos - (n - d);
    return 0.0;
  };
  for (int i = 0; i < n; ++i) {
    const double r0 = depth(i), r1 = depth(i + 0.5);
    if (r0 <= 0 && r1 <= 0) continue;
    ax.lines.push_back(i);
    const bool graded = 2 * i < n ? graded_low : graded_high;
    for (int h = 0; h < 2; ++h) {
      const double rho = std::min(1.0, (h == 0 ? r0 : r1) / d);
      double b = 1, a = 0, km1 = 0, decay = 1;
      if (rho > 0 && graded) {
        decay = std::exp(-0.5 * graded_loss_rate(nu_max, rho, p.grading) * dt);  // half a step
      } else if (rho > 0) {
        const double g = std::pow(rho, p.grading);
        const double sigma = sigma_max * g;
        const double kappa = 1 + (p.kappa_max - 1) * g;
        const double alpha = p.alpha_max * (1 - rho);
        b = std::exp(-(sigma / kappa + alpha) * dt / constants::eps0);
        a = sigma > 0 ? sigma * (b - 1) / (sigma * kappa + kappa * kappa * alpha) : 0.0;
        km1 = 1.0 / kappa - 1.0;
      }
      ax.b[h].push_back(b);
      ax.a[h].push_back(a);
      ax.kinv_m1[h].push_back(km1);
      ax.decay[h].push_back(decay);
    }
  }
  for (int l = 0; l < ax.count(); ++l)
    if (l == 0 || ax.lines[l] != ax.lines[l - 1] + 1) ax.stretch.push_back(l);
  ax.stretch.push_back(ax.count());
  return ax;
}

}  // namespace ty

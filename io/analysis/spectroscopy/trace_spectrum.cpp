/// \file trace_spectrum.cpp
/// \brief The Tukey window, the direct Fourier sum and the anchored phase unwrapping (see
/// trace_spectrum.h).
#include "io/analysis/spectroscopy/trace_spectrum.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "io/scene/constants.h"

namespace ty {

using constants::pi;

double TimeWindow::operator()(double t) const {
  if (!(to > from)) return 1.0;
  if (t <= from || t >= to) return 0.0;
  const double edge = std::min({t - from, to - t});
  if (taper <= 0 || edge >= taper) return 1.0;
  return 0.5 * (1 - std::cos(pi * edge / taper));
}

std::string TimeWindow::describe() const {
  if (!(to > from)) return "none (the whole trace)";
  return fmt::format(
      "Tukey: flat on {:.4g}..{:.4g} ps, raised-cosine edges of {:.4g} ps, zero outside {:.4g}..{:.4g} ps",
      (from + taper) * 1e12, (to - taper) * 1e12, taper * 1e12, from * 1e12, to * 1e12);
}

std::vector<std::complex<double>> fourier(const std::vector<double>& t, const std::vector<double>& x,
                                          const std::vector<double>& freq, const TimeWindow& w) {
  std::vector<std::complex<double>> out(freq.size());
  if (t.size() < 2) return out;
  const double dt = t[1] - t[0];
  std::vector<double> wx(x.size());
  for (size_t k = 0; k < x.size(); ++k) wx[k] = w(t[k]) * x[k];
  for (size_t m = 0; m < freq.size(); ++m) {
    // exp(i w t_k) by a rotation per sample (re-seeded every 1024 samples against drift).
    const double omega = 2 * pi * freq[m];
    const std::complex<double> step(std::cos(omega * dt), std::sin(omega * dt));
    std::complex<double> sum = 0, e;
    for (size_t k = 0; k < wx.size(); ++k) {
      if (k % 1024 == 0) e = std::polar(1.0, omega * t[k]);
      sum += wx[k] * e;
      e *= step;
    }
    out[m] = sum * dt;
  }
  return out;
}

std::vector<double> unwrapped_phase(const std::vector<double>& freq, const std::vector<std::complex<double>>& z,
                                    double anchor) {
  std::vector<double> phi(z.size());
  for (size_t k = 0; k < z.size(); ++k) {
    phi[k] = std::arg(z[k]);
    if (k > 0) phi[k] += 2 * pi * std::round((phi[k - 1] - phi[k]) / (2 * pi));
  }
  if (z.size() < 2) return phi;
  const size_t n = std::max<size_t>(2, static_cast<size_t>(anchor * static_cast<double>(z.size())));
  double sf = 0, sp = 0, sff = 0, sfp = 0;  // least-squares line phi = a + b f
  for (size_t k = 0; k < n; ++k) sf += freq[k], sp += phi[k], sff += freq[k] * freq[k], sfp += freq[k] * phi[k];
  const double b = (n * sfp - sf * sp) / (n * sff - sf * sf), a = (sp - b * sf) / n;
  const double shift = 2 * pi * std::round(a / (2 * pi));
  for (double& p : phi) p -= shift;
  return phi;
}

}  // namespace ty

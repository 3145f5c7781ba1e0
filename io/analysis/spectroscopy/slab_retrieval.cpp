/// \file slab_retrieval.cpp
/// \brief Newton's iteration for n from t, and the r-and-t inversion for eps and mu (see
/// slab_retrieval.h for the sources).
#include "io/analysis/spectroscopy/slab_retrieval.h"

#include <cmath>

#include "io/analysis/spectroscopy/slab_transfer.h"
#include "io/analysis/spectroscopy/trace_spectrum.h"
#include "io/scene/constants.h"

namespace ty {

using constants::c0;
using constants::pi;

namespace {

const cplx I(0, 1);

/// One frequency: Newton on f(n) = H_model(n) / H - 1 (relative, so the tolerance does not
/// depend on |H|); f is analytic in n, so its derivative is taken by a complex difference.
int newton(cplx& n, cplx H, double k0, double d, bool echoes, std::optional<cplx> eps, double& res) {
  auto f = [&](cplx m) {
    const cplx z = eps ? m / *eps : 1.0 / m;
    return slab_transfer(m, z, k0, d, echoes) / H - 1.0;
  };
  for (int it = 0; it < 60; ++it) {
    const cplx fn = f(n);
    res = std::abs(fn);
    if (res < 1e-13) return it;
    const cplx h = 1e-7 * std::max(1.0, std::abs(n));
    const cplx df = (f(n + h) - f(n - h)) / (2.0 * h);
    cplx step = fn / df;
    const double cap = 0.5 * pi / (k0 * d);  // at most a quarter wave of phase per step
    if (std::abs(step) > cap) step *= cap / std::abs(step);
    n -= step;
    if (n.real() < 1e-3) n.real(1e-3);
  }
  res = std::abs(f(n));
  return res < 1e-9 ? 60 : -1;
}

}  // namespace

IndexRetrieval retrieve_index(const std::vector<double>& freq, const std::vector<cplx>& H, double d, bool echoes,
                              std::optional<cplx> eps) {
  IndexRetrieval out;
  const std::vector<double> phi = unwrapped_phase(freq, H);
  for (size_t k = 0; k < freq.size(); ++k) {
    const double k0 = 2 * pi * freq[k] / c0;
    const double np = std::max(1.0 + phi[k] / (k0 * d), 1.0);
    const double kappa = -std::log(std::abs(H[k]) * (1 + np) * (1 + np) / (4 * np)) / (k0 * d);
    cplx n(np, kappa);
    double res = 0;
    int it = newton(n, H[k], k0, d, echoes, eps, res);
    if (it < 0 && k > 0) {  // a sharp resonance can mislead the estimate: go on from the last n
      n = out.n.back();
      it = newton(n, H[k], k0, d, echoes, eps, res);
    }
    out.iterations.push_back(it);
    out.n.push_back(n);
    out.residual.push_back(res);
  }
  return out;
}

EpsMu retrieve_eps_mu(const std::vector<double>& freq, const std::vector<cplx>& r, const std::vector<cplx>& t,
                      double d) {
  EpsMu out;
  double prev = 0;  // the previous frequency's Re(n k0 d), for the branch
  for (size_t k = 0; k < freq.size(); ++k) {
    const double k0 = 2 * pi * freq[k] / c0;
    cplx z = std::sqrt(((1.0 + r[k]) * (1.0 + r[k]) - t[k] * t[k]) / ((1.0 - r[k]) * (1.0 - r[k]) - t[k] * t[k]));
    if (z.real() < 0) z = -z;
    const cplx e = t[k] / (1.0 - r[k] * (z - 1.0) / (z + 1.0));  // e^{i n k0 d}
    cplx q = -I * std::log(e);                                   // principal branch: Re q in (-pi, pi]
    if (k == 0) {
      if (q.real() < 0) q += 2 * pi;  // a slab thinner than a wavelength: 0 <= Re q < 2 pi
    } else {
      q += 2 * pi * std::round((prev - q.real()) / (2 * pi));
    }
    prev = q.real();
    const cplx n = q / (k0 * d);
    out.n.push_back(n);
    out.z.push_back(z);
    out.eps.push_back(n / z);
    out.mu.push_back(n * z);
  }
  return out;
}

}  // namespace ty

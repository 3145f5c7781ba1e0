/// \file eo_detector.cpp
/// \brief The EO crystals' values, their response and its application to a trace (see
/// eo_detector.h for the formulas). The FFT is Eigen's (unsupported/Eigen/FFT, kissfft).
#include "io/analysis/spectroscopy/eo_detector.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cmath>
#include <unsupported/Eigen/FFT>

#include "io/scene/constants.h"
#include "io/scene/diagnostics.h"

namespace ty {

namespace {

using cd = std::complex<double>;

const std::vector<EoCrystal>& crystals() {
  static const std::vector<EoCrystal> list = {
      // ZnTe: eps_inf 7.44, eps_s 10.1, TO 5.3 THz, Gamma 0.09 THz, C = -0.07 and n_g = 3.13 at
      // 800 nm (Leitenstorfer et al., APL 74, 1516 (1999); Gallot et al., APL 74, 3450 (1999):
      // from memory).
      {"ZnTe", 7.44, 10.1, 5.3e12, 0.09e12, -0.07, 3.13,
       "Leitenstorfer et al., APL 74, 1516 (1999); Gallot et al., APL 74, 3450 (1999) (from memory)"},
      // GaP: eps_inf 9.075, eps_s 11.1, TO 10.98 THz, Gamma 0.02 THz, C = -0.53, n_g = 3.67 at
      // 800 nm (Leitenstorfer et al., APL 74, 1516 (1999): from memory).
      {"GaP", 9.075, 11.1, 10.98e12, 0.02e12, -0.53, 3.67, "Leitenstorfer et al., APL 74, 1516 (1999) (from memory)"},
  };
  return list;
}

std::string lower(std::string s) {
  std::transform(s.begin(), s.end(), s.begin(), [](unsigned char c) { return static_cast<char>(std::tolower(c)); });
  return s;
}

/// omega_TO^2 / (omega_TO^2 - omega^2 - i omega Gamma), the phonon's Lorentz factor.
cd lorentz(const EoCrystal& c, double f) { return c.f_to * c.f_to / cd(c.f_to * c.f_to - f * f, -f * c.gamma); }

}  // namespace

EoCrystal eo_crystal(const std::string& name, const std::string& option) {
  for (const EoCrystal& c : crystals())
    if (lower(c.name) == lower(name)) return c;
  throw BadInput(fmt::format("{}: error: no EO crystal '{}' (known: {})", option, name, eo_crystal_names()));
}

std::string eo_crystal_names() {
  std::string s;
  for (const EoCrystal& c : crystals()) s += (s.empty() ? "" : ", ") + c.name;
  return s;
}

cd eo_index(const EoCrystal& c, double f) { return std::sqrt(c.eps_inf + (c.eps_static - c.eps_inf) * lorentz(c, f)); }

cd eo_mismatch(const EoCrystal& c, double f, double L) {
  const cd dkL = 2 * constants::pi * f / constants::c0 * (eo_index(c, f) - c.group_index) * L;
  if (std::abs(dkL) < 1e-6) return 1.0 + cd(0, 0.5) * dkL;  // the series, where the quotient loses digits
  return (std::exp(cd(0, 1) * dkL) - 1.0) / (cd(0, 1) * dkL);
}

cd eo_response(const EoCrystal& c, double f, double L) {
  const cd t = 2.0 / (1.0 + eo_index(c, f)), t0 = 2.0 / (1.0 + eo_index(c, 0));
  const cd chi = 1.0 + c.faust_henry * lorentz(c, f), chi0 = 1.0 + c.faust_henry;
  return t / t0 * eo_mismatch(c, f, L) * chi / chi0;
}

std::vector<double> eo_detected(const EoCrystal& c, double L, const std::vector<double>& time,
                                const std::vector<double>& value) {
  const size_t n = value.size();
  if (n < 2) return value;
  size_t padded = 1;
  while (padded < 4 * n) padded *= 2;
  std::vector<double> x(padded, 0.0);
  std::copy(value.begin(), value.end(), x.begin());
  Eigen::FFT<double> fft;
  std::vector<cd> X;
  fft.fwd(X, x);  // X_m = sum_k x_k exp(-2 pi i m k / N): frequency -m/(N dt) in exp(-i omega t)
  const double df = 1.0 / (padded * (time[1] - time[0]));
  for (size_t m = 0; m < padded; ++m) {
    // bin m holds f = -m df (m <= N/2) or (N - m) df: conjugate symmetry keeps x real
    const double f = m <= padded / 2 ? static_cast<double>(m) * df : (static_cast<double>(padded) - m) * df;
    const cd R = eo_response(c, f, L);
    X[m] *= m <= padded / 2 ? std::conj(R) : R;
  }
  std::vector<double> y;
  fft.inv(y, X);
  y.resize(n);
  return y;
}

}  // namespace ty

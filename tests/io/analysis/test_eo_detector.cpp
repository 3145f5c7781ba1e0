/// \file test_eo_detector.cpp
/// \brief The electro-optic detector response (io/analysis/spectroscopy/eo_detector.h) against
/// the published forms of Gallot & Grischkowsky, J. Opt. Soc. Am. B 16, 1204 (1999) and
/// Leitenstorfer et al., Appl. Phys. Lett. 74, 1516 (1999) (from memory): the velocity-mismatch
/// factor is the mean of exp(i dk z) over the crystal, i.e. exp(i dk L/2) sin(dk L/2)/(dk L/2)
/// for a lossless crystal; the response tends to 1 at low frequency (normalised); chi2 vanishes
/// where 1 + C w_TO^2/(w_TO^2 - w^2) = 0, at f_TO sqrt(1 + C) (undamped); and a response applied
/// to sample and reference alike cancels in t(f) = S(f)/R(f) (a fact of ratio measurements).
#include <doctest/doctest.h>

#include <cmath>

#include "io/analysis/spectroscopy/eo_detector.h"
#include "io/analysis/spectroscopy/trace_spectrum.h"
#include "io/scene/constants.h"

using namespace ty;
using constants::c0;
using constants::pi;
using cd = std::complex<double>;

TEST_CASE("EO detector: the velocity-mismatch factor against the mean of exp(i dk z) and the sinc form") {
  EoCrystal c = eo_crystal("ZnTe");
  c.gamma = 0;  // lossless: dk real
  for (double L : {0.3e-3, 1e-3, 2e-3})
    for (double f : {0.3e12, 1e12, 2e12, 2.6e12}) {
      // the index of the one-phonon Lorentz form, written out here
      const double w2 = f * f, wt2 = c.f_to * c.f_to;
      const double n = std::sqrt(c.eps_inf + (c.eps_static - c.eps_inf) * wt2 / (wt2 - w2));
      const double dk = 2 * pi * f / c0 * (n - c.group_index);
      const cd sinc = std::exp(cd(0, dk * L / 2)) * std::sin(dk * L / 2) / (dk * L / 2);
      cd mean = 0;  // the midpoint rule over 4000 slices of the crystal
      for (int q = 0; q < 4000; ++q) mean += std::exp(cd(0, dk * L * (q + 0.5) / 4000)) / 4000.0;
      const cd G = eo_mismatch(c, f, L);
      INFO("L " << L << " f " << f);
      CHECK(std::abs(G - sinc) < 1e-12);
      CHECK(std::abs(G - mean) < 1e-6);
    }
  // ZnTe's THz index near 1 THz, about 3.17-3.2 as measured by THz-TDS (Gallot, Zhang, McGowan,
  // Jeon & Grischkowsky, APL 74, 3450 (1999), from memory): the table's Lorentz values meet it
  CHECK(std::abs(eo_index(eo_crystal("znte"), 1e12).real() - 3.18) < 0.03);
}

TEST_CASE("EO detector: the response tends to 1 at low frequency and chi2 vanishes at f_TO sqrt(1 + C)") {
  for (const char* name : {"ZnTe", "GaP"}) {
    EoCrystal c = eo_crystal(name);
    // |R| -> 1; its phase -> dk L / 2, the delay between the THz wave and the gate (linear in f)
    CHECK(std::abs(std::abs(eo_response(c, 1e9, 1e-3)) - 1.0) < 1e-3);
    CHECK(std::abs(eo_response(c, 1e6, 1e-3) - 1.0) < 1e-5);
    const double half_dkL = pi * 1e9 / c0 * (std::sqrt(c.eps_static) - c.group_index) * 1e-3;
    CHECK(std::arg(eo_response(c, 1e9, 1e-3)) == doctest::Approx(half_dkL).epsilon(1e-2).scale(0));
    c.gamma = 0;
    const double f0 = c.f_to * std::sqrt(1 + c.faust_henry);
    INFO(name << ": chi2's zero at " << f0 / 1e12 << " THz");
    CHECK(std::abs(eo_response(c, f0, 1e-4)) < 1e-9);
    CHECK(std::abs(eo_response(c, 0.9 * f0, 1e-4)) > 1e-2);
  }
  CHECK_THROWS(eo_crystal("quartz"));
}

TEST_CASE("EO detector: a response applied to sample and reference cancels in t(f), and the trace spectrum is R X") {
  // A single-cycle reference pulse and a sample pulse delayed by tau and scaled by a: t = a e^{i w tau}.
  const double dt = 20e-15, t0 = 5e-12, s = 0.25e-12, tau = 1.7e-12, a = 0.6;
  std::vector<double> time, ref, smp;
  for (int k = 0; k < 4000; ++k) {
    const double t = (k + 1) * dt;
    auto pulse = [&](double u) { return -(u - t0) / s * std::exp(-0.5 * std::pow((u - t0) / s, 2)); };
    time.push_back(t), ref.push_back(pulse(t)), smp.push_back(a * pulse(t - tau));
  }
  const EoCrystal c = eo_crystal("ZnTe");
  const auto ref_d = eo_detected(c, 1e-3, time, ref), smp_d = eo_detected(c, 1e-3, time, smp);
  double change = 0, peak = 0;
  for (size_t k = 0; k < ref.size(); ++k)
    change = std::max(change, std::abs(ref_d[k] - ref[k])), peak = std::max(peak, std::abs(ref[k]));
  CHECK(change > 0.05 * peak);  // the crystal does reshape the pulse
  const std::vector<double> freq = {0.2e12, 0.5e12, 1.0e12, 1.5e12, 2.0e12};
  const auto R = fourier(time, ref, freq, {}), Rd = fourier(time, ref_d, freq, {}), Sd = fourier(time, smp_d, freq, {});
  for (size_t m = 0; m < freq.size(); ++m) {
    const cd t_true = a * std::exp(cd(0, 2 * pi * freq[m] * tau));
    INFO("at " << freq[m] / 1e12 << " THz");
    CHECK(std::abs(Sd[m] / Rd[m] - t_true) < 1e-6);
    CHECK(std::abs(Rd[m] - eo_response(c, freq[m], 1e-3) * R[m]) < 1e-6 * std::abs(R[m]));
  }
}

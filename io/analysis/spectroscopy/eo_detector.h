/// \file eo_detector.h
/// \brief The response of an electro-optic (EO) detector crystal, and its application to a
/// probe's time trace: the trace a THz lab records with a ZnTe or GaP crystal gated by a short
/// optical pulse.
///
/// Response (fields ~ exp(-i omega t); Gallot & Grischkowsky, J. Opt. Soc. Am. B 16, 1204
/// (1999), and Leitenstorfer, Hunsche, Shah, Nuss & Knox, Appl. Phys. Lett. 74, 1516 (1999) --
/// both from memory): the detected spectrum is the THz field's times
///   R(omega) = t(omega) G(omega) chi2(omega), normalised here to R(0) = 1:
///   t(omega)    = 2 / (1 + n(omega))                       (the field entering the crystal)
///   G(omega)    = (exp(i dk L) - 1) / (i dk L),  dk = (omega/c) (n(omega) - n_g)
///                 (the THz phase against the optical gate's group velocity, averaged over the
///                 crystal's length L: the velocity-mismatch factor)
///   chi2(omega) = 1 + C omega_TO^2 / (omega_TO^2 - omega^2 - i omega Gamma)
///                 (the EO coefficient r41's dispersion near the TO phonon; C the Faust-Henry
///                 coefficient)
///   n(omega)^2  = eps_inf + (eps_s - eps_inf) omega_TO^2 / (omega_TO^2 - omega^2 - i omega Gamma)
///                 (the crystal's one-phonon Lorentz permittivity).
/// Echoes inside the crystal and the optical pulse's length are left out (a gate much shorter
/// than the THz period).
#pragma once
#include <complex>
#include <string>
#include <vector>

namespace ty {

struct EoCrystal {
  std::string name;
  double eps_inf = 0, eps_static = 0;  ///< THz permittivity below and above the TO phonon
  double f_to = 0, gamma = 0;          ///< TO phonon frequency and damping rate Gamma / 2 pi, Hz
  double faust_henry = 0;              ///< C
  double group_index = 0;              ///< of the 800 nm gate pulse
  std::string source;                  ///< where the values come from
};

/// "ZnTe" or "GaP" (any case); BadInput naming the option otherwise.
EoCrystal eo_crystal(const std::string& name, const std::string& option = "--detector");
/// The crystals known, for messages: "ZnTe, GaP".
std::string eo_crystal_names();

/// The crystal's THz refractive index n + i kappa at f (Hz).
std::complex<double> eo_index(const EoCrystal& c, double f);
/// G(f) alone (the velocity-mismatch factor) for a crystal of thickness L (m).
std::complex<double> eo_mismatch(const EoCrystal& c, double f, double L);
/// R(f) / R(0) for a crystal of thickness L (m).
std::complex<double> eo_response(const EoCrystal& c, double f, double L);

/// The trace as the crystal records it: the trace's spectrum (zero-padded to at least four
/// times its length, an FFT) times R(f), back to time; the trace keeps its length. A
/// response applied to the sample and the reference alike cancels in their ratio t(f).
std::vector<double> eo_detected(const EoCrystal& c, double L, const std::vector<double>& time,
                                const std::vector<double>& value);

}  // namespace ty

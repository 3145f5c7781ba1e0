/// \file spectrum.h
/// \brief Reflectance, transmittance and absorptance against frequency from power-spectrum
/// lines of a run and of its reference run (the same scene without the sample):
///   T(f) = P_sample(transmitted line) / P_incident
///   R(f) = -P[E_sample - E_reference, H_sample - H_reference](reflected line) / P_incident
///   A = 1 - R - T
/// The scattered field is the difference of the two runs' transformed fields, so the
/// incident wave cancels exactly wherever the reflected line lies: between the source and
/// the sample, or behind a one-sided source, where only the reflected wave exists.
/// P_incident is the reference run's power through a line that carries the incident wave:
/// the ratio's own line when its reference power is not negligible, else the other line
/// (a reflected line behind a one-sided source sees no incident power: R then uses the
/// transmitted line's). A line's reference power is negligible when its peak over the band
/// is below kNegligiblePower of the largest power through the lines (either run); a ratio
/// with no line carrying the incident power is refused (BadInput), and so is a frequency where
/// the incident power falls below kNegligiblePower of its own peak over the band.
#pragma once
#include <string>
#include <vector>

#include "io/analysis/power_spectrum_line.h"

namespace ty {

/// One line as the run and its reference run recorded it.
struct LinePair {
  PowerSpectrumLine sample, reference;
};

struct SpectrumResult {
  std::vector<double> freq, R, T;                ///< R or T empty when its line was not given
  std::string R_incident_line, T_incident_line;  ///< whose reference power normalised them
  bool has_both() const { return !R.empty() && !T.empty(); }
};

inline constexpr double kNegligiblePower = 1e-6;

/// R and/or T (either pair may be null, not both).
SpectrumResult reflectance_transmittance(const LinePair* reflected, const LinePair* transmitted);

}  // namespace ty

/// \file jones_measurement.h
/// \brief The Jones matrix of a sample measured from probe traces (the (Ez-wave, Hz-wave) basis
/// and the signs of polarization.h, fields ~ exp(-i omega t)).
///
/// A column of J needs a run driven by that input polarization and its reference run: at a
/// probe recording Ez and Hz, with F(f) the transform of the whole trace (trace_spectrum.h), or
/// on a power-spectrum line, F(f) its weighted line mean (line_spectrum.h),
/// E.z = Ez and, for a wave travelling along +k, E.u = eta0 Hz (E = eta0 H x k):
///   transmitted (probe behind the sample): J[0][in] = Ez_s / A,  J[1][in] = eta0 Hz_s / A
///   reflected (probe before it, the scattered field s - r travelling along -k):
///                     J[0][in] = (Ez_s - Ez_r) / A,  J[1][in] = -eta0 (Hz_s - Hz_r) / A
/// with A the reference run's incident amplitude of the input polarization there (Ez_r for the
/// Ez wave, eta0 Hz_r for the Hz wave). Transmitted J is referred to the probe (the sample's J
/// times exp(-i k0 d), line_spectrum.h); reflected J to the probe too (times exp(2 i k0 L), L
/// the probe's distance before the reflecting face) unless moved to the face.
#pragma once
#include <string>
#include <vector>

#include "io/analysis/spectroscopy/polarization.h"

namespace ty {

/// One input polarization: the spectra of Ez and Hz (A/m) at the probe or line in the sample
/// run and in its reference run, at the frequencies of the measurement.
struct PolarizedSpectra {
  std::vector<std::complex<double>> ez, hz, ez_ref, hz_ref;
  int input = 0;  ///< 0: driven by the Ez wave, 1: by the Hz wave
};

/// From a probe: reads the four traces (BadInput where a run lacks the probe, Ez or Hz, or the
/// time axes differ), finds the input from the reference (0 where its peak |Ez| exceeds its
/// peak eta0 |Hz|) and transforms the whole traces at freq (empty: the band where the
/// reference's own component is above 1% of its peak, `count` frequencies; freq is then set).
PolarizedSpectra probe_spectra(const std::string& run, const std::string& reference, const std::string& probe,
                               std::vector<double>& freq, int count);
/// From a power-spectrum line: its weighted line means at the line's own frequencies (freq is
/// set to them); the input is the component the reference carries more of (line_spectrum.h).
PolarizedSpectra line_spectra(const std::string& run, const std::string& reference, const std::string& line,
                              std::vector<double>& freq);

/// J at each frequency; columns[in] tells which columns were measured (the others are zero).
struct JonesSpectrum {
  std::vector<double> freq;
  std::vector<Jones> J;
  bool columns[2] = {false, false};
};
/// inputs: one or two (different polarizations). face_distance >= 0 with `reflected`: J is
/// moved from the probe to the face that far behind it (times exp(-2 i k0 L)).
JonesSpectrum measure_jones(const std::vector<PolarizedSpectra>& inputs, const std::vector<double>& freq,
                            bool reflected, double face_distance = -1);

}  // namespace ty

/// \file jones_measurement.h
/// \brief The Jones matrix of a sample measured from probe traces (the (Ez-wave, Hz-wave) basis
/// and the signs of polarization.h, fields ~ exp(-i omega t)).
///
/// A column of J needs a run driven by that input polarization and its reference run: at a
/// probe recording Ez and Hz, with F(f) the transform of the whole trace (trace_spectrum.h),
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
#include "io/analysis/spectroscopy/probe_trace.h"

namespace ty {

/// One input polarization: the probe's Ez and Hz in the sample run and in its reference run.
struct PolarizedRuns {
  ProbeTrace ez, hz, ez_ref, hz_ref;
  int input = 0;  ///< 0: driven by the Ez wave, 1: by the Hz wave (driven_polarization)
};

/// Reads the four traces (BadInput where a run lacks the probe, Ez or Hz, or the time axes
/// differ) and finds the input polarization from the reference run.
PolarizedRuns read_polarized_runs(const std::string& run, const std::string& reference, const std::string& probe);

/// 0 where the reference's peak |Ez| exceeds its peak eta0 |Hz|, else 1.
int driven_polarization(const ProbeTrace& ez_ref, const ProbeTrace& hz_ref);

/// J at each frequency; columns[in] tells which columns were measured (the others are zero).
struct JonesSpectrum {
  std::vector<double> freq;
  std::vector<Jones> J;
  bool columns[2] = {false, false};
};
/// runs: one or two inputs (different polarizations). face_distance >= 0 with `reflected`: J is
/// moved from the probe to the face that far behind it (times exp(-2 i k0 L)).
JonesSpectrum measure_jones(const std::vector<PolarizedRuns>& runs, const std::vector<double>& freq, bool reflected,
                            double face_distance = -1);

}  // namespace ty

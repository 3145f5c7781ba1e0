/// \file power_spectrum_line.h
/// \brief One power-spectrum line of a finished run (/power-spectra/NAME/..., written by
/// io/run/run_folder from the solver's PowerSpectrumRecorder): its frequencies, quadrature
/// weights, normal and the transformed E and H on its points; and the time-averaged power
/// through it, P(f) = sum_p w_p 1/2 Re(E x H*) . n (Poynting's theorem for time-harmonic
/// fields, Jackson, Classical Electrodynamics, 3rd ed., sec. 6.9), W per metre along z.
#pragma once
#include <complex>
#include <string>
#include <vector>

namespace ty {

struct PowerSpectrumLine {
  std::string file, name;                    ///< where it was read from (for messages)
  std::vector<double> freq, weight, normal;  ///< Hz; m; the unit normal (x, y)
  std::vector<double> re, im;                ///< [frequency][point][Ex Ey Ez Hx Hy Hz]
  size_t points = 0;
  std::complex<double> at(size_t f, size_t p, int c) const {
    const size_t k = (f * points + p) * 6 + c;
    return {re[k], im[k]};
  }
};

/// RUN/fields.h5's line `name`; BadInput (file: error: ...) when the run has none.
PowerSpectrumLine read_power_spectrum_line(const std::string& run, const std::string& name);
bool has_power_spectrum_line(const std::string& run, const std::string& name);
/// The axis (0: x, 1: y) the run's power-spectrum lines face: y if any line's normal is
/// along y, else x.
int power_spectrum_normal_axis(const std::string& run);

/// The power through the line at each of its frequencies, of a's fields, or with `minus` of
/// the difference a - minus (the scattered field when minus is the reference run's line).
std::vector<double> line_power(const PowerSpectrumLine& a, const PowerSpectrumLine* minus = nullptr);

}  // namespace ty

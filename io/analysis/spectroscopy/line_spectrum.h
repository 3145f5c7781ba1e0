/// \file line_spectrum.h
/// \brief Complex t(f) and r(f) from power-spectrum lines (exp(-i omega t), see
/// docs/measurements.md): the weighted line mean of one field component in the run over the
/// same in the reference run,
///   t(f) = <F_sample> / <F_reference>                (a line behind the sample)
///   r(f) = <F_sample - F_reference> / <F_reference>  (a line before it: the scattered wave)
/// with <F> = sum_p w_p F_p / sum_p w_p. F is the polarization's own out-of-plane component:
/// Ez for an Ez wave, Hz for an Hz wave; r of an Hz wave is turned to the transverse E's
/// (its sign flips: the reflected E = -eta H x k). Both are referred to their lines: t is
/// the sample's transmission over the same path in vacuum (for a slab of thickness d,
/// t_slab e^{-i k0 d}); r carries e^{2 i k0 L} for a line L before the reflecting face.
/// r needs the reference's line mean on the reflected line to carry the incident wave: a
/// reflected line behind a one-sided source sees none, and r is then left out.
#pragma once
#include <complex>
#include <vector>

#include "io/analysis/spectrum.h"

namespace ty {

/// <F> of component c at frequency index f: the weighted mean over the line's points (of the
/// difference a - minus, with minus the reference run's line).
std::complex<double> line_mean(const PowerSpectrumLine& a, const PowerSpectrumLine* minus, size_t f, int c);

/// 2 (Ez) or 5 (Hz): the component whose reference line mean is the larger over the band.
int dominant_polarization(const PowerSpectrumLine& reference);

/// t at the transmitted line; r at the reflected line (nullptr, or r_incident false: not
/// measured).
struct ComplexSpectrum {
  std::vector<std::complex<double>> t, r;
};
ComplexSpectrum complex_spectrum(const LinePair* reflected, const LinePair* transmitted, int component,
                                 bool r_incident);

}  // namespace ty

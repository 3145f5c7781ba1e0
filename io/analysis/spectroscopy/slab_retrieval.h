/// \file slab_retrieval.h
/// \brief The optical constants of a homogeneous slab from its measured spectra (convention
/// exp(-i omega t), n = n' + i kappa with kappa >= 0 for a passive slab):
///
/// - From t alone (time-domain spectroscopy): n solves H_model(n) = H_measured with
///   H_model the slab transfer of slab_transfer.h (with or without the echo term FP),
///   by Newton's iteration on the complex n (Duvillaret, Garet & Coutaz, IEEE J. Sel. Top.
///   Quantum Electron. 2, 739 (1996); Dorney, Baraniuk & Mittleman, J. Opt. Soc. Am. A 18,
///   1562 (2001)). The impedance follows n: z = 1/n for a non-magnetic slab, z = n/eps for a
///   slab of known permittivity eps (then mu = n^2/eps). The start at each frequency is the
///   thick-slab estimate n' = 1 + phi/(k0 d), kappa = -ln(|H| (1+n')^2 / (4 n')) / (k0 d),
///   phi the unwrapped phase of H (trace_spectrum.h), so the branch follows the phase; where
///   Newton does not converge from there (near a sharp resonance), it starts again from the
///   previous frequency's n.
/// - From r and t together (both eps and mu): Smith, Schultz, Markos & Soukoulis,
///   Phys. Rev. B 65, 195104 (2002), eq. 3-4 in the exp(-i omega t) convention:
///     z = +-sqrt[((1+r)^2 - t^2) / ((1-r)^2 - t^2)],  Re z >= 0
///     e^{i n k0 d} = t / (1 - r (z-1)/(z+1)),  n = [-i ln(e^{i n k0 d}) + 2 pi m] / (k0 d)
///   with r, t the slab's own (slab_r, slab_t: referred to its faces), the branch m chosen by
///   continuity from the lowest frequency (m = 0 there: a slab thinner than a wavelength in
///   it), eps = n/z and mu = n z.
#pragma once
#include <complex>
#include <optional>
#include <vector>

namespace ty {

struct IndexRetrieval {
  std::vector<std::complex<double>> n;
  std::vector<int> iterations;   ///< Newton steps per frequency (-1: did not converge)
  std::vector<double> residual;  ///< |H_model(n) - H| / |H| at the end
};

/// n at each frequency from H = sample / reference. eps: none for a non-magnetic slab,
/// else the slab's permittivity (mu is then n^2 / eps).
IndexRetrieval retrieve_index(const std::vector<double>& freq, const std::vector<std::complex<double>>& H,
                              double thickness, bool echoes, std::optional<std::complex<double>> eps = {});

struct EpsMu {
  std::vector<std::complex<double>> n, z, eps, mu;
};

/// eps and mu from the slab's own r and t (referred to its faces).
EpsMu retrieve_eps_mu(const std::vector<double>& freq, const std::vector<std::complex<double>>& r,
                      const std::vector<std::complex<double>>& t, double thickness);

}  // namespace ty

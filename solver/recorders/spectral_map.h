/// \file spectral_map.h
/// \brief The spectral-map recorder: complex amplitudes of the six field components at
/// chosen frequencies over a region, from which the steady-state intensity, phase and the
/// time-averaged Poynting vector 1/2 Re(E x H*) follow.
///
/// Every component is averaged to the Ez nodes (cell corners: Ex and Hy over their two
/// neighbours along x, Ey and Hx along y, Hz over four) and transformed at its own time
/// level. Each frequency is accumulated over the last whole number of its periods that fits
/// in the second half of the run (so cw ramps and transits are left out; rounded to a whole
/// number of sampling intervals, dft_every) and normalised by 2/window, so that a steady
/// wave of amplitude A gives |X| = A whatever the run length.
#pragma once
#include <complex>
#include <string>
#include <vector>

#include "io/scene/scene.h"
#include "solver/grid/yee_grid.h"

namespace ty {

struct SpectralMap {
  std::string name;
  std::vector<std::string> fields;
  std::vector<double> freq;          ///< Hz
  std::vector<long> first_step;      ///< per frequency: the step its window starts at
  long start = 0;                    ///< the earliest of them
  std::vector<double> window;        ///< per frequency: the window's length, s
  int i0 = 0, j0 = 0, ni = 0, nj = 0, stride = 1;  ///< Ez nodes of the region
  int every = 1;                     ///< steps between samples (dft_every), ending with the last step
  std::vector<double> x, y;          ///< their positions, user coordinates
  std::vector<std::complex<double>> acc;  ///< [f][point][component]
  std::vector<double> value;         ///< this step's six averaged values per point (scratch)
  std::complex<double> field(std::size_t f, std::size_t p, int c) const {
    return acc[(f * static_cast<std::size_t>(ni) * nj + p) * 6 + c] * (2.0 / window[f]);
  }
};

SpectralMap make_spectral_map(const Scene& s, const Output& o, const YeeGrid& g, long total_steps);

}  // namespace ty

/// \file power_spectrum.h
/// \brief The power-spectrum recorder: a running discrete Fourier transform of all six field
/// components at points along a line, from which the net power through the line per
/// frequency follows (and, given a reference run, the scattered part).
///
/// Each component is transformed at its own time level (E at (n+1) dt, H at (n+1/2) dt),
/// X(f) = (2/T) sum_n x(t_n) exp(+i 2 pi f t_n) M dt over every M-th step (dft_every) with
/// T the run's length, so that a steady wave of amplitude A gives |X| = A (the
/// exp(-i w t) convention of the outputs).
/// The power is P(f) = sum_points w 1/2 Re[(E x H*) . n], w the line length a point
/// stands for and n = z x (to - from)/|to - from|, in W/m.
#pragma once
#include <array>
#include <complex>
#include <string>
#include <vector>

#include "io/scene/scene.h"
#include "solver/recorders/recorders.h"

namespace ty {

struct PowerSpectrumRecorder {
  std::string name;
  Vec2 normal;  ///< z x (to - from), unit
  std::vector<double> freq;                     ///< Hz
  std::vector<Vec2> points;                     ///< internal coordinates
  std::vector<double> weight;                   ///< m per point
  std::vector<std::array<PointStencil, 6>> stencil;
  std::vector<std::complex<double>> acc;        ///< [f][point][component], sum of x exp(i w t) dt
  std::vector<double> value;                    ///< this step's six values per point (scratch)
  long steps = 0;
  int every = 1;  ///< steps between samples (dft_every), ending with the run's last step

  std::complex<double> field(std::size_t f, std::size_t p, int c, double run_time) const {
    return acc[(f * points.size() + p) * 6 + c] * (2.0 / run_time);
  }
};

/// Points one cell apart (or closer) along the output's line.
PowerSpectrumRecorder make_power_spectrum(const Scene& s, const Output& o, const YeeGrid& g, long total_steps);

/// Net power per frequency through the line, W/m, from the (optionally differenced)
/// transformed fields E, H (H in A/m) given as a function of (f, point, component).
template <class Field>
std::vector<double> line_power(const PowerSpectrumRecorder& r, Field&& field) {
  std::vector<double> P(r.freq.size(), 0.0);
  for (std::size_t f = 0; f < r.freq.size(); ++f)
    for (std::size_t p = 0; p < r.points.size(); ++p) {
      std::complex<double> E[3], H[3];
      for (int c = 0; c < 3; ++c) E[c] = field(f, p, c), H[c] = field(f, p, c + 3);
      const std::complex<double> sx = E[1] * std::conj(H[2]) - E[2] * std::conj(H[1]);
      const std::complex<double> sy = E[2] * std::conj(H[0]) - E[0] * std::conj(H[2]);
      P[f] += r.weight[p] * 0.5 * (sx.real() * r.normal.x + sy.real() * r.normal.y);
    }
  return P;
}

}  // namespace ty

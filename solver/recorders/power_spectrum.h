/// \file power_spectrum.h
/// \brief The power-spectrum recorder: a running discrete Fourier transform of all six field
/// components at points along a line, from which the net power through the line per
/// frequency follows (and, given a reference run, the scattered part).
///
/// Each component is transformed at its own time level (E at (n+1) dt, H at (n+1/2) dt),
/// X(f) = (2/T) sum_n x(t_n) exp(+i 2 pi f t_n) M dt over every M-th step (dft_every) in
/// the frequency's window of length T, so that a steady wave of amplitude A gives |X| = A
/// (the exp(-i w t) convention of the outputs). The window is the whole run when every
/// source is a pulse; with a cw source, the last whole number of each frequency's periods in
/// the run's second half, as for spectral maps (sampling.h, DftWindows).
/// The power is P(f) = sum_points w 1/2 Re[(E x H*) . n], w the line length a point
/// stands for and n = z x (to - from)/|to - from|, in W/m.
#pragma once
#include <algorithm>
#include <array>
#include <cmath>
#include <complex>
#include <string>
#include <vector>

#include "io/scene/scene.h"
#include "io/scene/units.h"
#include "solver/grid/poynting.h"
#include "solver/recorders/sampling.h"

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
  DftWindows win;
  long steps = 0;  ///< steps recorded so far
  double dt = 0;

  std::complex<double> field(std::size_t f, std::size_t p, int c) const {
    return acc[(f * points.size() + p) * 6 + c] * (2.0 / win.seconds(f, dt));
  }

  /// After step k of total: on a sampling step, adds each component at its own time
  /// (E at (k+1) dt, H at (k+1/2) dt) to the sums; the frequencies split over the threads.
  template <class R>
  void record(long k, long total, const R* const* F, int threads) {
    if (!begin(k, total)) return;
    for (size_t p = 0; p < points.size(); ++p)
      for (int c = 0; c < 6; ++c) value[p * 6 + c] = scaled(c, stencil[p][c](F[c]));
    add(k, total, threads);
  }
  /// The same from the stencils' values taken earlier (raw[p * 6 + c], as stored: eta0 H), for
  /// a block's recorders (solver/blocking/recorder_taps.h).
  void record_values(long k, long total, const double* raw, int threads) {
    if (!begin(k, total)) return;
    for (size_t p = 0; p < value.size(); ++p) value[p] = scaled(static_cast<int>(p % 6), raw[p]);
    add(k, total, threads);
  }
  /// Whether step k of total is sampled (the sums restarted first where a window begins).
  bool begin(long k, long total) {
    steps = k + 1;
    if (win.restarts(k)) std::fill(acc.begin(), acc.end(), std::complex<double>{});
    return win.sampled(k, total);
  }
  static double scaled(int c, double stored) { return c < 3 ? stored : stored / constants::eta0; }
  void add(long k, long total, int threads) {
    const size_t np = points.size();
    std::complex<double>* sums = acc.data();
    const double* val = value.data();
    const double* fr = freq.data();
#pragma omp parallel for schedule(static) num_threads(threads)
    for (long fi = 0; fi < static_cast<long>(freq.size()); ++fi) {
      if (!win.inside(static_cast<std::size_t>(fi), k, total)) continue;
      add_six(sums + static_cast<size_t>(fi) * np * 6, val, 0, static_cast<long>(np), win.phasors(fr[fi], k, dt));
    }
  }
  template <class Fn>
  void visit_state(Fn&& f) {  // complex sums as pairs of doubles
    f("power-spectra/" + name, reinterpret_cast<double*>(acc.data()), 2 * acc.size());
  }
};

/// Points one cell apart (or closer) along the output's line. every = 0: the sampling interval
/// chosen from the window; rule and block as for spectral maps (`stop: auto` runs).
PowerSpectrumRecorder make_power_spectrum(const Scene& s, const Output& o, const YeeGrid& g, long total_steps,
                                          WindowRule rule, int every = 0, long block = 0);
/// The window rule of a run of fixed length: whole_run when every source is a pulse, else last_half.
WindowRule power_spectrum_rule(const Scene& s);

/// Net power per frequency through the line, W/m, from the (optionally differenced)
/// transformed fields E, H (H in A/m) given as a function of (f, point, component).
template <class Field>
std::vector<double> line_power(const PowerSpectrumRecorder& r, Field&& field) {
  std::vector<double> P(r.freq.size(), 0.0);
  for (std::size_t f = 0; f < r.freq.size(); ++f)
    for (std::size_t p = 0; p < r.points.size(); ++p) {
      std::complex<double> E[3], H[3];
      for (int c = 0; c < 3; ++c) E[c] = field(f, p, c), H[c] = field(f, p, c + 3);
      const auto S = poynting(E, H);
      P[f] += r.weight[p] * (S[0].real() * r.normal.x + S[1].real() * r.normal.y);
    }
  return P;
}

}  // namespace ty

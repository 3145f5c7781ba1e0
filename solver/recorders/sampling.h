/// \file sampling.h
/// \brief What every recorder shares: bilinear point stencils, the sampling interval of
/// running DFTs, and the names and units of the recordable fields.
#pragma once
#include <array>
#include <complex>
#include <string>
#include <vector>

#include "io/scene/constants.h"
#include "io/scene/scene.h"
#include "solver/grid/yee_grid.h"

namespace ty {

/// Steps between the samples of a running DFT (power-spectrum lines, spectral maps): every step would
/// be wasted work, since the fields hold nothing above the sources' bands. Sampling every M
/// steps (the last step always among them) with M dt <= 1/(8 f_max), f_max the highest of
/// the recorder's frequencies and the sources' band edges, aliases nothing below 7 f_max
/// onto the recorded band (harmonics of a driven magnet up to the sixth included), and the
/// sum with weight M dt is the same Riemann sum of the Fourier integral. M is also kept at
/// most window / 400, so short windows sample every step.
int dft_every(const Scene& s, double f_max, double dt, long window_steps);

/// Where each frequency of a running DFT sums, and over how long it is normalised. Samples
/// are the steps k with (total - 1 - k) % every == 0 (the last step always among them).
/// A frequency's window is the `length` steps that end with the run's last step, or, with
/// blocks (runs that stop by themselves, cw), the `length` steps that end with each
/// multiple of `block`: the sums restart at every block, so at a block's end they hold that
/// block's DFT alone. length 0 = every step since the first, normalised by the run's
/// planned length (a self-stopping run's limit), so that runs of one scene that stop at
/// different steps still share one normalisation.
struct DftWindows {
  int every = 1;
  long block = 0;
  long planned = 0;          ///< the run's planned steps
  std::vector<long> length;  ///< per frequency, steps

  bool sampled(long k, long total) const { return (total - 1 - k) % every == 0; }
  bool inside(std::size_t f, long k, long total) const {
    if (length[f] == 0) return true;
    const long end = block > 0 ? (k / block + 1) * block : total;
    return k >= end - length[f];
  }
  /// The sums restart before step k.
  bool restarts(long k) const { return block > 0 && k > 0 && k % block == 0; }
  /// Normalisation time of frequency f, s.
  double seconds(std::size_t f, double dt) const { return (length[f] == 0 ? planned : length[f]) * dt; }
  /// The earliest step anything sums at in a run of `total` steps without blocks.
  long first(long total) const;

  /// The weights of step k's samples at frequency f (Hz): every * dt * exp(i w t), with E
  /// taken at t = (k+1) dt and H at t = (k+1/2) dt, each at its own time level (the
  /// rectangle rule of the Fourier integral over the window).
  struct Phasors {
    std::complex<double> e, h;
  };
  Phasors phasors(double f, long k, double dt) const {
    const double w = 2 * constants::pi * f, w_dt = dt * every;
    return {std::polar(w_dt, w * ((k + 1) * dt)), std::polar(w_dt, w * ((k + 0.5) * dt))};
  }
};

/// Adds points [p0, p1)'s six values (layout [point][Ex Ey Ez Hx Hy Hz]) times their step's
/// weights to the running sums of one frequency (same layout).
inline void add_six(std::complex<double>* sums, const double* value, long p0, long p1, DftWindows::Phasors w) {
  for (long p = p0; p < p1; ++p) {
    for (int c = 0; c < 3; ++c) sums[p * 6 + c] += value[p * 6 + c] * w.e;
    for (int c = 3; c < 6; ++c) sums[p * 6 + c] += value[p * 6 + c] * w.h;
  }
}

/// How a recorder's DFT windows are laid out.
enum class WindowRule {
  whole_run,        ///< everything from step 0 (pulsed runs)
  last_half,        ///< per frequency, the last whole number of its periods in the run's second half (cw)
  blocks,           ///< per frequency, whole periods at the end of each block (cw runs that stop by themselves)
};
/// every: the sampling interval; block: the block length (blocks only; a multiple of every).
DftWindows make_windows(const std::vector<double>& freq, WindowRule rule, long total, double dt, int every, long block);

/// Bilinear interpolation stencil of one component at a point.
struct PointStencil {
  std::array<long, 4> index{};
  std::array<double, 4> weight{};
  template <class R>
  double operator()(const R* f) const {
    double v = 0;
    for (int q = 0; q < 4; ++q) v += weight[q] * f[index[q]];
    return v;
  }
};
PointStencil point_stencil(const YeeGrid& g, Component c, Vec2 p);

const char* field_units(const std::string& field);
bool is_magnetic_field(const std::string& field);

}  // namespace ty

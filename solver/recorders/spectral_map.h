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
/// wave of amplitude A gives |X| = A whatever the run length. A run that stops by itself
/// (`stop: auto`) sums over blocks instead (cw: whole periods at the end of each block, the
/// last complete block kept; pulsed: the whole run): sampling.h, DftWindows.
#pragma once
#include <algorithm>
#include <complex>
#include <string>
#include <vector>

#include "io/scene/scene.h"
#include "io/scene/units.h"
#include "solver/grid/aligned.h"
#include "solver/grid/node_average.h"
#include "solver/grid/yee_grid.h"
#include "solver/recorders/sampling.h"

namespace ty {

struct SpectralMap {
  std::string name;
  std::vector<std::string> fields;
  std::vector<double> freq;          ///< Hz
  DftWindows win;                    ///< per frequency: where it sums and its normalisation
  long start = 0;                    ///< no window sums before this step
  long steps = 0;                    ///< steps recorded so far
  double dt = 0;
  int i0 = 0, j0 = 0, ni = 0, nj = 0, stride = 1;  ///< Ez nodes of the region
  std::vector<double> x, y;          ///< their positions, user coordinates
  /// [f][point][component]; mapped pages (solver/grid/aligned.h): over MPI ranks each rank
  /// writes, and holds, only its own rows' points until the end gathers them (gather_sums)
  MappedVector<std::complex<double>> acc;
  MappedVector<double> value;        ///< this step's six averaged values per point (scratch)
  int b0 = 0, b1 = 0;                ///< the map rows this process sums: all, or its rank's (recorder_gather.cpp)
  /// Whether step k of total adds to the sums.
  bool samples(long k, long total) const { return k >= start && win.sampled(k, total); }
  /// The points this process sums, [p0, p1) of each frequency's ni * nj.
  std::size_t p0() const { return static_cast<std::size_t>(b0) * ni; }
  std::size_t p1() const { return static_cast<std::size_t>(b1) * ni; }
  std::complex<double> field(std::size_t f, std::size_t p, int c) const {
    return acc[(f * static_cast<std::size_t>(ni) * nj + p) * 6 + c] * (2.0 / win.seconds(f, dt));
  }

  /// After step k of total: on a sampling step inside a window, adds each averaged
  /// component at its own time (E at (k+1) dt, H at (k+1/2) dt); the points split over the
  /// threads.
  template <class R>
  void record(long k, long total, const R* const* F, const YeeGrid& g, int threads) {
    steps = k + 1;
    const size_t np = static_cast<size_t>(ni) * nj;
    if (win.restarts(k))
      for (size_t fi = 0; fi < freq.size(); ++fi)
        std::fill(acc.begin() + (fi * np + p0()) * 6, acc.begin() + (fi * np + p1()) * 6, std::complex<double>{});
    if (!samples(k, total)) return;
    const EzNodeAverage average{g.stride};
    for (int b = b0; b < b1; ++b)
      for (int a = 0; a < ni; ++a) {
        double* v = &value[(static_cast<size_t>(b) * ni + a) * 6];
        average(F, g.at(i0 + a * stride, j0 + b * stride), v);
        for (int c = 3; c < 6; ++c) v[c] /= constants::eta0;
      }
    for (size_t fi = 0; fi < freq.size(); ++fi) {
      if (!win.inside(fi, k, total)) continue;
      const DftWindows::Phasors w = win.phasors(freq[fi], k, g.dt);
      std::complex<double>* sums = acc.data() + fi * np * 6;
      const double* val = value.data();
#pragma omp parallel for schedule(static) num_threads(threads)
      for (long p = static_cast<long>(p0()); p < static_cast<long>(p1()); ++p) add_six(sums, val, p, p + 1, w);
    }
  }
  template <class Fn>
  void visit_state(Fn&& f) {  // complex sums as pairs of doubles
    f("spectral-maps/" + name, reinterpret_cast<double*>(acc.data()), 2 * acc.size());
  }
};

/// rule: last_half for a run of fixed length; blocks (of `block` steps, sampled every `every`)
/// or whole_run for one that stops by itself (every = 0: chosen from the window).
SpectralMap make_spectral_map(const Scene& s, const Output& o, const YeeGrid& g, long total_steps,
                              WindowRule rule = WindowRule::last_half, int every = 0, long block = 0);

}  // namespace ty

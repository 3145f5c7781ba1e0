/// \file probe.h
/// \brief The probe: every field at one point, or its mean over a line (a finite detector),
/// every step, in arrays sized before the run.
///
/// Time alignment: after step k (0-based) the grid holds E at t = (k+1) dt, and H and the
/// magnetizations at (k+1/2) dt. A probe's series all lie on the E times (k+1) dt (the
/// run folder's /probes/<name>/time): H and the magnetic fields are the mean of their two
/// neighbouring half steps (second-order accurate; the last value extrapolated linearly),
/// so Poynting products are taken at one time.
#pragma once
#include <array>
#include <functional>
#include <string>
#include <vector>

#include "solver/recorders/sampling.h"

namespace ty {

struct ProbeRecorder {
  std::string name;
  Vec2 at;  ///< internal coordinates
  std::vector<std::string> fields;
  std::array<PointStencil, 6> stencil;
  /// A line probe (a finite detector): the stencils of points spaced at most a cell apart along
  /// the line and their trapezoid weights (summing to 1), so a component is its line mean.
  std::vector<std::array<PointStencil, 6>> line;
  std::vector<double> line_weight;
  std::vector<double> raw;  ///< per recorded step: the six components as stored (E in V/m, eta0*H)
  long count = 0;
  /// Magnetic fields (Mx, Lx, ...): bilinear over the four nearest cell centres (cells that
  /// are not magnetic count as zero), sampled at the magnetization's time, (k+1/2) dt.
  std::vector<std::string> magnetic;
  std::array<long, 4> cells{-1, -1, -1, -1};
  std::array<double, 4> cell_weight{};
  std::vector<std::vector<double>> magnetic_series;

  /// Its reads of one step, slot by slot (a block's recorders take them row by row as the
  /// wavefront passes, solver/blocking/recorder_taps.h): slot q * 6 + c the stencil of component
  /// c at line point q (q = 0 for a point probe), then slot reads() + 4 f + q the magnetic field
  /// f in cells[q] (unused where cells[q] < 0).
  int field_reads() const { return 6 * static_cast<int>(line.empty() ? 1 : line.size()); }
  int slots() const { return field_reads() + 4 * static_cast<int>(magnetic.size()); }
  const PointStencil& slot_stencil(int slot) const {
    return line.empty() ? stencil[slot % 6] : line[static_cast<size_t>(slot / 6)][slot % 6];
  }
  /// Step k's values; value(field, cell) gives a magnetic field's value in a list cell.
  template <class R, class MagneticValue>
  void record(long k, const R* const* F, MagneticValue&& value) {
    double* v = taken.data();
    for (int s = 0; s < field_reads(); ++s) v[s] = slot_stencil(s)(F[s % 6]);
    for (size_t f = 0; f < magnetic.size(); ++f)
      for (int q = 0; q < 4; ++q)
        if (cells[q] >= 0) v[field_reads() + 4 * f + q] = value(magnetic[f], cells[q]);
    record_values(k, v);
  }
  /// Step k's values from its reads (slots()).
  void record_values(long k, const double* v) {
    if (line.empty()) {
      for (int c = 0; c < 6; ++c) raw[static_cast<size_t>(k) * 6 + c] = v[c];
    } else {
      for (int c = 0; c < 6; ++c) {
        double x = 0;
        for (size_t q = 0; q < line.size(); ++q) x += line_weight[q] * v[q * 6 + c];
        raw[static_cast<size_t>(k) * 6 + c] = x;
      }
    }
    for (size_t f = 0; f < magnetic.size(); ++f) {
      double x = 0;
      for (int q = 0; q < 4; ++q)
        if (cells[q] >= 0) x += cell_weight[q] * v[field_reads() + 4 * f + q];
      magnetic_series[f][k] = x;
    }
    count = k + 1;
  }
  std::vector<double> taken;  ///< one step's reads (slots()), sized by make_probe
  /// The series of one field in SI (E in V/m, H in A/m, S in W/m^2, M in T) at the E times.
  std::vector<double> series(const std::string& field) const;
  template <class F>
  void visit_state(F&& f) {
    f("probes/" + name, raw.data(), raw.size());
    for (size_t k = 0; k < magnetic.size(); ++k)
      f("probes/" + name + "-" + magnetic[k], magnetic_series[k].data(), magnetic_series[k].size());
  }
};

/// x(k+1/2) -> x(k+1): the mean of samples k and k+1, the last one extrapolated linearly.
double to_e_time(const double* x, long k, long n);

/// The magnetic list's cell at grid cell (i, j), -1 where there is none (MagneticCells::cell_at).
using CellAt = std::function<long(int, int)>;

/// A probe for a scene's probe output on grid g; cell_at finds the magnetic cells (empty
/// when there are none).
ProbeRecorder make_probe(const Output& o, const YeeGrid& g, long total_steps, const CellAt& cell_at);

}  // namespace ty

/// \file recorders.h
/// \brief Recorders that run inside the time loop: probes (every step, at a point) and
/// snapshots (whole-region frames at a fixed interval). They hold what they record in
/// arrays sized before the run; io/ writes it out.
///
/// Time alignment: after step n the grid holds E at t = (n+1) dt and H at (n+1/2) dt.
/// Probes report every field at the E times, H averaged over its two neighbouring half
/// steps (second-order accurate), so Poynting products are taken at one time. Snapshot
/// frames hold each component at its own node and time level; the H frames' time lags
/// E's by dt/2 (written beside them as an attribute).
#pragma once
#include <array>
#include <string>
#include <vector>

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

/// Bilinear interpolation stencil of one component at a point.
struct PointStencil {
  std::array<long, 4> index{};
  std::array<double, 4> weight{};
};
PointStencil point_stencil(const YeeGrid& g, Component c, Vec2 p);

struct ProbeRecorder {
  std::string name;
  Vec2 at;  ///< internal coordinates
  std::vector<std::string> fields;
  std::array<PointStencil, 6> stencil;
  std::vector<double> raw;  ///< per recorded step: the six components as stored (E in V/m, eta0*H)
  long count = 0;
  /// Magnetic fields (Mx, Lx, ...): bilinear over the four nearest cell centres (cells that
  /// are not magnetic count as zero), recorded at the magnetization's time, n + 1/2.
  std::vector<std::string> magnetic;
  std::array<int, 4> cells{-1, -1, -1, -1};
  std::array<double, 4> cell_weight{};
  std::vector<std::vector<double>> magnetic_series;
  /// The time-aligned series of one field in SI (E in V/m, H in A/m, S in W/m^2).
  std::vector<double> series(const std::string& field) const;
};

/// Where one snapshot field is taken: its nodes [i0, i0 + ni*stride) x [j0, j0 + nj*stride).
struct SnapshotField {
  std::string name;
  Component node = Component::Ez;  ///< whose nodes (and positions) it uses; S* use Ez's
  int i0 = 0, j0 = 0, ni = 0, nj = 0, stride = 1;
  std::vector<double> x, y;        ///< node positions in user coordinates, m
  double time_offset = 0;          ///< s, relative to the frame time (-dt/2 for H)
  const char* units = "V/m";
};

/// Receives snapshot frames as they are taken (implemented by io/ over HDF5).
class SnapshotSink {
 public:
  virtual ~SnapshotSink() = default;
  virtual void frame(std::size_t frame, double time, std::size_t field, const float* data) = 0;
  virtual void frame(std::size_t frame, double time, std::size_t field, const double* data) = 0;
};

struct SnapshotPlan {
  std::vector<SnapshotField> fields;
  std::vector<long> steps;  ///< step index after which each frame is taken
  std::vector<double> times;
};

/// Field layout of snapshots for a scene's snapshot output on grid g.
SnapshotPlan plan_snapshots(const Scene& s, const Output& o, const YeeGrid& g, long total_steps);

const char* field_units(const std::string& field);
bool is_magnetic_field(const std::string& field);

}  // namespace ty

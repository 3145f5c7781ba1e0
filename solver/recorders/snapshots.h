/// \file snapshots.h
/// \brief Snapshots: whole-region frames of chosen fields at a fixed interval, handed to a
/// sink (io/ writes them to HDF5) as they are taken.
///
/// Time: the frame after step k has the time (k+1) dt of E (SnapshotPlan::times); each
/// field carries its own offset from it (SnapshotField::time_offset, written beside the
/// frames): E at its nodes at (k+1) dt; H and the magnetic fields at (k+1/2) dt, as stored
/// (offset -dt/2); the Poynting vector S = E x H at the Ez nodes at (k+1/2) dt too, from
/// H(k+1/2) and the mean of E(k) and E(k+1) (kept from the step before the frame), so
/// both factors are taken at one time (second order, like the averages in space).
#pragma once
#include <cmath>
#include <string>
#include <vector>

#include "io/scene/units.h"
#include "solver/grid/node_average.h"
#include "solver/grid/poynting.h"
#include "solver/recorders/sampling.h"

namespace ty {

/// Where one snapshot field is taken: its nodes [i0, i0 + ni*stride) x [j0, j0 + nj*stride).
struct SnapshotField {
  std::string name;
  Component node = Component::Ez;  ///< whose nodes (and positions) it uses; S* use Ez's
  int i0 = 0, j0 = 0, ni = 0, nj = 0, stride = 1;
  std::vector<double> x, y;  ///< node positions in user coordinates, m
  double time_offset = 0;    ///< s, relative to the frame time (-dt/2 for H, M and S)
  const char* units = "V/m";
  bool poynting() const { return name[0] == 'S'; }
};

/// Receives snapshot frames as they are taken (implemented by io/ over HDF5).
class SnapshotSink {
 public:
  virtual ~SnapshotSink() = default;
  virtual void frame(std::size_t frame, double time, std::size_t field, const float* data) = 0;
  virtual void frame(std::size_t frame, double time, std::size_t field, const double* data) = 0;
  /// Over MPI ranks: rows [b0, b1) of the frame (`data` is the whole frame's place, those
  /// rows filled), each rank its own rows; every rank calls it for every field of every frame.
  virtual void frame_rows(std::size_t frame, std::size_t field, int b0, int b1, const float* data);
  virtual void frame_rows(std::size_t frame, std::size_t field, int b0, int b1, const double* data);
};

/// The grid rows [lo, hi) a rank's recorders take frame rows from; `parts`: over ranks
/// (frames go to SnapshotSink::frame_rows), else the whole grid (SnapshotSink::frame).
struct FrameRows {
  int lo = 0, hi = 1 << 30;
  bool parts = false;
  /// The frame rows [b0, b1) of field f whose grid rows j0 + b stride lie in [lo, hi).
  void of(const SnapshotField& f, int& b0, int& b1) const {
    const auto first_at = [&](int j) {
      const int b = j <= f.j0 ? 0 : (j - f.j0 + f.stride - 1) / f.stride;
      return b < f.nj ? b : f.nj;
    };
    b0 = first_at(lo), b1 = first_at(hi);
  }
};

struct SnapshotPlan {
  std::vector<SnapshotField> fields;
  std::vector<long> steps;  ///< step index after which each frame is taken
  std::vector<double> times;
};

/// Field layout of snapshots for a scene's snapshot output on grid g.
SnapshotPlan plan_snapshots(const Scene& s, const Output& o, const YeeGrid& g, long total_steps);

template <class R>
class SnapshotRecorder {
 public:
  SnapshotPlan plan;
  long next_frame = 0;

  void build(const Scene& s, const Output& o, const YeeGrid& g, long total_steps) {
    plan = plan_snapshots(s, o, g, total_steps);
    size_t most = 0;
    for (const auto& f : plan.fields) {
      most = std::max(most, static_cast<size_t>(f.ni) * f.nj);
      if (f.poynting()) e_before_.resize(e_before_.size() + 3 * static_cast<size_t>(f.ni) * f.nj, 0.0);
    }
    buf_.assign(most, R(0));
  }
  std::size_t bytes() const { return buf_.size() * sizeof(R) + e_before_.size() * sizeof(double); }

  /// After step k: the frame if one is due, then E kept for a Poynting frame due next step.
  /// value(field, cell) is a magnetic field's value in a list cell; cell_at(i, j) the list cell
  /// at grid cell (i, j), -1 where there is none.
  /// Over ranks (rows.parts) each rank takes, keeps and hands on the rows its grid rows hold.
  template <class CellAt, class MagneticValue>
  void record(long k, const R* const* F, const YeeGrid& g, CellAt&& cell_at, MagneticValue&& value,
              SnapshotSink* sink, const FrameRows& rows = {}) {
    const long frames = static_cast<long>(plan.steps.size());
    if (next_frame < frames && plan.steps[next_frame] == k) {
      size_t e_at = 0;
      for (size_t fi = 0; fi < plan.fields.size(); ++fi) {
        const SnapshotField& sf = plan.fields[fi];
        int b0, b1;
        rows.of(sf, b0, b1);
        take(sf, F, g, cell_at, value, e_at, b0, b1);
        if (sink && rows.parts) sink->frame_rows(next_frame, fi, b0, b1, buf_.data());
        else if (sink) sink->frame(next_frame, plan.times[next_frame], fi, buf_.data());
      }
      ++next_frame;
    }
    if (!e_before_.empty() && next_frame < frames && plan.steps[next_frame] == k + 1) keep_e(F, g, rows);
  }
  /// The parts of the kept E (visit_state's snapshots/E-before-frame) of the rows [rows.lo, rows.hi).
  std::vector<std::pair<std::size_t, std::size_t>> e_before_parts(const FrameRows& rows) const {
    std::vector<std::pair<std::size_t, std::size_t>> parts;
    size_t e_at = 0;
    for (const SnapshotField& sf : plan.fields) {
      if (!sf.poynting()) continue;
      int b0, b1;
      rows.of(sf, b0, b1);
      const size_t row = 3 * static_cast<size_t>(sf.ni);
      if (b1 > b0) parts.emplace_back(e_at + b0 * row, e_at + b1 * row);
      e_at += 3 * static_cast<size_t>(sf.ni) * sf.nj;
    }
    return parts;
  }
  /// The first step from `from` on whose fields record() reads (the next frame's, or the
  /// step before it when a Poynting frame keeps E); -1 when none is left.
  long next_read(long from) const {
    if (next_frame >= static_cast<long>(plan.steps.size())) return -1;
    const long s = plan.steps[next_frame] - (e_before_.empty() ? 0 : 1);
    return s < from ? from : s;
  }
  template <class Fn>
  void visit_state(Fn&& f) {
    f("clock/frames", &next_frame, 1);
    if (!e_before_.empty()) f("snapshots/E-before-frame", e_before_.data(), e_before_.size());
  }

 private:
  std::vector<R> buf_;
  std::vector<double> e_before_;  ///< per S field, per node: E(k) averaged to the Ez node

  template <class CellAt, class MagneticValue>
  void take(const SnapshotField& sf, const R* const* F, const YeeGrid& g, CellAt& cell_at,
            MagneticValue& value, size_t& e_at, int b0, int b1) {
    const int c = static_cast<int>(sf.node);
    const EzNodeAverage average{g.stride};
    for (int b = b0; b < b1; ++b)
      for (int a = 0; a < sf.ni; ++a) {
        const int i = sf.i0 + a * sf.stride, j = sf.j0 + b * sf.stride;
        const size_t p = static_cast<size_t>(b) * sf.ni + a;
        double v;
        if (is_magnetic_field(sf.name)) {
          const long cell = cell_at(i, j);
          v = cell >= 0 ? value(sf.name, cell) : 0.0;
        } else if (!sf.poynting()) {
          v = F[c][g.at(i, j)];
          if (c >= 3) v /= constants::eta0;
        } else {
          double u[6];
          average(F, g.at(i, j), u);
          const double* e0 = &e_before_[e_at + 3 * p];
          const double E[3] = {0.5 * (u[0] + e0[0]), 0.5 * (u[1] + e0[1]), 0.5 * (u[2] + e0[2])};
          const double H[3] = {u[3] / constants::eta0, u[4] / constants::eta0, u[5] / constants::eta0};
          const auto S = poynting(E, H);
          v = sf.name == "Sx" ? S[0] : sf.name == "Sy" ? S[1] : std::hypot(S[0], S[1]);
        }
        buf_[p] = static_cast<R>(v);
      }
    if (sf.poynting()) e_at += 3 * static_cast<size_t>(sf.ni) * sf.nj;
  }
  void keep_e(const R* const* F, const YeeGrid& g, const FrameRows& rows) {
    const EzNodeAverage average{g.stride};
    size_t e_at = 0;
    for (const SnapshotField& sf : plan.fields) {
      if (!sf.poynting()) continue;
      int b0, b1;
      rows.of(sf, b0, b1);
      for (int b = b0; b < b1; ++b)
        for (int a = 0; a < sf.ni; ++a) {
          double u[6];
          average(F, g.at(sf.i0 + a * sf.stride, sf.j0 + b * sf.stride), u);
          double* e = &e_before_[e_at + 3 * (static_cast<size_t>(b) * sf.ni + a)];
          e[0] = u[0], e[1] = u[1], e[2] = u[2];
        }
      e_at += 3 * static_cast<size_t>(sf.ni) * sf.nj;
    }
  }
};

}  // namespace ty

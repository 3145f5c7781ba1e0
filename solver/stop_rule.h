/// \file stop_rule.h
/// \brief `time.stop: auto`: a run that decides when it is done, within its limit.
///
/// Every `check` steps the rule looks at the run:
///   pulsed (every source ends): done when the sources have ended, the energy left in the
///     domain (field + magnetic) is below `energy-left` times the largest seen at a check,
///     and no power spectrum or spectral map changed by more than `tolerance` (relative to
///     its largest value) since the previous check;
///   cw (a source that never ends): the spectra are summed over blocks of `check` steps,
///     each frequency over whole periods at the block's end (sampling.h, DftWindows); done
///     when two blocks in a row agree within `tolerance`. The last block is the result.
/// The comparisons use the raw DFT sums (no normalisation), so a pulsed run's running sums
/// converge as the field leaves, and equal cw blocks compare as they are. Spectral maps are
/// compared on at most kMapSamples of their points. A run that reaches its limit first
/// ends there, with a warning and the figures it had reached.
#pragma once
#include <complex>
#include <limits>
#include <string>
#include <vector>

#include "io/scene/scene.h"
#include "solver/recorders/power_spectrum.h"
#include "solver/recorders/spectral_map.h"

namespace ty {

/// How a self-stopping run is laid out; computed before the recorders are built.
struct StopPlan {
  bool cw = false;
  int every = 1;     ///< the common DFT sampling interval, steps
  long check = 1;    ///< steps between checks (cw: the block length)
  long total = 1;    ///< the limit, rounded down to whole checks, steps
  double sources_end = 0;  ///< s; infinity for cw
};
StopPlan plan_stop(const Scene& s, double dt, long limit_steps);

class StopRule {
 public:
  static constexpr long kMapSamples = 1024;

  StopRule() = default;
  StopRule(const AutoStop& a, const StopPlan& p, const std::vector<PowerSpectrumRecorder>& lines,
           const std::vector<SpectralMap>& maps);

  bool on() const { return on_; }
  const StopPlan& plan() const { return plan_; }
  bool due(long steps) const { return on_ && steps % plan_.check == 0; }
  /// After `steps` steps (a check step): whether the run is done.
  bool settled(long steps, double dt, double energy, const std::vector<PowerSpectrumRecorder>& lines,
               const std::vector<SpectralMap>& maps);

  /// What the last check saw (for summary.json and the log).
  double energy_fraction() const { return fig_[kPeak] > 0 ? fig_[kLast] / fig_[kPeak] : 0.0; }
  /// Infinity before the second check (nothing to compare with yet).
  double largest_change() const { return fig_[kChange] < 0 ? std::numeric_limits<double>::infinity() : fig_[kChange]; }
  long checks() const { return static_cast<long>(fig_[kChecks]); }
  bool done() const { return done_ > 0; }

  template <class Fn>
  void visit_state(Fn&& f) {
    if (!on_) return;
    f("stop-rule/figures", fig_, 4);
    f("stop-rule/done", &done_, 1);
    f("stop-rule/previous", previous_.data(), previous_.size());
  }

 private:
  bool on_ = false;
  AutoStop a_;
  StopPlan plan_;
  enum { kPeak, kLast, kChange, kChecks };
  double fig_[4] = {0, 0, -1, 0};  ///< peak and last energy, J/m; change (-1: none yet); checks (all finite: checkpoints)
  long done_ = 0;
  std::vector<double> previous_;  ///< the last check's signatures, lines then maps
  std::vector<double> now_;       ///< this check's (scratch)
  std::vector<long> map_stride_;  ///< per map: every how many points a sample is taken

  void signatures(const std::vector<PowerSpectrumRecorder>& lines, const std::vector<SpectralMap>& maps);
};

}  // namespace ty

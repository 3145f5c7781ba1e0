/// \file stop_rule.cpp
/// \brief The layout of a self-stopping run (check interval, sampling, limit) and its
/// decision at each check (stop_rule.h).
#include "solver/stop_rule.h"

#include <algorithm>
#include <cmath>

#include "solver/parallel/ranks.h"
#include "solver/recorders/sampling.h"

namespace ty {

namespace {

/// A cw block that is (as nearly as whole sampling intervals allow) a whole number of
/// periods of the lowest cw carrier, at least `at_least` steps: every block then starts at
/// the same phase of the wave, so the leakage of its line into the other recorded
/// frequencies is the same in each block and steady blocks agree.
long whole_periods_block(const Scene& s, double dt, int every, long at_least) {
  double f0 = std::numeric_limits<double>::infinity();
  for (const Source& src : s.sources)
    if (!std::isfinite(source_end(src)) && src.frequency > 0) f0 = std::min(f0, src.frequency);
  if (!std::isfinite(f0)) return at_least;
  const double per = 1.0 / (f0 * dt * every);  // a period in sampling intervals
  const long n0 = std::max(1L, static_cast<long>(std::ceil(at_least / (per * every))));
  long best = at_least;
  double miss = 1;
  for (long n = n0; n < n0 + 64; ++n) {  // the period count whose length is nearest whole intervals
    const double q = n * per, m = std::abs(q - std::round(q));
    if (m < miss - 1e-12) miss = m, best = every * std::lround(q);
  }
  return std::max<long>(best, every);
}

/// How many numbers a map contributes to the signatures: 6 per sampled point and frequency.
std::size_t map_values(const SpectralMap& m, long stride) {
  const long np = static_cast<long>(m.ni) * m.nj;
  return m.freq.size() * static_cast<std::size_t>((np + stride - 1) / stride) * 6;
}

}  // namespace

StopPlan plan_stop(const Scene& s, double dt, long limit_steps) {
  StopPlan p;
  double f_lo = std::numeric_limits<double>::infinity(), f_hi = 0;
  p.sources_end = 0;
  for (const Source& src : s.sources) {
    p.sources_end = std::max(p.sources_end, source_end(src));
    const Band2 b = source_band(src);
    if (b.lo > 0) f_lo = std::min(f_lo, b.lo);
    if (src.frequency > 0) f_lo = std::min(f_lo, src.frequency);
  }
  for (const Output& o : s.outputs) {
    for (double f : o.frequencies)
      if (f > 0) f_lo = std::min(f_lo, f), f_hi = std::max(f_hi, f);
    if (o.kind == Output::Kind::power_spectrum)
      for (double f : {o.band_from, o.band_to})
        if (f > 0) f_lo = std::min(f_lo, f), f_hi = std::max(f_hi, f);
  }
  p.cw = !std::isfinite(p.sources_end);
  const double limit = limit_steps * dt;
  // checks: a cw block holds at least 10 periods of the lowest frequency (and a hundredth
  // of the limit); a pulsed run is looked at every 2 periods (and every 200th of the limit)
  double t_check = s.time.auto_stop.check_every;
  if (t_check <= 0) {
    const double period = std::isfinite(f_lo) ? 1.0 / f_lo : 0.0;
    t_check = p.cw ? std::max(10 * period, limit / 100) : std::max(2 * period, limit / 200);
  }
  const long want = std::max(1L, std::lround(t_check / dt));
  p.every = dft_every(s, f_hi, dt, p.cw ? want : limit_steps);
  p.check = std::max<long>(p.every, p.every * std::lround(static_cast<double>(want) / p.every));
  if (p.cw && s.time.auto_stop.check_every <= 0) p.check = whole_periods_block(s, dt, p.every, p.check);
  if (p.check > limit_steps) p.check = std::max<long>(p.every, limit_steps / p.every * p.every);
  p.total = std::max(p.check, limit_steps / p.check * p.check);
  return p;
}

StopRule::StopRule(const AutoStop& a, const StopPlan& p, const std::vector<PowerSpectrumRecorder>& lines,
                   const std::vector<SpectralMap>& maps)
    : on_(a.on), a_(a), plan_(p) {
  long n = 0;
  for (const auto& l : lines) n += static_cast<long>(l.freq.size());
  for (const auto& m : maps) {
    const long np = static_cast<long>(m.ni) * m.nj;
    map_stride_.push_back(std::max(1L, (np + kMapSamples - 1) / kMapSamples));
    n += static_cast<long>(map_values(m, map_stride_.back()));
  }
  previous_.assign(static_cast<std::size_t>(n), 0.0);
  now_.assign(previous_.size(), 0.0);
}

void StopRule::signatures(const std::vector<PowerSpectrumRecorder>& lines, const std::vector<SpectralMap>& maps) {
  std::size_t q = 0;
  for (const auto& l : lines)  // the line's power from the raw sums: converges with them
    for (std::size_t f = 0; f < l.freq.size(); ++f) {
      double P = 0;
      for (std::size_t p = 0; p < l.points.size(); ++p) {
        const std::complex<double>* a = &l.acc[(f * l.points.size() + p) * 6];
        const auto S = poynting(a, a + 3);
        P += l.weight[p] * (S[0].real() * l.normal.x + S[1].real() * l.normal.y);
      }
      now_[q++] = P;
    }
  // the electric field at a sample of points; over MPI ranks each rank sums its own rows'
  // points (SpectralMap::b0, b1), so each takes those, 0 elsewhere, and the sum over the ranks
  // is every point's value, exactly (x + 0 = x), on every rank
  const std::size_t first = q;
  for (std::size_t k = 0; k < maps.size(); ++k) {
    const SpectralMap& m = maps[k];
    const long np = static_cast<long>(m.ni) * m.nj;
    for (std::size_t f = 0; f < m.freq.size(); ++f)
      for (long p = 0; p < np; p += map_stride_[k]) {
        const bool own = p >= static_cast<long>(m.p0()) && p < static_cast<long>(m.p1());
        for (int c = 0; c < 3; ++c) {
          const std::complex<double> v = own ? m.acc[(f * np + p) * 6 + c] : std::complex<double>{};
          now_[q++] = v.real();
          now_[q++] = v.imag();
        }
      }
  }
  if (parallel::size() > 1 && q > first) parallel::sum_over_ranks(now_.data() + first, static_cast<long>(q - first));
}

bool StopRule::settled(long steps, double dt, double energy, const std::vector<PowerSpectrumRecorder>& lines,
                       const std::vector<SpectralMap>& maps) {
  if (!on_) return false;
  fig_[kPeak] = std::max(fig_[kPeak], energy);
  fig_[kLast] = energy;
  signatures(lines, maps);
  // the largest change of any recorder, relative to its own largest value (power lines) or norm (maps)
  double change = 0;
  std::size_t q = 0;
  auto compare = [&](std::size_t n, bool norm2) {
    double d = 0, scale = 0;
    for (std::size_t i = q; i < q + n; ++i) {
      const double diff = now_[i] - previous_[i];
      d = norm2 ? d + diff * diff : std::max(d, std::abs(diff));
      scale = norm2 ? scale + now_[i] * now_[i] : std::max(scale, std::abs(now_[i]));
    }
    if (scale > 0) change = std::max(change, norm2 ? std::sqrt(d / scale) : d / scale);
    q += n;
  };
  for (const auto& l : lines) compare(l.freq.size(), false);
  for (std::size_t k = 0; k < maps.size(); ++k) compare(map_values(maps[k], map_stride_[k]), true);
  fig_[kChange] = fig_[kChecks] > 0 ? change : -1.0;
  fig_[kChecks] += 1;
  std::swap(previous_, now_);
  bool ok = fig_[kChange] >= 0 && fig_[kChange] <= a_.tolerance;
  if (!plan_.cw) ok = ok && steps * dt >= plan_.sources_end && energy <= a_.energy_left * fig_[kPeak];
  if (ok) done_ = steps;
  return ok;
}

}  // namespace ty

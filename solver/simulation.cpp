/// \file simulation.cpp
/// \brief A Simulation's construction in the order its rooms need (media, magnets,
/// absorber, sources, recorders), the row kernels and the fused row-by-row Yee step, and
/// handing the fields to the recorders after each step.
#include "solver/simulation.h"
#include "solver/threads/thread_count.h"

#include <omp.h>

#include <algorithm>
#include <cmath>

#include "io/scene/units.h"
#include "solver/grid/yee_update.h"

namespace ty {

using constants::c0;
using constants::eta0;

template <class R>
Simulation<R>::Simulation(const Scene& scene, int threads, int copy) : scene_(scene), copy_(copy) {
  const GridSpec& G = scene.grid;
  g_ = grid_for(scene, static_cast<int>(64 / sizeof(R)));
  total_steps_ = steps_for(scene, g_);
  StopPlan plan;
  if (scene.time.auto_stop.on) total_steps_ = (plan = plan_stop(scene, g_.dt, total_steps_)).total;
  sx_ = static_cast<R>(c0 * g_.dt / g_.dx);
  sy_ = static_cast<R>(c0 * g_.dt / g_.dy);
  walls_ = Boundaries::of(G);
  const int chosen = threads > 0 ? threads : scene.time.threads;  // 0: fitted to the work below
  threads_ = chosen > 0 ? chosen : usable_cores();

  for (auto& a : f_) a.resize(g_.size());
  bytes_ += 6 * g_.size() * sizeof(R);
  build_media();
  build_magnets();
  build_pml();
  build_sources();
  build_recorders(plan);
  build_slabs();
  build_fusion();
  stop_ = StopRule(scene.time.auto_stop, plan, power_spectra_, maps_);
  // a magnetic cell counted as 3.5 vacuum cells (1 + 2.5 more): the bench's figure under load, on a
  // grid since found to be 44% vacuum; idle and all-magnetic it is 9-10 (docs/performance.md), but
  // 3.5 keeps quasi-1D magnetic scenes such as tests/data/mnf2-slab.yaml on one thread
  if (chosen <= 0) threads_ = threads_for_work(double(g_.nx) * g_.ny + 2.5 * mag_.count(), threads_);
  if (walls_.bloch_x) build_bloch_pair();
}

template <class R>
void Simulation<R>::build_recorders(const StopPlan& plan) {
  const CellAt cell_at = mag_.empty() ? CellAt{} : [this](int i, int j) { return mag_.cell_at(i, j); };
  // a run of fixed length: maps over the second half, power spectra over the whole run
  // (pulses) or its second half (cw); one that stops by itself: blocks (cw) or everything
  const bool self = scene_.time.auto_stop.on;
  const WindowRule on_own = plan.cw ? WindowRule::blocks : WindowRule::whole_run;
  const int every = self ? plan.every : 0;
  const long block = self ? plan.check : 0;
  for (const Output& o : scene_.outputs) {
    if (o.kind == Output::Kind::probe) {
      probes_.push_back(make_probe(o, g_, total_steps_, cell_at));
      bytes_ += probes_.back().raw.size() * sizeof(double);
    } else if (o.kind == Output::Kind::spectral_map) {
      maps_.push_back(
          make_spectral_map(scene_, o, g_, total_steps_, self ? on_own : WindowRule::last_half, every, block));
      bytes_ += maps_.back().acc.size() * sizeof(std::complex<double>);
    } else if (o.kind == Output::Kind::power_spectrum) {
      power_spectra_.push_back(make_power_spectrum(scene_, o, g_, total_steps_,
                                                   self ? on_own : power_spectrum_rule(scene_), every, block));
      bytes_ += power_spectra_.back().acc.size() * sizeof(std::complex<double>);
    } else {
      snaps_.build(scene_, o, g_, total_steps_);
      bytes_ += snaps_.bytes();
    }
  }
}

template <class R>
void Simulation<R>::h_row(int j, const double* ev, int skip0, int skip1) {
  const int nx = g_.nx;
  const long o = g_.at(0, j), s = g_.stride;
  R* __restrict hx = f_[3].data() + o;
  R* __restrict hy = f_[4].data() + o;
  R* __restrict hz = f_[5].data() + o;
  R* __restrict ex = f_[0].data() + o;
  R* __restrict ey = f_[1].data() + o;
  R* __restrict ez = f_[2].data() + o;
  for (int q = inj_h_row_[j]; q < inj_h_row_[j + 1]; ++q) inj_h_[q].before = f_[inj_h_[q].comp][inj_h_[q].index];
  walls_.before_h_row(ey, ez, nx);
  if (in_absorber(j)) graded_decay(j, false);  // the graded loss's first half step (graded_loss.h)
  const R* __restrict exn = f_[0].data() + o + s;  // from the array, not from ex (C11 6.7.3.1p4)
  const R* __restrict ezn = f_[2].data() + o + s;
  const R sx = sx_, sy = sy_, neg_sy = -sy_;
  auto update = [&](int i0, int i1) {  // yee_update.h
#pragma omp simd
    for (int i = i0; i < i1; ++i) {
      hx[i] = yee::hx(hx[i], ezn[i] - ez[i], neg_sy);
      hy[i] = yee::hy(hy[i], ez[i + 1] - ez[i], sx);
      hz[i] = yee::hz(hz[i], ey[i + 1] - ey[i], exn[i] - ex[i], sx, sy);
    }
  };
  update(0, skip0);  // [skip0, skip1): he_row's fused span (row_fusion.cpp)
  update(skip1, nx);
  if (in_absorber(j)) pml_h_row(j);
  // a source's work on the leapfrog's conserved energy (e_row_update): the value v times the
  // node's values at the step's start and end
  for (int q = inj_h_row_[j]; q < inj_h_row_[j + 1]; ++q) {
    const Injection& e = inj_h_[q];
    const double F = f_[e.comp][e.index], v = ev[e.slot];
    injected_[j] += e.weight * std::abs((e.before + F + v) * v);
    f_[e.comp][e.index] += static_cast<R>(v);
  }
  // and its second; with magnets the row's H is final only after their scatter: step_magnetic
  // decays it then
  if (mag_.empty() && in_absorber(j)) graded_decay(j, false);
  h_boundaries(j);
}

template <class R>
void Simulation<R>::e_row(int j, const double* ev, int skip0, int skip1) {
  const bool dispersive = disp_.row_first[j + 1] > disp_.row_first[j];
  R* const E[3] = {f_[0].data(), f_[1].data(), f_[2].data()};
  if (dispersive) disp_.before_row(j, E);
  e_row_update(j, ev, skip0, skip1);
  if (dispersive) disp_.after_row(j, E);
}

template <class R>
void Simulation<R>::e_row_update(int j, const double* ev, int skip0, int skip1) {
  const int nx = g_.nx;
  const long o = g_.at(0, j), s = g_.stride;
  R* __restrict ex = f_[0].data() + o;
  R* __restrict ey = f_[1].data() + o;
  R* __restrict ez = f_[2].data() + o;
  const R* __restrict hx = f_[3].data() + o;
  const R* __restrict hy = f_[4].data() + o;
  const R* __restrict hz = f_[5].data() + o;
  const R* __restrict hxp = f_[3].data() + o - s;  // from the array, not from hx (C11 6.7.3.1p4)
  const R* __restrict hzp = f_[5].data() + o - s;
  const Run* run = runs_.data();
  for (int q = inj_e_row_[j]; q < inj_e_row_[j + 1]; ++q) inj_e_[q].before = f_[inj_e_[q].comp][inj_e_[q].index];
  if (in_absorber(j)) graded_decay(j, true);  // the graded loss's first half step (graded_loss.h)
  // each loop over [i0, i1) leaves out he_row's fused span [skip0, skip1) (row_fusion.cpp); the
  // node updates are yee_update.h's
  auto parts = [skip0, skip1](int i0, int i1, auto&& loop) {
    loop(i0, std::min(i1, skip0));
    loop(std::max(i0, skip1), i1);
  };
  if (simple_row_[j]) {
    const R kx = run[row_runs_[3 * j]].kx, ky = run[row_runs_[3 * j]].ky, neg_kx = -kx;
    parts(0, nx, [&](int i0, int i1) {
#pragma omp simd
      for (int i = i0; i < i1; ++i) {
        ex[i] = yee::ex(ex[i], hz[i] - hzp[i], ky);
        ey[i] = yee::ey(ey[i], hz[i] - hz[i - 1], neg_kx);
        ez[i] = yee::ez(ez[i], hy[i] - hy[i - 1], hx[i] - hxp[i], kx, ky);
      }
    });
  } else {
    for (int r = row_runs_[3 * j]; r < row_runs_[3 * j + 1]; ++r) {
      const R ca = run[r].ca, ky = run[r].ky;
      parts(run[r].i0, run[r].i1, [&](int i0, int i1) {
#pragma omp simd
        for (int i = i0; i < i1; ++i) ex[i] = yee::ex(ca, ex[i], hz[i] - hzp[i], ky);
      });
    }
    for (int r = row_runs_[3 * j + 1]; r < row_runs_[3 * j + 2]; ++r) {
      const R ca = run[r].ca, neg_kx = -run[r].kx;
      parts(run[r].i0, run[r].i1, [&](int i0, int i1) {
#pragma omp simd
        for (int i = i0; i < i1; ++i) ey[i] = yee::ey(ca, ey[i], hz[i] - hz[i - 1], neg_kx);
      });
    }
    for (int r = row_runs_[3 * j + 2]; r < row_runs_[3 * j + 3]; ++r) {
      const R ca = run[r].ca, kx = run[r].kx, ky = run[r].ky;
      parts(run[r].i0, run[r].i1, [&](int i0, int i1) {
#pragma omp simd
        for (int i = i0; i < i1; ++i) ez[i] = yee::ez(ca, ez[i], hy[i] - hy[i - 1], hx[i] - hxp[i], kx, ky);
      });
    }
  }
  if (in_absorber(j)) pml_e_row(j);
  // the work of the injection on the leapfrog's conserved energy (1/2)(eps E^n.E^n + mu H^(n-1/2).
  // H^(n+1/2)): adding v to E^(n+1) changes it by (eps/2) v (E^n + E^(n+1)), E^n the node's value
  // before this step's update (the curl terms cancel: the Yee scheme's energy identity); an H
  // injection likewise with H^(n-1/2) and H^(n+1/2). Their gross sum bounds that energy.
  for (int q = inj_e_row_[j]; q < inj_e_row_[j + 1]; ++q) {
    const Injection& e = inj_e_[q];
    const double F = f_[e.comp][e.index], v = ev[e.slot];
    injected_[j] += e.weight * std::abs((e.before + F + v) * v);
    f_[e.comp][e.index] += static_cast<R>(v);
  }
  if (in_absorber(j)) graded_decay(j, true);
}

template <class R>
void Simulation<R>::step() {
  if (ranks_ > 1 && twin_) mag_.empty() ? step_slab_pair() : step_magnetic_slab_pair();
  else if (ranks_ > 1) mag_.empty() ? step_slab() : step_magnetic_slab();
  else if (twin_) mag_.empty() ? step_pair() : step_pair_magnetic();
  else if (mag_.empty()) step_fused();
  else step_magnetic();
}

template <class R>
void Simulation<R>::step_fused() {
  compute_emitters();
  const int ny = g_.ny;
  const auto F = fields();
  walls_.before_sweep(F.data(), g_);
#pragma omp parallel num_threads(threads_)
  {
    int j0, j1;
    block_rows(ny, omp_get_thread_num(), omp_get_num_threads(), j0, j1);
    if (j1 > j0) h_row(j1 - 1);
#pragma omp barrier
    if (j0 == 0 && j1 > 0) walls_.before_first_e_row(F.data(), g_);
    for (int j = j0; j < j1 - 1; ++j) he_row(j, emitter_value_.data());
    if (j1 > j0) e_row(j1 - 1);
  }
  if (!tensor_.empty()) tensor_.step(F.data(), threads_);  // tensor_cells.h
  ++n_;
}

template <class R>
void Simulation<R>::record() {
  const long k = n_ - 1;  // the step just taken
  if (ranks_ > 1) gather_for_recorders(k);
  const auto Fm = fields();
  const R* const F[6] = {Fm[0], Fm[1], Fm[2], Fm[3], Fm[4], Fm[5]};
  auto value = [this](const std::string& field, long cell) { return magnetic_value(field, cell); };
  for (auto& p : probes_) p.record(k, F, value);
  for (auto& fl : power_spectra_) fl.record(k, total_steps_, F, threads_);
  record_whole();
  if (twin_) twin_->record();
}

template <class R>
void Simulation<R>::record_whole() {
  const long k = n_ - 1;  // the step just taken
  const auto Fm = fields();
  const R* const F[6] = {Fm[0], Fm[1], Fm[2], Fm[3], Fm[4], Fm[5]};
  auto value = [this](const std::string& field, long cell) { return magnetic_value(field, cell); };
  for (auto& m : maps_) m.record(k, total_steps_, F, g_, threads_);
  auto cell_at = [this](int i, int j) { return mag_.cell_at(i, j); };
  // over ranks each rank takes the frame rows of its own grid rows (slab_step.cpp)
  snaps_.record(k, F, g_, cell_at, value, sink_, FrameRows{row0_, row1_, ranks_ > 1});
}

template <class R>
void Simulation<R>::advance() {
  step();
  record();
}

template <class R>
bool Simulation<R>::settled() {
  if (!stop_.due(n_)) return false;
  gather_sums();  // every rank decides alike, from the same sums
  return stop_.settled(n_, g_.dt, held_energy(), power_spectra_, maps_);
}

template class Simulation<float>;
template class Simulation<double>;

}  // namespace ty

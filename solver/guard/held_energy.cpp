/// \file held_energy.cpp
/// \brief What the grid holds, as the guard (growth_guard.h) and `stop: auto` (stop_rule.h)
/// watch it: the energy of the fields, the magnets, the dispersive media's oscillators and
/// the rotated tensors' instances, summed row by row, and the first node that is not finite.
///
/// Over ranks each rank holds current values only in the rows it updates (slabs.h). A check
/// needs no more than a few numbers a row: each rank sums its own rows (row_held), one
/// allgather of those sums (and of the sources' work per row) makes every row's sum known to
/// every rank (gather_sums), and every rank adds them in row order, exactly as one process
/// adds its rows: the same bits for any rank count, so every rank decides alike. A pick
/// (the first non-finite node, the largest tilt) is taken within each rank's rows by the rule
/// one process applies to all of them, then among the ranks in rank order by the same rule.
#include <cmath>

#include "io/scene/units.h"
#include "solver/media/tensor_energy.h"
#include "solver/simulation.h"

namespace ty {

using constants::c0;
using constants::eta0;

/// Row j's fields, (1/2) eps E^2 + (1/2) mu0 H^2 over its nodes (E at n, H at n-1/2), J/m.
template <class R>
double Simulation<R>::row_fields(int j) const {
  double we = 0, wh = 0;
  for (int c = 0; c < 3; ++c)
    for (int r = row_runs_[3 * j + c]; r < row_runs_[3 * j + c + 1]; ++r) {
      const Run& run = runs_[r];
      if (run.kx == R(0)) continue;
      const double eps = (c0 * g_.dt / g_.dx) / static_cast<double>(run.kx);
      for (int i = run.i0; i < run.i1; ++i) {
        const double e = f_[c][g_.at(i, j)];
        we += eps * e * e;
      }
    }
  for (int c = 3; c < 6; ++c)
    for (int i = 0; i < g_.nx; ++i) {
      const double h = f_[c][g_.at(i, j)] / eta0;
      wh += h * h;
    }
  return 0.5 * (constants::eps0 * we + constants::mu0 * wh) * g_.dx * g_.dy;
}

/// Row j's fields, its magnetic cells' energy (magnetic_values.cpp) and its dispersive nodes'
/// oscillators' (ade.h), J/m.
template <class R>
double Simulation<R>::row_held(int j) const {
  double w = row_fields(j);
  if (!mag_.empty()) w += magnetic_energy_of(mag_.first_cell(j), mag_.first_cell(j + 1));
  if (!disp_.empty()) w += constants::eps0 * disp_.oscillator_energy(j) * g_.dx * g_.dy;
  return w;
}

/// One copy's held energy: its rows' in row order, and its rotated tensors' instances
/// (tensor_energy.h), the same list with the same values on every rank (slab_step.cpp).
template <class R>
double Simulation<R>::copy_held() const {
  double w = 0;
  for (int j = 0; j < g_.ny; ++j) w += ranks_ > 1 ? row_held_[j] : row_held(j);
  if (tensor_.empty()) return w;
  // row_held counts the list's nodes as vacuum ((1/2) E^2, as the sweep steps them); the
  // scheme keeps their instances' energy instead, poles included
  double t = instance_energy(tensor_);
  for (long q = 0; q < tensor_.count(); ++q) {
    const double e = static_cast<double>(f_[tensor_.comp[q]][tensor_.index[q]]);
    t -= 0.5 * e * e;
  }
  return w + constants::eps0 * t * g_.dx * g_.dy;
}

/// With Bloch sides both copies' (the complex field's energy: its real and imaginary parts').
template <class R>
double Simulation<R>::held_energy() const {
  return copy_held() + (twin_ ? twin_->copy_held() : 0.0);
}

/// Each row's held energy and work from its rank to every rank; with `summary` (once, at the
/// end) each row's field energy, the midpoint cell-steps and (onto rank 0) the spectral maps' rows too.
template <class R>
void Simulation<R>::gather_sums(bool summary) {
  if (ranks_ == 1) return;
  if (twin_) twin_->gather_sums(summary);
  for (int j = row0_; j < row1_; ++j) row_held_[j] = row_held(j);
  parallel::allgather_bytes(row_held_.data(), work_counts_);  // a double a row, each rank its rows
  parallel::allgather_bytes(injected_.data(), work_counts_);
  if (!summary) return;
  for (int j = row0_; j < row1_; ++j) row_fields_[j] = row_fields(j);
  parallel::allgather_bytes(row_fields_.data(), work_counts_);
  gather_tilted_count();
  gather_maps();  // recorder_gather.cpp
}

/// Row by row, as held_energy (over ranks the rows' sums of the last gather_sums(true)).
template <class R>
double Simulation<R>::field_energy() const {
  double w = 0;
  for (int j = 0; j < g_.ny; ++j) w += ranks_ > 1 ? row_fields_[j] : row_fields(j);
  // a Bloch pair's energy is that of the complex field A + iB: both copies' (they exchange it
  // across the seam, so either alone swings)
  return w + (twin_ ? twin_->field_energy() : 0.0);
}

/// Each rank looks through its own rows (row-major, E before H); the first rank's find is the
/// first in the grid's order, as one process finds it.
template <class R>
bool Simulation<R>::find_nonfinite(int& i, int& j, Component& c) const {
  long at = -1;  // (row * 6 + component) * nx + column: increasing in the search order
  for (int jj = row0_; jj < row1_ && at < 0; ++jj)
    for (int q = 0; q < 6 && at < 0; ++q)
      for (int ii = 0; ii < g_.nx; ++ii)
        if (!std::isfinite(static_cast<double>(f_[q][g_.at(ii, jj)]))) {
          at = (static_cast<long>(jj) * 6 + q) * g_.nx + ii;
          break;
        }
  if (ranks_ > 1)
    for (const parallel::Pick& p : parallel::picks_over_ranks({0.0, at}))
      if (p.where >= 0) {
        at = p.where;
        break;
      }
  if (at < 0) return false;
  i = static_cast<int>(at % g_.nx), c = static_cast<Component>(at / g_.nx % 6), j = static_cast<int>(at / g_.nx / 6);
  return true;
}

#define TY_HELD_ENERGY(R)                                                    \
  template double Simulation<R>::row_fields(int) const;                      \
  template double Simulation<R>::row_held(int) const;                        \
  template double Simulation<R>::copy_held() const;                          \
  template double Simulation<R>::held_energy() const;                        \
  template void Simulation<R>::gather_sums(bool);                            \
  template double Simulation<R>::field_energy() const;                       \
  template bool Simulation<R>::find_nonfinite(int&, int&, Component&) const;
TY_HELD_ENERGY(float)
TY_HELD_ENERGY(double)
#undef TY_HELD_ENERGY

}  // namespace ty

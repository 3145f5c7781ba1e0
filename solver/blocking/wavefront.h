/// \file wavefront.h
/// \brief Temporal blocking over rows: the schedule of several time steps in one pass over
/// the grid (a wavefront), derived from the curl table's row reaches (curl_stencil.h).
///
/// The scheme is the pipelined multicore wavefront of Wellein, Hager, Zeiser, Wittmann &
/// Fehske, "Efficient temporal blocking for stencil computations by multicore-aware
/// wavefront parallelization", COMPSAC 2009; Malas, Hager, Ltaief, Stengel, Wellein &
/// Keyes, "Multicore-optimized wavefront diamond blocking for optimizing stencil updates",
/// SIAM J. Sci. Comput. 37, C439 (2015), sec. 2, for the wavefront's dependencies.
///
/// The unit of work is (j, t): row j's H, then its E, at step t of the block, exactly the
/// one-pass sweep's work on that row (Simulation::h_row, e_row), so a blocked run gives the
/// same bits. From the table: an H row reads E rows up to `a` above it (old values), an E
/// row reads H rows up to `b` below it (new values). Hence (j, t) needs, besides the rows
/// below it at step t (ascending order), the unit (j + r, t - 1) done, r = max(a, b): H(j)
/// reads E(j + a) of step t - 1, and E(j + b) of step t - 1 reads the H(j) that (j, t)
/// overwrites. Units on the front w = j + skew * t are then independent for skew = r + 1.
/// Threads take contiguous groups of the block's steps; a thread's first step waits on the
/// rows done by the step before it (a counter per step; release / acquire).
#pragma once
#include <algorithm>

#include "solver/blocking/progress.h"
#include "solver/grid/curl_stencil.h"

namespace ty::blocking {

struct RowReach {
  int h_reads_e_above = 0;  ///< a: largest dj of an H <- E term
  int e_reads_h_below = 0;  ///< b: largest -dj of an E <- H term
};

constexpr bool is_h(Component c) { return c == Component::Hx || c == Component::Hy || c == Component::Hz; }

/// The row reaches of the curl table (curl_stencil.h).
constexpr RowReach row_reach() {
  RowReach r;
  for (const CurlTerm& t : kCurlTerms) {
    if (is_h(t.p)) r.h_reads_e_above = std::max(r.h_reads_e_above, t.dj);
    else r.e_reads_h_below = std::max(r.e_reads_h_below, -t.dj);
  }
  return r;
}

/// Rows ahead of (j, t) that step t - 1 must have finished: r = max(a, b).
constexpr int kLead = std::max(row_reach().h_reads_e_above, row_reach().e_reads_h_below);
/// Rows between the steps on one front.
constexpr int kSkew = kLead + 1;

/// What the magnetic cells of row j reach (magnetic_cells.h, magnetic_step.cpp):
/// gather_above: their field G H takes Hy of up to this many rows above (Hy(i, j+1));
/// neighbours: their field takes the dM of cells up to this many rows away (the cells below
/// and above), and their dM goes into Hy of the rows that far above (scatter_hy).
struct MagneticReach {
  int gather_above = 1;
  int neighbours = 1;
};

/// Rows ahead for a scene with magnetic cells. Its unit (j, t) (Simulation::magnetic_unit)
/// is: gather b(n-1/2) of cell row j + g and H of row j + g (g = gather_above: the cells of
/// row j read H* of row j + g), then the cells of row j, their scatter, and E of row j. So
/// H runs g rows ahead of E, and (j, t) needs of step t - 1:
///   H of row j + g reads E up to row j + g + a      -> unit j + g + a;
///   it overwrites H that E up to row j + g + b read -> unit j + g + b;
///   b(n-1/2) of row j + g reads final H up to j + 2g -> unit j + 2g (H of a row is final
///     when its own unit has scattered into it);
///   the cells read, and overwrite the dM buffer of, cells up to n rows away -> unit j + n.
constexpr int magnetic_lead(RowReach r, MagneticReach m) {
  const int g = m.gather_above;
  return std::max({g + r.h_reads_e_above, g + r.e_reads_h_below, 2 * g, m.neighbours});
}
constexpr int kMagneticLead = magnetic_lead(row_reach(), MagneticReach{});

/// One thread's part of a block of `depth` steps over `ny` rows: steps [t0, t1) of the
/// block, visited front by front; unit(j, t) does the work, progress carries the rows done.
/// lead: rows ahead of (j, t) that step t - 1 must have finished (kLead, kMagneticLead); the
/// fronts are lead + 1 rows apart per step.
template <class Unit>
void sweep_steps(int ny, int t0, int t1, Progress& progress, Unit&& unit, int lead = kLead) {
  if (t1 <= t0) return;
  const int skew = lead + 1;
  const int fronts = ny + skew * (t1 - t0 - 1);
  int seen = 0;
  for (int w = 0; w < fronts; ++w) {
    for (int t = t0; t < t1; ++t) {
      const int j = w - skew * (t - t0);
      if (j < 0) break;
      if (j >= ny) continue;
      if (t == t0 && t0 > 0) progress.wait(t0 - 1, std::min(ny, j + lead + 1), seen);
      unit(j, t);
      if (t == t1 - 1) progress.finished(t, j + 1);
    }
  }
}

}  // namespace ty::blocking

/// \file magnetic_cells.h
/// \brief The compact list of magnetic cells: where the sublattice magnetizations live on
/// the Yee grid, how the wave field is gathered to them and their change scattered back,
/// and their state (kept in double whatever the field precision).
///
/// Placement: M lives at cell centres (i+1/2, j+1/2), the Hz node. A cell is magnetic when
/// its centre lies in a magnetic medium (and not on a magnetic wall, where tangential H is
/// held at zero). The field at the cell is gathered as
///   b_x = (Hx(i,j) + Hx(i+1,j))/2,  b_y = (Hy(i,j) + Hy(i,j+1))/2,  b_z = Hz(i,j)  (times mu0),
/// and the change of M is scattered with the transposed weights (1/2 to each of the two
/// Hx and Hy nodes, 1 to Hz), so that the coupling energy mu0 M . (G h) = mu0 (G^T M) . h
/// is the same seen from either side: an H node at a body's edge takes half of its one
/// magnetic neighbour's change. Gather G and scatter P = G^T are exact transposes; a node
/// outside the grid (the ghost line past a non-periodic edge) is in neither. Across a
/// periodic seam both use the wrapped node: the scatter writes Hx(0) for the last column's
/// right face and the gather reads it through the ghost column nx, which the periodic
/// boundary keeps equal to Hx(0) (solver/grid/boundaries/periodic.h).
///
/// Time: M and H at half steps. Faraday's law advances B = mu0 (H + M) (h* = H - c dt curl E),
/// then each cell's magnetization moves from n-1/2 to n+1/2 in the field
///   b(t) = G B(t) / mu0 - mu0 dM(t)   (dM: the deviation from the ground state),
/// G B taken as varying linearly between G B(n-1/2) and G B(n+1/2) (the gathered
/// H plus G P dM(n-1/2) at both ends: gathered before Faraday's law moves H, and G h*), the
/// cell's own M taken off whole inside the step (self field 1 along x and y; along z G P = 1
/// and the own reaction does it); then H = h* - P dM exactly. This is the field of the energy
///   mu0 H^2 / 2 at the nodes + (|mu0 dM|^2 - |P mu0 dM|^2) / (2 mu0) per cell,
/// non-negative because |P v| <= |v|, so the coupled step keeps its energy bounded
/// (magnetic_energy() adds the second term).
///
/// Why not G H alone (the earlier rule): G P is not the identity along x and y, so a cell saw
/// its own and its neighbours' M through (1/2, 1/4, 1/4) weights: a longitudinal field
/// -cos^2(k dx/2) M_x instead of -M_x, which moves the pole of the Voigt permeability
/// (mu_xx = 0) and made a half-space's reflectance there wrong by far more than the cell
/// squared (measured in docs/magnets.md); surface cells needed a hand-made self field of M/4
/// per face. With b = G B / mu0 - M the
/// demagnetizing field of a plane wave (B_x = 0: H_x = -M_x) and of a uniformly magnetized
/// surface cell (B_n continuous) are exact, and only B is interpolated (cos(k dx / 2)).
///
/// Absorbing layers: a side whose layer holds magnetic cells takes the graded loss on E and
/// H (solver/grid/graded_loss.h), the cells' own step unchanged; a PML there can amplify the
/// backward waves a hyperbolic or negative-permeability medium carries (Becache, Fauqueux &
/// Joly, J. Comput. Phys. 188, 399 (2003)).
///
/// Layout: cells are listed row by row, left to right, in runs of one medium along a row
/// (`runs`, those of row j at row_runs[j] .. row_runs[j+1]), so that gathers and scatters
/// read and write contiguous stretches of the field rows and the solver can move a row's
/// cells in the same sweep as the row's fields. Over MPI ranks every rank lists every cell
/// (runs, ci, cj, medium: 12 bytes a cell) but the neighbours and the state are mapped pages
/// (solver/grid/aligned.h) written only for its own rows and the row beyond each side, so
/// those (128 bytes a cell) are resident on the rank that steps them.
#pragma once
#include <array>
#include <vector>

#include "io/scene/scene.h"
#include "solver/grid/aligned.h"
#include "materials/magnetic/cell_step.h"
#include "materials/magnetic/ground_state.h"

namespace ty {

/// One term of the gather G of cell (i, j): the H node (q, i + di, j + dj) with weight w, as
/// gather() in magnetic_run.h reads them (the scatter P = G^T writes the same nodes). What
/// crosses a cut between ranks in the magnetic step is derived from this table
/// (solver/parallel/magnet_halo.h), as the field halo is from the curl stencil table.
struct CellNode {
  Component q;
  int di, dj;
  double w;
};
inline constexpr CellNode kCellGather[] = {{Component::Hx, 0, 0, 0.5}, {Component::Hx, 1, 0, 0.5},
                                           {Component::Hy, 0, 0, 0.5}, {Component::Hy, 0, 1, 0.5},
                                           {Component::Hz, 0, 0, 1.0}};

struct MagneticCells {
  struct Run {
    int i0, i1;  ///< cells (i0 .. i1-1, j)
    long k0;     ///< list index of cell i0
    int slot;    ///< medium slot (steps, models, ground)
  };
  std::vector<Run> runs;
  std::vector<int> row_runs;  ///< size ny + 1
  /// per run: whether it held a tilted cell at its last step, so that its next step takes the
  /// pass that keeps what the large-tilt paths read at once (magnetic_step.cpp; a hint only:
  /// either pass gives the same values)
  std::vector<unsigned char> run_tilted;
  // per cell
  std::vector<int> ci, cj;                 ///< cell indices
  std::vector<int> medium;                 ///< medium slot
  MappedVector<int> left, right, down, up;  ///< neighbouring magnetic cells (count(): none)
  /// m1 xyz, m2 xyz (unit vectors; m2 = 0 for one sublattice), two copies: the step reads one
  /// and writes the other; m[latest] is the state now
  MappedVector<double> m[2][6];
  int latest = 0;
  /// The copy of m (and of dM) that holds the state after n steps: step k reads m[1 - (k & 1)]
  /// and writes m[k & 1], so after n steps the newest is m[(n - 1) & 1] = m[(n + 1) & 1] (both
  /// copies hold the starting state before the first step).
  static int newest(long n) { return static_cast<int>((n + 1) & 1); }
  /// change of mu0 M_y over a step (T), by the parity of the step: this step's and the
  /// previous one's (the Hy scatter of the row above reads it, over ranks too); entry count()
  /// is a zero that missing neighbours read. The changes along x and z feed only the Hx and Hz
  /// nodes of the cell's own row, so they never leave the stepping thread's row scratch
  /// (magnetic_step.cpp): 32 bytes a cell less written to memory, and as much read for it.
  MappedVector<double> dMy[2];
  // per magnetic medium
  std::vector<CellStep> steps;
  std::vector<MagnetModel> models;
  std::vector<MagneticState> ground;
  /// mu0 Ms of each sublattice (0 for a missing second one) and the ground state's net mu0 M
  /// (T): mu0 (M - M_ground) = mu[0] m1 + mu[1] m2 - net_ground
  std::vector<std::array<double, 5>> net;
  int longest_row = 0;  ///< most cells in one row

  long count() const { return static_cast<long>(ci.size()); }
  /// List index of the first cell of row j or of a later row (count() past the last).
  long first_cell(int j) const {
    return row_runs[j] < static_cast<int>(runs.size()) ? runs[row_runs[j]].k0 : count();
  }
  bool empty() const { return ci.empty(); }
  /// List index of the cell at (i, j), -1 if it is not magnetic or off the grid (a scan of
  /// row j's runs).
  long cell_at(int i, int j) const {
    if (j < 0 || j + 1 >= static_cast<int>(row_runs.size())) return -1;
    for (int r = row_runs[j]; r < row_runs[j + 1]; ++r)
      if (i >= runs[r].i0 && i < runs[r].i1) return runs[r].k0 + (i - runs[r].i0);
    return -1;
  }

  /// The cost of a cell's own step in vacuum cells, for cutting rows among threads:
  /// `bench --case magnetic` (every cell MnF2, 1024^2) measured 9.2-10.6x a vacuum cell in all
  /// on an idle machine, 6.6x at 4096^2 (docs/performance.md); the cut is not sensitive to
  /// it (weights 3, 5 and 8 gave the negative-refraction study the same time within 3%).
  static constexpr double kCellWork = 8.0;
  /// Work of rows 0 .. j-1 of an nx-column grid (ny + 1 entries; solver/threads/block_rows.h
  /// work_rows): nx vacuum cells a row, and kCellWork more per magnetic cell.
  std::vector<double> row_work(int nx) const {
    const int ny = static_cast<int>(row_runs.size()) - 1;
    std::vector<double> w(static_cast<std::size_t>(ny) + 1, 0.0);
    for (int j = 0; j < ny; ++j)
      w[j + 1] = w[j] + nx + kCellWork * static_cast<double>(first_cell(j + 1) - first_cell(j));
    return w;
  }

  /// mu0 (M - M_ground) along c (0, 1, 2) of cell k in the state m[p]; 0 for k = count()
  double deviation(int p, int c, long k) const {
    if (k == count()) return 0.0;
    const std::array<double, 5>& a = net[medium[k]];
    return a[0] * m[p][c][k] + a[1] * m[p][3 + c][k] - a[2 + c];
  }

  /// Whether grid cell (i, j) lies in the absorbing layers (npx, npy cells a side of an
  /// nx x ny grid).
  static bool in_layers(int i, int j, int nx, int ny, int npx, int npy) {
    return i < npx || i >= nx - npx || j < npy || j >= ny - npy;
  }

  /// The largest angle (rad) between a sublattice and its ground-state direction over the
  /// cells inside (absorber = true) or outside the absorbing layers (npx, npy cells a side of
  /// an nx x ny grid): growth inside them alone is the PML amplifying a backward wave. Cells
  /// [k0, k1) of the list (over ranks, a rank's own; k1 < 0: to the end).
  double largest_tilt(bool absorber, int nx, int ny, int npx, int npy, long k0 = 0, long k1 = -1) const {
    double worst = 0;
    for (long k = k0; k < (k1 < 0 ? count() : k1); ++k) {
      const bool in = in_layers(ci[k], cj[k], nx, ny, npx, npy);
      if (in != absorber) continue;
      const MagneticState& g = ground[medium[k]];
      for (int s = 0; s < 2; ++s) {
        const Vec3 now(m[latest][3 * s][k], m[latest][3 * s + 1][k], m[latest][3 * s + 2][k]);
        if (now.squaredNorm() == 0) continue;  // one sublattice
        worst = std::max(worst, std::atan2(now.cross(g.m[s]).norm(), now.dot(g.m[s])));
      }
    }
    return worst;
  }
};

}  // namespace ty

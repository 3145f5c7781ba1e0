/// \file magnetic_cells.h
/// \brief The compact list of magnetic cells: where the sublattice magnetizations live on
/// the Yee grid, how the wave field is gathered to them and their change scattered back,
/// and their state (kept in double whatever the field precision).
///
/// Placement: M lives at cell centres (i+1/2, j+1/2), the Hz node. A cell is magnetic when
/// its centre lies in a magnetic medium. The field at the cell is gathered as
///   b_x = (Hx(i,j) + Hx(i+1,j))/2,  b_y = (Hy(i,j) + Hy(i,j+1))/2,  b_z = Hz(i,j)  (times mu0),
/// and the change of M is scattered with the transposed weights (1/2 to each of the two
/// Hx and Hy nodes, 1 to Hz), so that the coupling energy mu0 M . (G h) = mu0 (G^T M) . h
/// is the same seen from either side: an H node at a body's edge takes half of its one
/// magnetic neighbour's change. Gather G and scatter P = G^T are exact transposes.
///
/// Time: M and H at half steps. Faraday's law advances B = mu0 (H + M) (h* = H - c dt curl E),
/// then each cell's magnetization moves from n-1/2 to n+1/2 by the midpoint rule with the
/// field interpolated between b(n-1/2) and b(n+1/2) = G h* - G P dM, the cell's own share
/// of G P dM (1/2, 1/2, 1) taken implicitly inside the step, its neighbours' share from
/// their previous step; then H = h* - P dM exactly.
#pragma once
#include <vector>

#include "materials/ground_state.h"
#include "materials/llg_cell.h"

namespace ty {

struct MagneticCells {
  // per cell
  std::vector<int> ci, cj;                      ///< cell indices
  std::vector<int> medium;                      ///< index into coeffs / ground
  std::vector<long> hx0, hx1, hy0, hy1, hz;     ///< flat indices of the gathered nodes (-1: none)
  std::vector<int> left, right, down, up;       ///< neighbouring magnetic cells (-1: none)
  std::vector<double> m[6];                     ///< m1 xyz, m2 xyz (unit vectors)
  std::vector<double> guess[6];                 ///< last sub-step's change of m (predictor)
  std::vector<double> b_old[3], b_new[3];       ///< mu0 h at n-1/2 and (less neighbours' share) n+1/2, T
  std::vector<double> dM[3], dM_prev[3];        ///< change of mu0 M over the step, T
  // per scattered H node: flat index, component (3 = Hx ...), up to two cells with weights
  struct Node {
    long index;
    int comp;
    int cell[2];
    double weight[2];
  };
  std::vector<Node> nodes;
  // per magnetic medium
  std::vector<LlgCoefficients> coeffs;
  std::vector<MagnetModel> models;
  std::vector<MagneticState> ground;
  std::vector<int> cell_of;       ///< grid cell (j * nx + i) -> list index, -1 if not magnetic

  long count() const { return static_cast<long>(ci.size()); }
  bool empty() const { return ci.empty(); }
};

}  // namespace ty

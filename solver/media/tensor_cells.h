/// \file tensor_cells.h
/// \brief The in-plane E nodes (Ex, Ey) of media whose permittivity tensor has eps_xy != 0
/// (principal axes u, v rotated off x, y with u and v unlike), with the nodes around them, as a
/// compact list stepped after each sweep. The sweep updates these nodes as vacuum (ca = cb = 1,
/// absorber and sources included), so E_after - E_old is the displacement increment
/// g = c dt curl(eta0 H)^{n+1/2} of node q; the list then solves the constitutive relation.
///
/// Scheme (D form, Werner & Cary, J. Comput. Phys. 226, 1085 (2007), sec. 3: update D from
/// the curl, then E = K D with the off-diagonal coupling averaged over the four nearest nodes
/// of the other component with the same weight both ways, so the averaged operator is
/// symmetric and, for a positive definite tensor, positive definite: the scheme keeps the
/// Yee energy bounded under the vacuum Courant condition c dt sqrt(1/dx^2 + 1/dy^2) <= 1 when
/// every cell's eps_inf has eigenvalues >= 1). Dispersion is the trapezoidal ADE of
/// materials/permittivity/ade.h with each pole along a direction d (u or v of its medium;
/// x or y for a plain medium): P = sum_k d_k p_k and
///   p_k' = p_k + a[(1 + c1) j_k + c2 p_k] + a c3_k d_k . (E' + E),   a = dt/2.
/// With D = eps_inf E + P and D' = D + g - x_s (E' + E), x_s = a sigma/eps0, per node
///   (eps_inf + Y + x_s) E' = F,   F = D + g - Q - (Y + x_s) E,
///   Y = sum_k a c3_k d_k d_k^T,   Q = sum_k d_k {p_k + a[(1 + c1) j_k + c2 p_k]},
/// and E'_c = K_cc F_c + sum_m w_m F_m over the neighbours m of the other component,
/// K = (eps_inf + Y + x_s)^-1 of each node, w_m = (K_xy(q) + K_xy(m))/8 (Werner & Cary's
/// symmetric averaging; 1/4 of the pair's mean). The node's other component, needed for the
/// vector E that drives the poles and for (Y + x_s) E, is the mean of its four neighbours.
/// Three passes over the list, each a parallel loop over nodes (the same bits for any thread
/// count): F; E'; then D and the poles.
///
/// Interfaces: a node of this list takes the medium of most of its cell's 4 x 4 samples, not
/// the mean over the cell that other nodes take. The mean of a tensor is right for the field
/// along the interface but not for the field normal to it, whose proper mean is of 1/eps
/// (Kottke, Farjadpour & Johnson, Phys. Rev. E 77, 036611 (2008), whose anisotropic mean does
/// not carry over to poles); with eps_xy != 0 the normal field is driven, and the arithmetic
/// mean put a spurious resonance at (eps_nn + 1)/2 = 0 on the face of a phonon crystal (|r|
/// off by 0.18 near 8 THz in the half-space test). The staircase moves a face by up to half a
/// cell, which leaves a half-space's |r| and a beam's walk-off alone.
#pragma once
#include <array>
#include <vector>

namespace ty {

struct Scene;
struct YeeGrid;

/// One pole of a tensor node: the trapezoidal coefficients (ade.h) and its direction in the plane.
struct TensorPole {
  double c1 = 0, c2 = 0, c3 = 0;
  double dx = 1, dy = 0;
};

/// One node while the list is built: its averaged in-plane background, conductivity and poles.
struct TensorNode {
  long index = 0;
  int comp = 0, i = 0, j = 0;
  double eps[2][2] = {{1, 0}, {0, 1}};
  double sigma = 0;
  std::vector<TensorPole> poles;
};

struct TensorCells {
  std::vector<long> index;                      ///< field index of the node
  std::vector<int> comp;                        ///< 0 Ex, 1 Ey
  std::vector<double> k_own, k_cross;           ///< row comp of K
  std::vector<double> y_own, y_cross, x_sigma;  ///< row comp of Y + x_s, and x_s
  std::vector<std::array<int, 4>> nb;           ///< list index of the four neighbours, -1 none
  std::vector<std::array<long, 4>> nb_field;    ///< their field index, -1 outside the grid
  std::vector<std::array<double, 4>> w;         ///< pair weights
  std::vector<int> pole_first;                  ///< poles of node q: [pole_first[q], pole_first[q+1])
  std::vector<TensorPole> poles;
  std::vector<double> d, e_own, e_other;  ///< state per node: D/eps0 (V/m), E and the other component
  std::vector<double> p, j;               ///< state per pole
  std::vector<double> f, g;               ///< scratch per node
  double half_dt = 0;

  bool empty() const { return index.empty(); }
  long count() const { return static_cast<long>(index.size()); }

  /// The constitutive step after the sweep (E holds E_old + g at the list's nodes).
  template <class R>
  void step(R* const* E, int threads);

 private:
  double q_of(int q) const;
};

/// Whether in-plane node (c, i, j) samples a medium with eps_xy != 0 (4 x 4 samples, as the
/// coefficients of solver/media/coefficient_runs.cpp).
bool samples_rotated(const Scene& s, const YeeGrid& g, int c, int i, int j);

/// The averaged background tensor, conductivity and directed poles of node (c, i, j); false
/// where the node's centre is in a perfect conductor (it stays out of the list).
bool tensor_node(const Scene& s, const YeeGrid& g, int c, int i, int j, TensorNode& out);

/// The list from the nodes found (any order), with their coefficients and neighbour links
/// (wrapped across the seam of a periodic axis).
TensorCells join_tensor_nodes(std::vector<TensorNode>& nodes, const YeeGrid& g, bool wrap_x, bool wrap_y);

/// Below this many nodes the passes run on one thread: three parallel regions per step cost
/// more than the work (and, on a loaded machine, a time slice per barrier).
constexpr long kSerialNodes = 4096;

template <class R>
void TensorCells::step(R* const* E, int threads) {
  const long n = count();
  const double a = half_dt;
#pragma omp parallel for schedule(static) num_threads(threads) if (n > kSerialNodes)
  for (long q = 0; q < n; ++q) {  // F = D + g - Q - (Y + x_s) E
    g[q] = static_cast<double>(E[comp[q]][index[q]]) - e_own[q];
    f[q] = d[q] + g[q] - q_of(static_cast<int>(q)) - y_own[q] * e_own[q] - y_cross[q] * e_other[q];
  }
#pragma omp parallel for schedule(static) num_threads(threads) if (n > kSerialNodes)
  for (long q = 0; q < n; ++q) {  // E' = K F, the other component's F averaged
    double e = k_own[q] * f[q];
    for (int m = 0; m < 4; ++m)
      if (nb[q][m] >= 0) e += w[q][m] * f[nb[q][m]];
    E[comp[q]][index[q]] = static_cast<R>(e);
  }
#pragma omp parallel for schedule(static) num_threads(threads) if (n > kSerialNodes)
  for (long q = 0; q < n; ++q) {  // D and the poles with E' + E
    const double own = static_cast<double>(E[comp[q]][index[q]]);
    double other = 0;
    for (int m = 0; m < 4; ++m)
      if (nb_field[q][m] >= 0) other += 0.25 * static_cast<double>(E[1 - comp[q]][nb_field[q][m]]);
    d[q] += g[q] - x_sigma[q] * (own + e_own[q]);
    const double sx = comp[q] == 0 ? own + e_own[q] : other + e_other[q];
    const double sy = comp[q] == 0 ? other + e_other[q] : own + e_own[q];
    for (int k = pole_first[q]; k < pole_first[q + 1]; ++k) {
      const TensorPole& P = poles[k];
      const double jn = P.c1 * j[k] + P.c2 * p[k] + P.c3 * (P.dx * sx + P.dy * sy);
      p[k] += a * (jn + j[k]);
      j[k] = jn;
    }
    e_own[q] = own;
    e_other[q] = other;
  }
}

/// Q_c of node q: the known part of P' along the node's component.
inline double TensorCells::q_of(int q) const {
  double s = 0;
  const double a = half_dt;
  for (int k = pole_first[q]; k < pole_first[q + 1]; ++k) {
    const TensorPole& P = poles[k];
    s += (comp[q] == 0 ? P.dx : P.dy) * (p[k] + a * ((1 + P.c1) * j[k] + P.c2 * p[k]));
  }
  return s;
}

}  // namespace ty

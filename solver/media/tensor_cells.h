/// \file tensor_cells.h
/// \brief The in-plane E nodes (Ex, Ey) of media whose permittivity tensor has eps_xy != 0
/// (principal axes u, v rotated off x, y with u and v unlike), with two layers of nodes
/// around them, as a compact list stepped after each sweep. The sweep updates these nodes as
/// vacuum (ca = cb = 1, absorber and sources included), so E_after - E_old is the
/// displacement increment g = c dt curl(eta0 H)^{n+1/2} of node q; the list then gets E from
/// the displacement through the medium's inverse permittivity, poles and conduction included.
///
/// Scheme (docs/method.md, "Rotated in-plane tensors"): the symmetric four-node averaging of
/// Werner & Cary, J. Comput. Phys. 226, 1085 (2007), built from passive pieces so that it
/// holds for the whole constitutive relation (poles and conduction), not only for a
/// constant tensor, and the discrete system keeps an energy. Each node q carries instances,
/// each a copy of the node medium's inverse permittivity as a filter: per principal axis a
/// the scalar trapezoidal ADE of materials/permittivity/ade.h (Taflove & Hagness ch. 9 in the
/// Crank-Nicolson form) with the axis field E_a as output and a . (its input) as the
/// displacement increment. An instance reads a linear map S of the nodes' increments g, and
/// the node fields are the transpose maps of the instances' fields e = u E_u + v E_v:
///   E = sum_inst w S^T e.
/// - full (w 1/2): S g = (g_q, gm), gm = (1/4) sum_m g_m over the four neighbours m of the
///   other component (own field to q, the other component e/4 to each m);
/// - deviation i (w 1/8, where all four neighbours are in the list): S g = (0, g_mi - gm),
///   its other component fed back as +e to m_i and -e/4 to each m. With the full instance it
///   makes a uniform medium's operator exactly Werner & Cary's: diagonal K_cc per node,
///   cross terms (K_xy(q) + K_xy(m))/8, so a rotation by 0 in the bulk is the plain step;
/// - own (at the list's rim, beside electric walls, and at a face: nodes of different media
///   are not linked, so a face node's diagonal stays its own medium's): S g = (g_q, 0) with
///   the weight that brings sum_inst w |S x|^2 to |x|^2 and the node's diagonal to 1.
/// Each instance is a passive scalar system per axis (lossless: W_a = eps_inf E_a^2/2 + sum_k
/// (j_k^2 + w0_k^2 p_k^2)/(2 W_k^2) kept exactly by the trapezoidal rule), so
/// sum_nodes (E' + E)/2 . (D' - D) = sum_inst w (W' - W) + losses; with Yee's curl pair the
/// energy is conserved (lossless) or decays, and since sum_inst w |S x|^2 <= |x|^2 it is
/// positive under the vacuum Courant condition wherever eps_inf >= 1: the tensor and its
/// poles add no step limit. Three passes over the list, each a parallel loop writing only
/// its own slots (the same bits for any thread count): g per node; the node's instances; E
/// per node (tensor_step.cpp).
///
/// Interfaces: a node of this list takes the medium of most of its cell's 4 x 4 samples, not
/// the mean over the cell that other nodes take. The mean of a tensor is right for the field
/// along the interface but not for the field normal to it, whose proper mean is of 1/eps
/// (Kottke, Farjadpour & Johnson, Phys. Rev. E 77, 036611 (2008), whose anisotropic mean does
/// not carry over to poles); with eps_xy != 0 the normal field is driven, and the arithmetic
/// mean put a spurious resonance at (eps_nn + 1)/2 = 0 on the face of a phonon crystal. The
/// staircase moves a face by up to half a cell.
#pragma once
#include <array>
#include <vector>

#include "materials/permittivity/ade.h"

namespace ty {

struct Scene;
struct YeeGrid;

/// One node while the list is built: its medium's principal frame, per-axis background and poles.
struct TensorNode {
  long index = 0;
  int comp = 0, i = 0, j = 0;
  double cs = 1, sn = 0;          ///< u = (cs, sn), v = (-sn, cs)
  double eps[2] = {1, 1};         ///< eps_inf along u and v
  double sigma = 0;               ///< conductivity (S/m)
  std::vector<AdePole> poles[2];  ///< poles along u and v
};

struct TensorCells {
  enum Kind : int { full = 0, own = 1, deviation = 2 };  ///< deviation + i: that of neighbour slot i

  std::vector<long> index;               ///< field index of node q
  std::vector<int> comp;                 ///< 0 Ex, 1 Ey
  std::vector<std::array<int, 4>> nb;    ///< list index of the four neighbours, -1 none
  std::vector<std::array<int, 4>> back;  ///< the slot of q in its neighbour's nb
  std::vector<double> cs, sn;            ///< the node medium's principal frame
  std::vector<int> inst_first;           ///< instances of node q: [inst_first[q], inst_first[q+1])
  std::vector<int> kind;                 ///< per instance
  std::vector<double> weight;            ///< per instance
  std::vector<AdeNode> axis;             ///< per instance and axis (2 s + a): ca, cb, corr
  std::vector<int> pole_first;           ///< poles of instance s, axis a: [pole_first[2s+a], pole_first[2s+a+1])
  std::vector<AdePole> poles;
  std::vector<double> e_axis;  ///< state per instance and axis: E_a (V/m)
  std::vector<double> e_node;  ///< state per node: the E written last step
  std::vector<double> p, j;    ///< state per pole: P/eps0 (V/m) and its rate
  std::vector<double> g, out_own, out_other;  ///< scratch per node
  std::vector<std::array<double, 4>> out_dev;  ///< scratch per node: the deviation instances' fields
  double half_dt = 0;

  bool empty() const { return index.empty(); }
  long count() const { return static_cast<long>(index.size()); }
  long instances() const { return static_cast<long>(kind.size()); }

  /// The constitutive step after the sweep (E holds E_old + g at the list's nodes); tensor_step.cpp.
  template <class R>
  void step(R* const* E, int threads);

 private:
  void step_node(long q);
  void step_instance(long s, int c, double cs, double sn, double in_own, double in_other, double& e_own,
                     double& e_other);
};

/// Whether in-plane node (c, i, j) samples a medium with eps_xy != 0 (4 x 4 samples, as the
/// coefficients of solver/media/coefficient_runs.cpp).
bool samples_rotated(const Scene& s, const YeeGrid& g, int c, int i, int j);

/// The principal frame, backgrounds, conductivity and poles of node (c, i, j); false where
/// the node's centre is in a perfect conductor (it stays out of the list).
bool tensor_node(const Scene& s, const YeeGrid& g, int c, int i, int j, TensorNode& out);

/// The list from the nodes found (any order), with its sites and neighbour links (wrapped
/// across the seam of a periodic axis).
TensorCells join_tensor_nodes(std::vector<TensorNode>& nodes, const YeeGrid& g, bool wrap_x, bool wrap_y);

/// Below this many nodes the passes run on one thread: three parallel regions per step cost
/// more than the work (and, on a loaded machine, a time slice per barrier).
constexpr long kSerialNodes = 4096;

extern template void TensorCells::step<float>(float* const*, int);
extern template void TensorCells::step<double>(double* const*, int);

}  // namespace ty

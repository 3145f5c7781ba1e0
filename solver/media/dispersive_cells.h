/// \file dispersive_cells.h
/// \brief The E nodes of dispersive media as a compact list, like the magnetic cells: per
/// node its index, component, correction coefficient and poles, sorted by row, so rows
/// without dispersion cost nothing and vacuum and dielectric rows keep their runs. The
/// node's ca and cb are in its coefficient run as for any dielectric; the list adds the
/// polarization currents of the trapezoidal ADE step (materials/permittivity/ade.h):
/// before a row's E update the old E is kept, after it (absorber and sources included) the
/// row's nodes subtract corr * sum[(1 + c1) j + c2 p] and advance their poles with E' + E.
/// State (p, j) is in double whatever the field precision. A node's row is its E row, so the
/// thread that owns the row owns its nodes: the results do not depend on the thread count.
#pragma once
#include <string>
#include <vector>

#include "materials/permittivity/ade.h"
#include "solver/grid/aligned.h"

namespace ty {

/// One dispersive node while the list is built.
struct DispersiveNode {
  long index = 0;
  int comp = 0;
  std::vector<AdePole> poles;
  double corr = 0;
};

struct DispersiveCells {
  std::vector<int> row_first;   ///< nodes of row j: [row_first[j], row_first[j+1])
  std::vector<long> index;      ///< field index of the node
  std::vector<int> comp;        ///< 0 Ex, 1 Ey, 2 Ez
  std::vector<double> corr;     ///< a/k+ of the node
  std::vector<int> pole_first;  ///< poles of node q: [pole_first[q], pole_first[q+1])
  std::vector<AdePole> poles;
  /// state per pole: P/eps0 (V/m) and its rate (V/m/s); per node, E before this step's update.
  /// Mapped pages, zero and not resident until a row's nodes step (over MPI ranks: a rank's own)
  MappedVector<double> p, j;
  MappedVector<double> e_old;
  double half_dt = 0;

  bool empty() const { return index.empty(); }
  long count() const { return static_cast<long>(index.size()); }

  /// The energy the poles of row r's nodes hold, per unit volume over eps0 (V^2/m^2; times
  /// eps0 dx dy: J/m): each pole's oscillator energy (pole_energy, ade.h).
  double oscillator_energy(int r) const {
    double w = 0;
    for (int k = pole_first[row_first[r]]; k < pole_first[row_first[r + 1]]; ++k)
      w += pole_energy(poles[k], half_dt, p[k], j[k]);
    return w;
  }

  /// Keep the E of row r's nodes before their update.
  template <class R>
  void before_row(int r, R* const* E) {
    for (int q = row_first[r]; q < row_first[r + 1]; ++q) e_old[q] = static_cast<double>(E[comp[q]][index[q]]);
  }

  /// The polarization currents of row r's nodes, and the poles' step.
  template <class R>
  void after_row(int r, R* const* E) {
    for (int q = row_first[r]; q < row_first[r + 1]; ++q) {
      R& e = E[comp[q]][index[q]];
      double s = 0;
      for (int k = pole_first[q]; k < pole_first[q + 1]; ++k) s += (1 + poles[k].c1) * j[k] + poles[k].c2 * p[k];
      e = static_cast<R>(static_cast<double>(e) - corr[q] * s);
      const double sum_e = static_cast<double>(e) + e_old[q];
      for (int k = pole_first[q]; k < pole_first[q + 1]; ++k) {
        const double jn = poles[k].c1 * j[k] + poles[k].c2 * p[k] + poles[k].c3 * sum_e;
        p[k] += half_dt * (jn + j[k]);
        j[k] = jn;
      }
    }
  }
};

}  // namespace ty

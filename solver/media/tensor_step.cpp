/// \file tensor_step.cpp
/// \brief The constitutive step of the in-plane tensor list (tensor_cells.h): per node the
/// displacement increment left by the vacuum sweep, its instances' trapezoidal ADE steps
/// along the principal axes, and the node fields gathered as the transpose of the reads.
#include "solver/media/tensor_cells.h"

namespace ty {

/// Instance s of a node of component c with frame (cs, sn) and input (in_own, in_other) along
/// the node's (own, other) component: the scalar ADE step per principal axis (ade.h), its
/// field back as (own, other).
void TensorCells::step_instance(long s, int c, double cs, double sn, double in_own, double in_other, double& e_own,
                                double& e_other) {
  const double dx = c == 0 ? in_own : in_other, dy = c == 0 ? in_other : in_own;
  const double din[2] = {cs * dx + sn * dy, -sn * dx + cs * dy};
  double ea[2];
  for (int a = 0; a < 2; ++a) {
    const long sa = 2 * s + a;
    const AdeNode& k = axis[sa];
    double sum = 0;
    for (int i = pole_first[sa]; i < pole_first[sa + 1]; ++i) sum += (1 + poles[i].c1) * j[i] + poles[i].c2 * p[i];
    const double e = k.ca * e_axis[sa] + k.cb * din[a] - k.corr * sum;
    const double both = e + e_axis[sa];
    for (int i = pole_first[sa]; i < pole_first[sa + 1]; ++i) {
      const double jn = poles[i].c1 * j[i] + poles[i].c2 * p[i] + poles[i].c3 * both;
      p[i] += half_dt * (jn + j[i]);
      j[i] = jn;
    }
    e_axis[sa] = ea[a] = e;
  }
  const double ex = cs * ea[0] - sn * ea[1], ey = sn * ea[0] + cs * ea[1];
  e_own = c == 0 ? ex : ey;
  e_other = c == 0 ? ey : ex;
}

/// Node q's instances: what goes to q itself (out_own), to each neighbour (out_other) and,
/// from deviation instance i, to neighbour slot i alone (out_dev).
void TensorCells::step_node(long q) {
  double mean = 0;
  for (int m = 0; m < 4; ++m)
    if (nb[q][m] >= 0) mean += 0.25 * g[nb[q][m]];
  double own = 0, other = 0;
  out_dev[q] = {0, 0, 0, 0};
  for (int s = inst_first[q]; s < inst_first[q + 1]; ++s) {
    const double w = weight[s];
    double eo = 0, et = 0;
    if (kind[s] == full) {
      step_instance(s, comp[q], cs[q], sn[q], g[q], mean, eo, et);
      own += w * eo, other += 0.25 * w * et;
    } else if (kind[s] == TensorCells::own) {
      step_instance(s, comp[q], cs[q], sn[q], g[q], 0.0, eo, et);
      own += w * eo;
    } else {
      const int i = kind[s] - deviation;
      step_instance(s, comp[q], cs[q], sn[q], 0.0, g[nb[q][i]] - mean, eo, et);
      out_dev[q][i] = w * et;
      other -= 0.25 * w * et;
    }
  }
  out_own[q] = own;
  out_other[q] = other;
}

template <class R>
void TensorCells::step(R* const* E, int threads) {
  const long n = count();
#pragma omp parallel for schedule(static) num_threads(threads) if (n > kSerialNodes)
  for (long q = 0; q < n; ++q) g[q] = static_cast<double>(E[comp[q]][index[q]]) - e_node[q];
#pragma omp parallel for schedule(static) num_threads(threads) if (n > kSerialNodes)
  for (long q = 0; q < n; ++q) step_node(q);
#pragma omp parallel for schedule(static) num_threads(threads) if (n > kSerialNodes)
  for (long q = 0; q < n; ++q) {  // E = sum_inst w S^T e
    double e = out_own[q];
    for (int m = 0; m < 4; ++m)
      if (const int k = nb[q][m]; k >= 0) e += out_other[k] + out_dev[k][back[q][m]];
    E[comp[q]][index[q]] = static_cast<R>(e);
    e_node[q] = e;
  }
}

template void TensorCells::step<float>(float* const*, int);
template void TensorCells::step<double>(double* const*, int);

}  // namespace ty

/// \file llg_linear.cpp
/// \brief Building the exact small-signal step (equations in llg_linear.h).
#include "materials/magnetic/llg_linear.h"

#include <Eigen/Dense>
#include <unsupported/Eigen/MatrixFunctions>

#include "materials/magnetic/linear_response.h"

namespace ty {

LinearStep LinearStep::from(const MagnetModel& model, const MagneticState& ground, double dt,
                            const std::array<double, 3>& r, const std::array<double, 3>& self) {
  LinearStep p;
  const int n = model.n, nt = 2 * n;
  p.n = n;
  // tangent basis: e1 from the scene axis least along g (a fixed rule), e2 = g x e1
  Eigen::MatrixXd E = Eigen::MatrixXd::Zero(3 * n, nt);
  for (int s = 0; s < n; ++s) {
    const Vec3 g = ground.m[s].normalized();
    int least = 0;
    for (int c = 1; c < 3; ++c)
      if (std::abs(g[c]) < std::abs(g[least])) least = c;
    const Vec3 a = Vec3::Unit(least);
    const Vec3 e1 = (a - a.dot(g) * g).normalized(), e2 = g.cross(e1);
    for (int c = 0; c < 3; ++c) p.g[s][c] = g[c], p.e1[s][c] = e1[c], p.e2[s][c] = e2[c];
    E.block<3, 1>(3 * s, 2 * s) = e1;
    E.block<3, 1>(3 * s, 2 * s + 1) = e2;
    p.mu[s] = model.mu[s];
  }
  const Linearised lin = linearise(model, ground);
  const Eigen::MatrixXd P = E.transpose();
  const Eigen::MatrixXd I = Eigen::MatrixXd::Identity(3 * n, 3 * n);
  const Eigen::MatrixXd Q = (P * (I - lin.D) * E).inverse();
  const Eigen::MatrixXd Lt = Q * P * lin.L * E, Ct = Q * P * lin.Bm;
  Eigen::MatrixXd K = Eigen::MatrixXd::Zero(3, nt);
  for (int s = 0; s < n; ++s) K.block(0, 2 * s, 3, 2) = model.mu[s] * E.block(3 * s, 2 * s, 3, 2);
  const Eigen::Matrix3d R = Eigen::Vector3d(r[0], r[1], r[2]).asDiagonal();
  const Eigen::Matrix3d N = Eigen::Vector3d(self[0], self[1], self[2]).asDiagonal();
  const Eigen::MatrixXd A = Lt - Ct * (R + N) * K;
  // exp([[hA, I, 0], [0, 0, I], [0, 0, 0]]) = [[e^{hA}, phi1(hA), phi2(hA)], ...]
  Eigen::MatrixXd big = Eigen::MatrixXd::Zero(3 * nt, 3 * nt);
  big.block(0, 0, nt, nt) = dt * A;
  big.block(0, nt, nt, nt) = Eigen::MatrixXd::Identity(nt, nt);
  big.block(nt, 2 * nt, nt, nt) = Eigen::MatrixXd::Identity(nt, nt);
  const Eigen::MatrixXd ex = big.exp();
  const Eigen::MatrixXd eA = ex.block(0, 0, nt, nt), phi1 = ex.block(0, nt, nt, nt), phi2 = ex.block(0, 2 * nt, nt, nt);
  const Eigen::MatrixXd Phi = eA + dt * phi1 * Ct * R * K;
  const Eigen::MatrixXd Psi0 = dt * (phi1 - phi2) * Ct, Psi1 = dt * phi2 * Ct;
  for (int i = 0; i < nt; ++i) {
    for (int j = 0; j < nt; ++j) p.phi[i][j] = Phi(i, j);
    for (int c = 0; c < 3; ++c) p.psi0[i][c] = Psi0(i, c), p.psi1[i][c] = Psi1(i, c);
    for (int j = 0; j < nt; ++j) p.a[i][j] = A(i, j), p.hphi1[i][j] = dt * phi1(i, j);
    for (int c = 0; c < 3; ++c) p.ct[i][c] = Ct(i, c);
  }
  return p;
}

}  // namespace ty

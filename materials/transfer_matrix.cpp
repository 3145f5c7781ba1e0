/// \file transfer_matrix.cpp
/// \brief Berreman's 4x4 transfer matrix (equations in transfer_matrix.h).
#include "materials/transfer_matrix.h"

#include <Eigen/Eigenvalues>
#include <cmath>

#include "io/units.h"

namespace ty {
namespace {

using cd = std::complex<double>;
using Mat4c = Eigen::Matrix4cd;
using Vec4c = Eigen::Vector4cd;

/// Tensors in the frame where the normal is y (scene x -> frame y for normal 0): a
/// rotation by +90 deg about z takes x to y and y to -x.
Mat3c to_frame(const Mat3c& m, int normal) {
  if (normal == 1) return m;
  Eigen::Matrix3d R;
  R << 0, -1, 0, 1, 0, 0, 0, 0, 1;
  return R.cast<cd>() * m * R.transpose().cast<cd>();
}

/// Delta of psi = (Ex, Ez, hx, hz) in the frame with normal y, tangential wavenumber
/// kx (in units of k0): psi' = i k0 Delta psi.
Mat4c berreman_delta(const Mat3c& e, const Mat3c& u, double kx) {
  Mat4c D;
  for (int col = 0; col < 4; ++col) {
    Vec4c p = Vec4c::Zero();
    p[col] = 1;
    const cd Ex = p[0], Ez = p[1], hx = p[2], hz = p[3];
    // normal components from the y rows of curl h = -i k0 eps E and curl E = i k0 mu h
    const cd Ey = (kx * hz - e(1, 0) * Ex - e(1, 2) * Ez) / e(1, 1);
    const cd hy = (-kx * Ez - u(1, 0) * hx - u(1, 2) * hz) / u(1, 1);
    const Eigen::Vector3cd E(Ex, Ey, Ez), h(hx, hy, hz);
    const Eigen::Vector3cd eE = e * E, uh = u * h;
    // E'x = i kx Ey - i (mu h)_z ; E'z = i (mu h)_x ; h'x = i kx hy + i (eps E)_z ; h'z = -i (eps E)_x
    D(0, col) = kx * Ey - uh[2];
    D(1, col) = uh[0];
    D(2, col) = kx * hy + eE[2];
    D(3, col) = -eE[0];
  }
  return D;
}

double flux_y(const Vec4c& p) {  // eta0 * time-averaged S_y = 1/2 Re(Ez hx* - Ex hz*)
  return 0.5 * (p[1] * std::conj(p[2]) - p[0] * std::conj(p[3])).real();
}

}  // namespace

StackResponse stack_response(const LayerStack& s, double omega, double theta) {
  const double k0 = omega / constants::c0;
  const double n1 = s.n_in;
  const double kx = -n1 * std::sin(theta);  // t = z x n is -x in this frame
  const double ky = n1 * std::cos(theta);
  // incidence-medium plane waves (units of k0), E amplitude 1
  Vec4c inc[2], back[2];
  inc[0] << 0, 1, ky, 0;
  back[0] << 0, 1, -ky, 0;
  inc[1] << -ky / n1, 0, 0, n1;
  back[1] << ky / n1, 0, 0, n1;
  // total transfer matrix over the layers
  Mat4c M = Mat4c::Identity();
  for (const Layer& L : s.layers) {
    const Mat4c D = berreman_delta(to_frame(L.eps, s.normal), to_frame(L.mu, s.normal), kx);
    Eigen::ComplexEigenSolver<Mat4c> es(D);
    const Vec4c ph = (cd(0, 1) * k0 * L.thickness * es.eigenvalues().array()).exp();
    M = es.eigenvectors() * ph.asDiagonal() * es.eigenvectors().inverse() * M;
  }
  // forward modes of the exit half-space
  const Mat4c Dout = berreman_delta(to_frame(s.eps_out, s.normal), to_frame(s.mu_out, s.normal), kx);
  Eigen::ComplexEigenSolver<Mat4c> eo(Dout);
  std::vector<int> fwd;
  for (int k = 0; k < 4; ++k) {
    const cd q = eo.eigenvalues()[k];
    const double scale = std::abs(q) + 1e-300;
    if (q.imag() > 1e-9 * scale || (std::abs(q.imag()) <= 1e-9 * scale && flux_y(eo.eigenvectors().col(k)) > 0))
      fwd.push_back(k);
  }
  if (fwd.size() != 2) throw std::runtime_error("transfer matrix: could not sort the exit medium's modes");
  StackResponse out{};
  for (int p = 0; p < 2; ++p) {
    // M (inc + r0 back0 + r1 back1) = t0 f0 + t1 f1
    Mat4c A;
    A.col(0) = M * back[0];
    A.col(1) = M * back[1];
    A.col(2) = -eo.eigenvectors().col(fwd[0]);
    A.col(3) = -eo.eigenvectors().col(fwd[1]);
    const Vec4c x = A.partialPivLu().solve(-M * inc[p]);
    const double s_inc = flux_y(inc[p]);
    for (int q = 0; q < 2; ++q) {
      out.r[p][q] = x[q];
      out.R[p][q] = -flux_y(x[q] * back[q]) / s_inc;
    }
    const Vec4c trans = x[2] * eo.eigenvectors().col(fwd[0]) + x[3] * eo.eigenvectors().col(fwd[1]);
    out.T[p] = flux_y(trans) / s_inc;
  }
  return out;
}

}  // namespace ty

/// \file transfer_matrix.cpp
/// \brief Berreman's 4x4 transfer matrix (equations in transfer_matrix.h).
#include "materials/layered/transfer_matrix.h"

#include <Eigen/Eigenvalues>
#include <cmath>

#include "io/scene/units.h"

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
Mat4c berreman_delta(const Mat3c& e, const Mat3c& u, cd kx) {
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

/// The four plane waves of a medium (eigenvectors of Delta, columns of v, with their normal
/// wavenumbers q): the two forward ones first (decaying along +y, or carrying power along +y).
struct Modes {
  Mat4c v;
  Vec4c q;
};

Modes sorted_modes(const Mat3c& e, const Mat3c& u, cd kx) {
  Eigen::ComplexEigenSolver<Mat4c> es(berreman_delta(e, u, kx));
  std::vector<int> fwd, bwd;
  for (int k = 0; k < 4; ++k) {
    const cd q = es.eigenvalues()[k];
    const double scale = std::abs(q) + 1e-300;
    const bool forward = std::abs(q.imag()) > 1e-9 * scale ? q.imag() > 0 : flux_y(es.eigenvectors().col(k)) > 0;
    (forward ? fwd : bwd).push_back(k);
  }
  if (fwd.size() != 2) throw std::runtime_error("transfer matrix: could not sort a medium's modes");
  Modes m;
  const int order[4] = {fwd[0], fwd[1], bwd[0], bwd[1]};
  for (int k = 0; k < 4; ++k) m.v.col(k) = es.eigenvectors().col(order[k]), m.q[k] = es.eigenvalues()[order[k]];
  return m;
}

}  // namespace

StackResponse stack_response(const LayerStack& s, double omega, double theta) {
  return stack_response_kt(s, omega, s.n_in * std::sin(theta));
}

StackResponse stack_response_kt(const LayerStack& s, double omega, cd kt) {
  const double k0 = omega / constants::c0;
  const double n1 = s.n_in;
  const cd kx = -kt;                          // t = z x n is -x in this frame
  cd ky = std::sqrt(n1 * n1 - kt * kt);       // the branch with Im ky >= 0: evanescent beyond n1
  if (ky.imag() < 0) ky = -ky;
  // incidence-medium plane waves (units of k0), E amplitude 1
  Vec4c inc[2], back[2];
  inc[0] << 0, 1, ky, 0;
  back[0] << 0, 1, -ky, 0;
  inc[1] << -ky / n1, 0, 0, n1;
  back[1] << ky / n1, 0, 0, n1;
  // modes of each layer and of the exit half-space, forward ones first
  const Mat3c eps_out = to_frame(s.eps_out, s.normal), mu_out = to_frame(s.mu_out, s.normal);
  const int nl = static_cast<int>(s.layers.size());
  std::vector<Modes> m;
  for (const Layer& L : s.layers) m.push_back(sorted_modes(to_frame(L.eps, s.normal), to_frame(L.mu, s.normal), kx));
  const Modes out_modes = sorted_modes(eps_out, mu_out, kx);
  // psi continuous at each of the nl + 1 interfaces. Unknowns: r (2), the four mode
  // amplitudes of each layer, t (2). A layer's forward modes are normalised at its entrance
  // face and its backward ones at its exit face, so that no factor exp(i k0 q d) exceeds
  // one: thick and evanescent layers stay well conditioned (the scattering-matrix idea of
  // e.g. Ko & Inkson, Phys. Rev. B 38, 9945 (1988), in one linear system).
  const int n = 4 + 4 * nl;
  Eigen::MatrixXcd A = Eigen::MatrixXcd::Zero(n, n);
  auto layer_face = [&](int L, bool exit, int row, double sign) {  // adds sign * psi of layer L at a face
    const Layer& lay = s.layers[L];
    for (int k = 0; k < 4; ++k) {
      const bool forward = k < 2;
      const cd q = m[L].q[k];
      const cd phase = forward == exit ? std::exp(cd(0, 1) * k0 * lay.thickness * (forward ? q : -q)) : cd(1, 0);
      A.block(row, 2 + 4 * L + k, 4, 1) += sign * phase * m[L].v.col(k);
    }
  };
  // interface 0: inc + r0 back0 + r1 back1 = (first layer's entrance | exit modes)
  A.block(0, 0, 4, 1) = back[0];
  A.block(0, 1, 4, 1) = back[1];
  for (int L = 0; L <= nl; ++L) {
    const int row = 4 * L;
    if (L > 0) layer_face(L - 1, true, row, 1.0);  // the layer before, at its exit face
    if (L < nl) {
      layer_face(L, false, row, -1.0);  // the layer after, at its entrance face
    } else {
      A.block(row, n - 2, 4, 1) = -out_modes.v.col(0);
      A.block(row, n - 1, 4, 1) = -out_modes.v.col(1);
    }
  }
  const auto lu = A.partialPivLu();
  StackResponse out{};
  for (int p = 0; p < 2; ++p) {
    Eigen::VectorXcd rhs = Eigen::VectorXcd::Zero(n);
    rhs.head(4) = -inc[p];
    const Eigen::VectorXcd x = lu.solve(rhs);
    const double s_inc = flux_y(inc[p]);
    const double none = std::nan("");
    for (int q = 0; q < 2; ++q) {
      out.r[p][q] = x[q];
      out.R[p][q] = s_inc > 0 ? -flux_y(x[q] * back[q]) / s_inc : none;
    }
    const Vec4c trans = x[n - 2] * out_modes.v.col(0) + x[n - 1] * out_modes.v.col(1);
    out.T[p] = s_inc > 0 ? flux_y(trans) / s_inc : none;
    out.t[p][0] = trans[1];
    out.t[p][1] = trans[3];
  }
  return out;
}

}  // namespace ty

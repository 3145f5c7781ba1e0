/// \file ground_state.cpp
/// \brief Multi-start Levenberg-Marquardt minimisation of the sublattice energy.
#include "materials/magnetic/ground_state.h"

#include <algorithm>
#include <cmath>
#include <optional>

namespace ty {
namespace {

void tangent_basis(const Vec3& m, Vec3& e1, Vec3& e2) {
  const Vec3 a = std::abs(m.x()) < 0.9 ? Vec3::UnitX() : Vec3::UnitY();
  e1 = m.cross(a).normalized();
  e2 = m.cross(e1);
}

double field_scale(const MagnetModel& M) {
  double s = M.bias.norm() + M.b_d.norm();
  for (double b : M.b_a) s += std::abs(b);
  if (M.n == 2) s += std::abs(M.lambda) * std::max(M.mu[0], M.mu[1]);
  return std::max(s, 1e-6);
}

struct Minimiser {
  const MagnetModel& M;
  int dof;
  std::array<Vec3, 2> e1, e2;

  std::array<Vec3, 2> retract(const std::array<Vec3, 2>& m, const Eigen::VectorXd& u) const {
    std::array<Vec3, 2> out = m;
    for (int s = 0; s < M.n; ++s) out[s] = (m[s] + u[2 * s] * e1[s] + u[2 * s + 1] * e2[s]).normalized();
    return out;
  }
  Eigen::VectorXd gradient(const std::array<Vec3, 2>& m) const {
    Eigen::VectorXd g(dof);
    for (int s = 0; s < M.n; ++s) {
      const Vec3 b = M.field(s, m);
      g[2 * s] = -M.mu[s] * b.dot(e1[s]);
      g[2 * s + 1] = -M.mu[s] * b.dot(e2[s]);
    }
    return g;
  }
  /// dE/du at the point retract(m, u), in the tangent basis of m (chain rule through
  /// the normalisation of the retraction).
  Eigen::VectorXd gradient_at(const std::array<Vec3, 2>& m, const Eigen::VectorXd& u) const {
    std::array<Vec3, 2> p = m;
    std::array<double, 2> len{1, 1};
    for (int s = 0; s < M.n; ++s) {
      const Vec3 raw = m[s] + u[2 * s] * e1[s] + u[2 * s + 1] * e2[s];
      len[s] = raw.norm();
      p[s] = raw / len[s];
    }
    Eigen::VectorXd g(dof);
    for (int s = 0; s < M.n; ++s) {
      const Vec3 b = M.field(s, p);
      const Vec3 bt = (b - b.dot(p[s]) * p[s]) / len[s];  // projected on the tangent plane
      g[2 * s] = -M.mu[s] * bt.dot(e1[s]);
      g[2 * s + 1] = -M.mu[s] * bt.dot(e2[s]);
    }
    return g;
  }
  /// Hessian by central differences of the analytic gradient (error ~1e-10 relative).
  Eigen::MatrixXd hessian(const std::array<Vec3, 2>& m) const {
    const double h = 1e-5;
    Eigen::MatrixXd H(dof, dof);
    for (int j = 0; j < dof; ++j) {
      Eigen::VectorXd u = Eigen::VectorXd::Zero(dof);
      u[j] = h;
      const Eigen::VectorXd gp = gradient_at(m, u);
      u[j] = -h;
      H.col(j) = (gp - gradient_at(m, u)) / (2 * h);
    }
    return 0.5 * (H + H.transpose());
  }

  /// Minimises from m; returns false if it did not converge.
  bool run(std::array<Vec3, 2>& m, double scale, Eigen::VectorXd& curvature) {
    double mu_lm = 1e-3 * scale;
    for (int it = 0; it < 2000; ++it) {
      const Eigen::VectorXd g = gradient_at(m);
      if (torque(g) < 1e-12 * scale) return converged(m, curvature);
      const Eigen::MatrixXd H = hessian(m);
      const double e0 = M.energy(m);
      for (int tries = 0; tries < 60; ++tries) {
        const Eigen::MatrixXd A = H + mu_lm * Eigen::MatrixXd::Identity(dof, dof);
        const Eigen::VectorXd step = A.ldlt().solve(-g);
        const auto cand = retract(m, step);
        if (M.energy(cand) <= e0 || step.norm() < 1e-15) {
          m = cand;
          mu_lm = std::max(mu_lm / 3, 1e-14 * scale);
          break;
        }
        mu_lm *= 4;
      }
    }
    // At the minimum the energy is flat to its rounding (its last digit), and which steps
    // lower it is then chance: with FMA / AVX-512 code the torque of MnF2's flop state stalled
    // at 1.2-4.5 times the tolerance for all the passes. Such a point is taken as converged
    // if its torque is below 1e-10 of the field scale (a converging run never gets here, so
    // its state is the same bits as before).
    return torque(gradient_at(m)) < 1e-10 * scale && converged(m, curvature);
  }
  /// The energy's gradient in the tangent planes at m (the planes set there).
  Eigen::VectorXd gradient_at(const std::array<Vec3, 2>& m) {
    for (int s = 0; s < M.n; ++s) tangent_basis(m[s], e1[s], e2[s]);
    return gradient(m);
  }
  /// The largest torque component per unit mu0 Ms (T).
  double torque(const Eigen::VectorXd& g) const { return g.cwiseAbs().maxCoeff() / std::max(M.mu[0], M.mu[1]); }
  /// A minimum found: the curvatures there (the tangent planes are m's).
  bool converged(const std::array<Vec3, 2>& m, Eigen::VectorXd& curvature) {
    curvature = Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd>(hessian(m)).eigenvalues();
    return true;
  }
};

std::string classify(const MagnetModel& M, const std::array<Vec3, 2>& m) {
  if (M.n == 1) return "aligned";
  const double c = m[0].dot(m[1]);
  if (c < -1 + 1e-9) return "collinear";
  if (c > 1 - 1e-9) return "aligned";
  if (M.bias.norm() > 0) {  // spin flop: L turned perpendicular to a bias along an easy axis
    const Vec3 b = M.bias.normalized();
    const Vec3 l = (m[0] - m[1]).normalized();
    const Vec3 net = M.net(m);
    bool bias_on_easy_axis = false;
    for (size_t k = 0; k < M.axis.size(); ++k)
      bias_on_easy_axis |= M.b_a[k] > 0 && std::abs(std::abs(M.axis[k].dot(b)) - 1) < 1e-9;
    if (bias_on_easy_axis && std::abs(l.dot(b)) < 1e-6 && net.cross(b).norm() < 1e-6 * net.norm()) return "spin-flop";
  }
  return "canted";
}

/// A minimum found from m, with the curvatures of its Hessian; nullopt for a saddle.
std::optional<MagneticState> minimum(const MagnetModel& M, const std::array<Vec3, 2>& m, const Eigen::VectorXd& curv) {
  const double cmax = std::max(curv.cwiseAbs().maxCoeff(), 1e-30);
  if (curv.minCoeff() < -1e-7 * cmax) return std::nullopt;  // a saddle, not a minimum
  MagneticState st;
  st.m = m;
  if (M.n == 1) st.m[1] = Vec3::Zero();
  st.energy = M.energy(m);
  st.soft = curv.minCoeff() < 1e-7 * cmax;
  st.kind = classify(M, m);
  return st;
}

}  // namespace

double torque(const MagnetModel& model, const MagneticState& st) {
  double t = 0;
  for (int s = 0; s < model.n; ++s) t = std::max(t, st.m[s].cross(model.field(s, st.m)).norm());
  return t;
}

GroundStates find_ground_states(const MagnetModel& M) {
  const double scale = field_scale(M);
  // deterministic start directions
  std::vector<Vec3> dirs;
  auto add = [&](const Vec3& v) {
    if (v.norm() < 1e-12) return;
    const Vec3 u = v.normalized();
    for (const auto& d : dirs)
      if ((d - u).norm() < 1e-9) return;
    dirs.push_back(u);
  };
  if (M.order.norm() > 0) add(M.order);
  for (const auto& a : M.axis) add(a), add(-a);
  if (M.bias.norm() > 0) add(M.bias), add(-M.bias);
  const Vec3 scene_axes[3] = {Vec3::UnitX(), Vec3::UnitY(), Vec3::UnitZ()};
  for (const Vec3& v : scene_axes) add(v), add(-v);
  add(Vec3(1, 1, 1));
  const Vec3 tilt = Vec3(0.31, -0.57, 0.76).normalized();
  auto tilted = [&](const Vec3& d) { return (d + 1e-3 * (tilt - tilt.dot(d) * d)).normalized(); };

  std::vector<std::array<Vec3, 2>> starts;
  for (const auto& d : dirs) {
    if (M.n == 1) {
      starts.push_back({tilted(d), Vec3::Zero()});
      continue;
    }
    starts.push_back({tilted(d), tilted(-d)});  // collinear
  }
  if (M.n == 2) {
    const Vec3 b = M.bias.norm() > 0 ? M.bias.normalized() : Vec3::UnitZ();
    for (const auto& d : dirs) {  // spin-flop-like: L perpendicular to the bias, tilted towards it
      const Vec3 p = d - d.dot(b) * b;
      if (p.norm() < 1e-6) continue;
      const Vec3 q = p.normalized();
      starts.push_back({(q + 0.2 * b).normalized(), (-q + 0.2 * b).normalized()});
    }
    for (const auto& d : dirs) starts.push_back({tilted(d), tilted(d)});  // parallel
  }

  std::vector<MagneticState> found;
  Minimiser mz{M, 2 * M.n, {}, {}};
  for (auto m : starts) {
    Eigen::VectorXd curv;
    if (!mz.run(m, scale, curv)) continue;
    const auto found_here = minimum(M, m, curv);
    if (!found_here) continue;
    const MagneticState& st = *found_here;
    bool dup = false;
    for (const auto& f : found) {
      bool same = (f.m[0] - st.m[0]).norm() < 1e-5 && (M.n == 1 || (f.m[1] - st.m[1]).norm() < 1e-5);
      if (same) dup = true;
    }
    if (!dup) found.push_back(st);
  }
  GroundStates out;
  if (found.empty()) throw std::runtime_error("no stationary magnetic state found (the minimiser did not converge)");
  const double etol = 1e-10 * scale * std::max(M.mu[0], M.mu[1]);
  std::stable_sort(found.begin(), found.end(), [&](const MagneticState& a, const MagneticState& b) {
    if (std::abs(a.energy - b.energy) > etol) return a.energy < b.energy;
    return a.m[0].dot(M.order) > b.m[0].dot(M.order) + 1e-12;
  });
  out.ground = found[0];
  for (size_t k = 1; k < found.size(); ++k)
    (std::abs(found[k].energy - found[0].energy) > etol ? out.metastable : out.degenerate).push_back(found[k]);
  return out;
}

std::vector<MagneticState> listed_states(const GroundStates& g) {
  std::vector<MagneticState> all{g.ground};
  all.insert(all.end(), g.degenerate.begin(), g.degenerate.end());
  all.insert(all.end(), g.metastable.begin(), g.metastable.end());
  return all;
}

MagneticState relax(const MagnetModel& M, const std::array<Vec3, 2>& start) {
  const double scale = field_scale(M);
  const Vec3 tilts[3] = {Vec3(0.31, -0.57, 0.76).normalized(), Vec3(-0.62, 0.2, 0.5).normalized(),
                         Vec3(0.1, 0.8, -0.3).normalized()};
  Minimiser mz{M, 2 * M.n, {}, {}};
  for (const Vec3& tilt : tilts) {
    std::array<Vec3, 2> m = start;
    for (int s = 0; s < M.n; ++s) m[s] = (m[s] + 1e-3 * (tilt - tilt.dot(m[s]) * m[s])).normalized();
    Eigen::VectorXd curv;
    if (!mz.run(m, scale, curv)) continue;
    if (auto st = minimum(M, m, curv)) return *st;  // else stopped on a saddle: tilt another way
  }
  throw std::runtime_error("the magnetic state could not be followed (the minimiser did not converge)");
}

}  // namespace ty

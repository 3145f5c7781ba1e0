/// \file magnet.h
/// \brief A magnetic medium of one or two sublattices: its parameters in the units the
/// equations use, the effective field on each sublattice and the energy density.
///
/// Fields are in tesla (mu0*H), moments mu_s = mu0*Ms,s in tesla, gamma_s = g_s muB/hbar.
/// For unit vectors m_s (conventions of scene-format.md):
///   mu0 e = - sum_s mu_s m_s.B0 - sum_s sum_k 1/2 mu_s B_A,k (m_s.n_k)^2
///           + lambda mu_1 mu_2 m_1.m_2 + mu_D B_D.(m_1 x m_2),      mu_D = sqrt(mu_1 mu_2)
///   B_eff,s = -(1/mu_s) d(mu0 e)/dm_s
///           = B0 + b + sum_k B_A,k (m_s.n_k) n_k - lambda mu_t m_t + B_DM,s,
///   B_DM,1 = (mu_D/mu_1) B_D x m_2,   B_DM,2 = (mu_D/mu_2) m_1 x B_D,
/// and the Landau-Lifshitz-Gilbert equation dm_s/dt = -gamma_s m_s x B_eff,s + alpha_s m_s x dm_s/dt.
/// A magnet with thermal data takes its values at its temperature (materials/crystals/
/// temperature.h): mu_s and B_D scaled by m(T)/m(ref), B_A,k by its power law, lambda kept;
/// with a linewidth table the damping alpha_s is the one that gives the table's width there.
#pragma once
#include <Eigen/Dense>
#include <array>
#include <vector>

#include "io/scene/constants.h"
#include "io/scene/scene.h"

namespace ty {

using Vec3 = Eigen::Vector3d;


struct MagnetModel {
  int n = 1;                        ///< sublattices
  std::array<double, 2> mu{0, 0};   ///< mu0*Ms, T
  std::array<double, 2> gamma{0, 0};  ///< rad/(s T)
  std::array<double, 2> alpha{0, 0};
  double lambda = 0;
  std::vector<Vec3> axis;           ///< anisotropy axes (unit)
  std::vector<double> b_a;          ///< their fields, T
  Vec3 b_d = Vec3::Zero();          ///< Dzyaloshinskii vector, T
  double mu_d = 0;
  Vec3 bias = Vec3::Zero();         ///< B0, T
  Vec3 order = Vec3::Zero();        ///< preferred side of sublattice 1 (zero: none)

  MagnetModel() = default;
  MagnetModel(const Magnet& m, const std::array<double, 3>& bias);

  /// Effective field on sublattice s for the state m (m[1] unused for one sublattice),
  /// with b the wave field (T).
  Vec3 field(int s, const std::array<Vec3, 2>& m, const Vec3& b = Vec3::Zero()) const;
  /// mu0 times the energy density, T^2.
  double energy(const std::array<Vec3, 2>& m) const;
  /// Net magnetization mu0*M = sum_s mu_s m_s, T.
  Vec3 net(const std::array<Vec3, 2>& m) const;
};

/// g muB / hbar, rad/(s T): 2 pi * 27.9925 GHz/T for g = 2.
double gyromagnetic_ratio(double g);

}  // namespace ty

/// \file linear_response.h
/// \brief The Landau-Lifshitz-Gilbert equations linearised about a stationary state:
/// the susceptibility tensor chi(omega) (mu = 1 + chi), its resonances, and the bands
/// where a permeability function is negative.
///
/// With m_s = m0_s + dm_s, fields b exp(-i w t), B0_s = B_eff,s(m0) (parallel to m0_s):
///   -i w dm_s = gamma_s [B0_s]x dm_s - gamma_s [m0_s]x (b + A_s dm_s + X_st dm_t) - i w alpha_s [m0_s]x dm_s,
/// A_s = sum_k B_A,k n_k n_k^T, X_12 = -lambda mu_2 I + (mu_D/mu_1)[B_D]x, X_21 = -lambda mu_1 I - (mu_D/mu_2)[B_D]x
/// ([a]x b = a x b). chi b = sum_s mu_s dm_s. This is the standard small-signal analysis
/// of magnetic resonance (e.g. Gurevich & Melkov, Magnetization Oscillations and Waves,
/// ch. 1-2), done numerically so that any ground state (canted, spin-flop, tilted axes)
/// is covered.
#pragma once
#include <complex>
#include <functional>
#include <vector>

#include "materials/magnetic/ground_state.h"

namespace ty {

using Mat3c = Eigen::Matrix3cd;

/// The linearised equations in the time domain, 3N unknowns dm (N sublattices):
///   d(dm)/dt = L dm + D d(dm)/dt + Bm b,
/// L the undamped operator, D the Gilbert blocks alpha_s [m0_s]x, Bm the drive -gamma_s [m0_s]x.
struct Linearised {
  int n;
  Eigen::MatrixXd L, D, Bm;
};
Linearised linearise(const MagnetModel& model, const MagneticState& st);

/// chi(omega), omega in rad/s (> 0), for the state st. Gilbert damping included.
Mat3c susceptibility(const MagnetModel& model, const MagneticState& st, double omega);

/// Undamped resonance frequencies (Hz), ascending; zero modes (below 1e-6 of the
/// largest, where round-off puts the rotation of a degenerate state) are left out.
std::vector<double> resonances(const MagnetModel& model, const MagneticState& st);

/// A damped normal mode: dm ~ exp((-decay + i 2 pi frequency) t).
struct DampedMode {
  double frequency = 0;  ///< Hz
  double decay = 0;      ///< 1/s: the amplitude's rate, so a ring-down falls by e in 1/decay
};
/// The damped modes of the linearised equations, (I - D) d(dm)/dt = L dm, in ascending
/// frequency (zero modes left out as in resonances()). For one isotropic sublattice in a
/// field B this is Kittel's uniform precession with Gilbert damping: frequency
/// gamma B / (2 pi (1 + alpha^2)), decay alpha gamma B / (1 + alpha^2) (Gilbert, IEEE
/// Trans. Magn. 40, 3443 (2004): the small-angle solution of his equation).
std::vector<DampedMode> damped_modes(const MagnetModel& model, const MagneticState& st);

struct Band {
  double from = 0, to = 0;  ///< Hz
};
/// Intervals of [f0, f1] where value(f) < 0, found on a grid of `samples` points and
/// refined by bisection (poles, where the sign also changes, are included as edges).
std::vector<Band> negative_bands(const std::function<double(double)>& value, double f0, double f1, int samples);
/// negative_bands, with a band that touches f0 or f1 followed past the scan in the same steps
/// ((f1 - f0) / samples) down to f_floor and up to f_ceiling, so that it is reported where it
/// ends, not where the scan did (a band still negative at a limit ends there).
std::vector<Band> whole_negative_bands(const std::function<double(double)>& value, double f0, double f1, int samples,
                                       double f_floor, double f_ceiling);

/// Effective permeability of the Ez wave for an interface normal along x (normal = 0) or
/// y (normal = 1): mu_V = (mu_xx mu_yy - mu_xy mu_yx) / mu_nn.
std::complex<double> voigt_permeability(const Mat3c& mu, int normal);

}  // namespace ty

/// \file incident.h
/// \brief The incident field of a beam or plane-wave source, evaluated at any node so
/// that the launch line can add it as a one-sided Huygens (total-field/scattered-field)
/// sheet.
///
/// A plane wave of unit direction u: Ez polarization Ez = E0, eta0 H = n (u_y, -u_x, 0) E0;
/// Hz polarization eta0 Hz = n E0, E = (-u_y, u_x, 0) E0 (so E x H points along u).
/// A Gaussian beam is the sum of such plane waves over its angular spectrum
/// A(q) ∝ exp(-q^2 w0^2 / 4), q the transverse wavenumber (the 2D form of the angular-
/// spectrum representation, e.g. Goodman, Introduction to Fourier Optics, ch. 3), which
/// gives exp(-s^2/w0^2) in field across the focus, amplitude E0 there.
/// The wavenumber is the grid's own (2D Yee dispersion, Taflove & Hagness eq. 4.15) along
/// the beam axis, which keeps the sheet's backward leak small.
/// Each node's field is returned as Re[A g(t - tau)]: tau = distance along u from where
/// the axis crosses the launch line, over the phase velocity; A the rest of the phase.
#pragma once
#include <complex>

#include "io/scene/scene.h"

namespace ty {

/// The grid's wavenumber at angular frequency w along direction theta, in a medium of
/// index n (2D Yee relation solved by bisection).
double yee_wavenumber(double omega, double theta, double n, double dx, double dy, double dt);

/// The grid's normal wavenumber k_n of a plane wave of tangential wavenumber kt (same
/// relation: sin^2(kt dt_/2)/dt_^2 + sin^2(kn dn/2)/dn^2 = (n sin(w dt/2)/(c dt))^2, dt_ and
/// dn the cell sides along the face and its normal); imaginary (Im > 0) for an evanescent
/// wave, NaN beyond the grid's band.
std::complex<double> yee_normal_wavenumber(double omega, double kt, double n, double d_t, double d_n, double dt);

class IncidentField {
 public:
  /// `crossing`: where the beam's axis meets the launch line (io's launch_point).
  IncidentField(const Source& s, Vec2 crossing, double n, double dx, double dy, double dt);
  /// Complex amplitude and delay of component c at internal position p.
  void at(Component c, Vec2 p, std::complex<double>& A, double& tau) const;

 private:
  Source s_;
  double n_, k_, v_;  // index, wavenumber, phase velocity
  Vec2 u_, v_dir_;    // direction of travel, transverse direction
  Vec2 crossing_;
  int nq_ = 0;
  double dq_ = 0, qmax_ = 0, norm_ = 1;
};

}  // namespace ty

/// \file transfer_matrix.h
/// \brief Plane-wave reflection and transmission of a stack of layers with full 3x3
/// complex permittivity and permeability tensors, by the 4x4 first-order method of
/// Berreman (J. Opt. Soc. Am. 62, 502 (1972)): the tangential fields
/// psi = (E_t, E_z, eta0 H_t, eta0 H_z) obey d psi/dn = i k0 Delta psi in each layer, the
/// normal components being eliminated algebraically, so canted states and tilted axes that
/// couple the Ez and Hz waves are handled. Fields exp(-i w t).
///
/// Frame: the interface normal n is the scene's x or y axis; the tangential direction is
/// t = z x n (scene-format.md), and a positive angle of incidence means a tangential
/// wavevector along t. The incidence medium is isotropic (index n_in); the exit medium is
/// a half-space of any tensors (its forward modes are the eigenmodes that decay or carry
/// power away). Polarization 0 is the Ez wave (E along z), 1 the Hz wave (H along z); the
/// incident and reflected amplitudes are of E_z for the Ez wave and of eta0 H_z / n_in
/// for the Hz wave (both "E amplitude" units).
#pragma once
#include <complex>
#include <vector>

#include "materials/magnetic/linear_response.h"

namespace ty {

struct Layer {
  Mat3c eps = Mat3c::Identity(), mu = Mat3c::Identity();
  double thickness = 0;  ///< m
};

struct LayerStack {
  double n_in = 1;             ///< incidence medium (isotropic, lossless)
  std::vector<Layer> layers;   ///< in the order the wave meets them
  Mat3c eps_out = Mat3c::Identity(), mu_out = Mat3c::Identity();  ///< exit half-space
  int normal = 1;              ///< 0: interfaces normal to x, 1: normal to y
};

struct StackResponse {
  std::complex<double> r[2][2];  ///< r[incident][reflected], polarizations 0 = Ez, 1 = Hz
  double R[2][2];                ///< reflected power fractions (NaN for an evanescent incident wave)
  double T[2];                   ///< transmitted power fraction per incident polarization (likewise)
  /// transmitted field at the exit face per incident polarization: [p][0] its Ez, [p][1]
  /// its eta0 Hz (for a vacuum exit, the amplitudes of the transmitted Ez and Hz waves)
  std::complex<double> t[2][2];
};

/// Response at angular frequency omega and angle of incidence theta (rad).
StackResponse stack_response(const LayerStack& s, double omega, double theta);
/// The same for a tangential wavenumber kt along t (units of k0), which may exceed n_in (an
/// evanescent incident wave, as in the angular spectrum of a source close to the stack) or
/// be complex (an integration path moved off the real axis, around the stack's guided-wave
/// poles); the incidence side's normal wavenumber takes the branch with Im >= 0.
StackResponse stack_response_kt(const LayerStack& s, double omega, std::complex<double> kt);

}  // namespace ty

/// \file permittivity.h
/// \brief eps(omega) of a medium: each principal axis's background, Lorentz oscillators and
/// Drude terms (io/scene/permittivity_model.h gives the formula and its sources), the
/// in-plane rotation of the axes into the scene frame, and the conductivity's
/// i sigma/(eps0 omega). The linear-response side (`medium`, `check`, the transfer matrix,
/// refraction, angular spectra) takes its permittivity from here only.
#pragma once
#include <complex>

#include "io/scene/scene.h"
#include "materials/magnetic/linear_response.h"

namespace ty {

/// eps(omega) along one principal axis; omega in rad/s, fields exp(-i w t) (Im eps >= 0 for a lossy medium).
std::complex<double> axis_permittivity(const PermittivityModel& m, double omega);

/// The relative permittivity tensor in the scene frame: R diag(eps_u, eps_v, eps_z) R^T with R
/// the rotation by `rotate` about z, so eps_xy = eps_yx = (eps_u - eps_v) sin(t) cos(t)
/// (Born & Wolf, Principles of Optics, 7th ed., sec. 15.1: a symmetric tensor in a rotated frame).
Mat3c tensor_permittivity(const PermittivityTensor& t, double omega);

/// The medium's full relative permittivity at omega (> 0), conductivity included as
/// i sigma/(eps0 omega); the plain diagonal `permittivity` where the medium has no tensor.
Mat3c medium_permittivity(const Medium& m, double omega);

/// The frequencies (Hz) where a model's real permittivity changes character, for messages
/// and band choices: each oscillator's TO frequency and the zero of its undamped
/// single-oscillator form (the LO frequency f_TO sqrt(1 + delta_eps/eps_inf)).
double lo_frequency(const PermittivityModel& m, const LorentzTerm& t);

}  // namespace ty

/// \file scene_stack.h
/// \brief The layered stack a scene's plane wave meets, as the 4x4 transfer matrix sees it
/// (materials/layered/transfer_matrix.h, Berreman, J. Opt. Soc. Am. 62, 502 (1972)): the
/// bodies that span the whole width across the wave, in the order the wave meets them, between
/// two half-spaces (the medium the source sits in, and whatever the far side holds; bodies run
/// on through the absorbers, so the end media continue), at the scene's transverse wavenumber
/// (the Bloch sides' k_x; 0 with periodic sides). Every layer takes its eps(omega) tensor
/// (materials/permittivity/permittivity.h: dispersion, rotated axes, conductivity) and
/// mu(omega) = 1 + chi(omega) of the state its body starts from under the scene's bias
/// (materials/magnetic/domain_state.h: a body's own order included). Used by `terayee medium
/// --stack` and the Otto study's test: one implementation.
#pragma once
#include <string>
#include <vector>

#include "io/analysis/spectroscopy/polarization.h"
#include "io/scene/scene.h"
#include "materials/layered/transfer_matrix.h"
#include "materials/magnetic/magnet.h"

namespace ty {

/// One medium of the stack: a layer, or an end half-space.
struct StackPart {
  int medium = -1;   ///< index into Scene::media; -1: vacuum
  int body = -1;     ///< the body that holds it (its state); -1: none
  double from = 0, to = 0;  ///< along the wave's axis, internal coordinates, m (ends: the extent's edge)
  bool magnetic = false;
  MagnetModel model;
  MagneticState state;
};

/// The stack of a scene, built by `scene_stack`.
struct SceneStack {
  int axis = 1;          ///< the wave's axis (0: x, 1: y)
  int direction = 1;     ///< +1 or -1 along it
  double launch = 0;     ///< the launch line's coordinate, internal, m
  double kx = 0;         ///< the transverse wavenumber along scene x, rad/m (Bloch sides)
  double n_in = 1;       ///< the incidence medium's index
  int polarization = 0;  ///< the sources' wave: 0 Ez, 1 Hz (the first plane source's)
  StackPart incidence;   ///< the half-space the source sits in
  std::vector<StackPart> layers;  ///< in the order the wave meets them
  StackPart exit;        ///< the far half-space
  std::vector<std::string> notes;  ///< what the prediction leaves out (absorbing sides across the wave, ...)
  std::vector<Medium> media;       ///< the scene's media (the parts' indices)
};

/// The stack of `scene`. Throws BadInput, every reason at once with the file:line:col of the
/// body or source it concerns, where the scene is not a stack: no plane-wave source, a source
/// that is not one, a body that does not span the width or is not an unrotated rectangle, a
/// perfect conductor, a medium change behind the source, an incidence medium that is not an
/// isotropic lossless dielectric, ends that are not absorbing.
SceneStack scene_stack(const Scene& scene);

/// The tangential wavenumber in units of k0 at frequency f, in the transfer matrix's frame
/// (t = z x n, n the direction of travel).
double stack_tangential_index(const SceneStack& s, double f);
/// The LayerStack at frequency f, its tensors turned into the frame where the wave travels
/// along +y (a rotation about z: the bias and axes turn with the stack).
LayerStack stack_layers(const SceneStack& s, double f);

/// The stack's response at frequency f: R, T and r of both input waves (StackResponse: NaN
/// where the incident wave is evanescent in the incidence medium), and the Jones matrices with
/// the Kerr (and, where the exit is vacuum, Faraday) rotation of each input.
struct StackPrediction {
  double f = 0, kt = 0;  ///< Hz; tangential index (units of k0)
  StackResponse response;
  bool propagating = true;  ///< the incident wave propagates in the incidence medium
  Jones r{}, t{};
  bool has_t = false;  ///< the exit is vacuum: t is the transmitted wave's Jones matrix
  PolarizationState faraday[2], kerr[2];
  double reflectance(int p) const { return response.R[p][0] + response.R[p][1]; }  ///< both reflected waves
};
StackPrediction predict_stack(const SceneStack& s, double f);

/// A part's medium name ("vacuum" for -1).
std::string part_name(const SceneStack& s, const StackPart& p);

}  // namespace ty

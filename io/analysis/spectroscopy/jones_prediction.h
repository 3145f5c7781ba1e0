/// \file jones_prediction.h
/// \brief The Jones matrices a slab (or a half-space) of one medium of a scene should show at
/// normal incidence, from the 4x4 transfer matrix (materials/layered/transfer_matrix.h), in the
/// basis and with the signs of polarization.h, and the Faraday and Kerr rotation and
/// ellipticity that follow.
///
/// From the transfer matrix's amplitudes (E_z of the Ez wave, eta0 H_z / n_in of the Hz wave):
///   transmitted: J_t[out][in] = t[in][out]   (a forward wave's E.u is eta0 H_z)
///   reflected:   J_r[0][in] = r[in][0],  J_r[1][in] = -r[in][1]
/// (the reflected wave's E along the incident u is -eta0 H_z: E = eta0 H x k). J_t is the
/// field at the exit face over the incident field at the entrance face; a probe behind the
/// slab sees J_t exp(-i k0 d) against the reference run (line_spectrum.h), which
/// `with_vacuum_path` applies.
#pragma once
#include <complex>
#include <optional>
#include <string>

#include "io/analysis/spectroscopy/polarization.h"
#include "io/scene/scene.h"
#include "materials/layered/transfer_matrix.h"
#include "materials/magnetic/magnet.h"

namespace ty {

Jones transmission_jones(const StackResponse& s);
Jones reflection_jones(const StackResponse& s);

/// One medium of a scene as the transfer matrix sees it: eps(omega) with its conductivity, and
/// mu(omega) = 1 + chi(omega) of the magnetic state a run starts from under the scene's bias.
struct SlabModel {
  Medium medium;
  bool magnetic = false;
  MagnetModel model;
  MagneticState state;
  double thickness = 0;  ///< m; 0: a half-space
  int normal = 0;        ///< 0: faces normal to x, 1: normal to y
};
SlabModel slab_model(const Scene& scene, int medium, double thickness, int normal);
LayerStack slab_stack(const SlabModel& m, double f);

/// J_t and J_r at frequency f (Hz) and angle of incidence `angle` (rad, from vacuum), and the
/// rotation and ellipticity of each input's output column: [in] 0 the Ez wave, 1 the Hz wave.
/// A half-space has no J_t (has_t false).
struct JonesPrediction {
  Jones t{}, r{};
  bool has_t = true;
  PolarizationState faraday[2], kerr[2];
};
JonesPrediction predict_jones(const SlabModel& m, double f, double angle = 0);

/// J times exp(-i k0 d): the transmitted Jones matrix as a probe sees it against the
/// reference run (the same path in vacuum).
Jones with_vacuum_path(const Jones& J, double f, double d);

/// The one sample body of a scene as a slab across the path of a plane wave along `axis`
/// (0: x, 1: y; direction +1 or -1): an unrotated rectangle that reaches across the grid. Its medium, front face (the
/// face the wave meets first) and thickness (0 where it reaches past the grid's far edge: a half-space). std::nullopt,
/// with `why`, where the scene has no such body.
struct SampleSlab {
  int medium = 0;
  double front = 0, thickness = 0;  ///< internal coordinates, m
};
std::optional<SampleSlab> sample_slab(const Scene& scene, int axis, int direction, std::string& why);

/// The scene's plane wave along x or y and its one sample slab, as the transfer matrix sees
/// them (used by `measure polarization` and `check`). std::nullopt, with `why`, where the
/// scene has no plane wave along an axis or no such slab.
struct SceneSample {
  SampleSlab slab;
  SlabModel model;
  int axis = 0, direction = 1;  ///< the wave's axis (0: x, 1: y) and sense
};
std::optional<SceneSample> scene_sample(const Scene& scene, std::string& why);

}  // namespace ty

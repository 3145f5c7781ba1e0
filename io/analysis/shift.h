/// \file shift.h
/// \brief The lateral (Goos-Hänchen) shift of a reflected beam, from the E field along a line
/// parallel to the interface on the incidence side, in a run and in its reference run: the
/// incident beam is the reference run's field, the reflected beam the difference of the two
/// (the scattered field). Each beam's intensity centroid and width (2 sigma of |E|^2, the
/// second-moment width) are measured along the line.
///
/// The zero point is the exact specular reflection of the same incident beam: the incident
/// field on the line, as a sum of the grid's plane waves (its Fourier transform along the
/// line), each carried to the face and back by a perfect mirror there, E_spec(k_t) =
/// E_inc(k_t) exp(2 i k_n h), k_n from the grid's own dispersion relation (solver/sources/
/// incident.h) and h the distance from the line to the face plane (solver/grid/face_plane.h).
/// A diverging beam's image does not lie at the incident centroid + 2 h tan(theta): its
/// centroid drifts by 2 h (<tan theta> - tan theta) (the mean over its angular spectrum).
///   shift      = reflected centroid - specular centroid on the line (what `medium
///                --line-distance` predicts): the Goos-Hänchen shift plus h times the angular
///                deviation a reflection that favours some angles gives the beam;
///   face shift = the same with both beams carried to the face plane (the reflected one back
///                along its own plane waves, the propagating ones): the spatial shift alone,
///                independent of h (Artmann's -dphi/dk_t for a wide beam; 0 for a real r).
/// Each uncertainty is half the change of its shift when the face moves by half a cell either
/// way (the Yee grid's tangential E and H lie half a cell apart), plus a tenth of a node
/// spacing for the centroids' sampling.
#pragma once
#include <vector>

#include "io/analysis/spectral_map_cut.h"

namespace ty {

struct BeamMoments {
  double centroid = 0, width = 0;  ///< m
};

/// The intensity centroid and 2-sigma width of samples I at positions s.
BeamMoments beam_moments(const std::vector<double>& s, const std::vector<double>& I);

/// What the zero point needs: the face, the wave's frequency and the grid it ran on.
struct ShiftGeometry {
  double face = 0;                  ///< the face plane along the normal (user coordinates), m
  double half_cell = 0;             ///< how well the face is known (half a cell), m
  double omega = 0;                 ///< angular frequency, rad/s
  double index = 1;                 ///< refractive index on the incidence side
  double d_t = 0, d_n = 0, dt = 0;  ///< the grid's cell sides along the line and the normal, its time step
};

struct LateralShift {
  std::vector<double> s, incident_profile, reflected_profile, specular_profile;  ///< |E|^2 along the line
  BeamMoments incident, reflected, specular;
  double line_distance = 0;                     ///< h, from the line to the face plane, m
  double shift = 0, uncertainty = 0;            ///< on the line, along t = z x n, m
  double face_shift = 0, face_uncertainty = 0;  ///< at the face plane, along t, m
};

/// run, reference: the cuts along the line (line_is_y: a line y = const, else x = const).
LateralShift lateral_shift(const LineCut& run, const LineCut& reference, bool line_is_y, const ShiftGeometry& g);

}  // namespace ty

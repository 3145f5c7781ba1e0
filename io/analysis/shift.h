/// \file shift.h
/// \brief The lateral (Goos-Hänchen) shift of a reflected beam, from the E field along a line
/// parallel to the interface on the incidence side, in a run and in its reference run: the
/// incident beam is the reference run's field, the reflected beam the difference of the two
/// (the scattered field). Each beam's intensity centroid and width (2 sigma of |E|^2, the
/// second-moment width) are measured; the shift is the reflected centroid less the
/// geometric-optics one, x_inc + 2 h tan(theta) along t = z x n (h the line's distance from
/// the interface), with an uncertainty of half a cell in where the discrete interface lies
/// (dx tan(theta)) plus a tenth of a cell for the centroids' sampling.
#pragma once
#include <vector>

#include "io/analysis/spectral_map_cut.h"

namespace ty {

struct BeamMoments {
  double centroid = 0, width = 0;  ///< m
};

/// The intensity centroid and 2-sigma width of samples I at positions s.
BeamMoments beam_moments(const std::vector<double>& s, const std::vector<double>& I);

struct LateralShift {
  std::vector<double> s, incident_profile, reflected_profile;  ///< |E|^2 along the line
  BeamMoments incident, reflected;
  double geometric = 0, shift = 0, uncertainty = 0;  ///< m; shift along t = z x n
};

/// run, reference: the cuts along the line (line_is_y: the line y = line, else x = line);
/// interface: its coordinate along the normal; theta: the angle of incidence, positive
/// towards t.
LateralShift lateral_shift(const LineCut& run, const LineCut& reference, bool line_is_y, double line, double interface,
                           double theta);

}  // namespace ty

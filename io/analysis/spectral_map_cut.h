/// \file spectral_map_cut.h
/// \brief Reading what a measurement needs from a run's spectral map (io/run/spectral_map_file)
/// with every argument checked against what the run holds: one frequency's intensity, and
/// the E components along a line of nodes parallel to an axis. A frequency the map did not
/// record, or a line or region outside the map, is refused (BadInput naming the map's range).
#pragma once
#include <complex>
#include <string>
#include <vector>

#include "io/analysis/angle.h"
#include "io/analysis/focus.h"
#include "io/run/spectral_map_file.h"

namespace ty {

/// |E|^2 of the map at frequency f (f <= 0: its first).
IntensityMap read_intensity(const SpectralMapFile& map, double f);

/// The map's E components on the row y = at (line_is_y) or the column x = at, at the
/// map's frequency index k; the nearest row or column, which must lie within half a node
/// spacing of `at` (BadInput otherwise, with the map's extent).
struct LineCut {
  std::vector<double> s;                   ///< position along the line, m
  std::vector<std::complex<double>> E[3];  ///< Ex, Ey, Ez (empty where not recorded)
  double at = 0;                           ///< the coordinate of the row or column used
};
LineCut read_line_cut(const SpectralMapFile& map, bool line_is_y, double at, size_t k);

/// BadInput unless the region lies inside the map (within half a node spacing of its nodes).
void check_region_inside(const SpectralMapFile& map, const FlowRegion& region);

/// BadInput unless the two maps have the same nodes (a run and its reference run).
void check_same_nodes(const SpectralMapFile& a, const SpectralMapFile& b);

}  // namespace ty

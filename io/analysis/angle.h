/// \file angle.h
/// \brief The direction of power flow of a beam inside a region of a spectral map, from the
/// time-averaged Poynting vector <S> = 1/2 Re(E x H*) weighted by |<S>|:
///   flow = atan2(sum |S| S_y, sum |S| S_x)  (from +x towards +y),
/// and the direction of the beam's centre line: the least-squares line through the
/// intensity (|S|) centroids of the region's rows or columns across the interface normal.
/// Both as refraction angles from the normal, positive towards t = z x n.
#pragma once
#include <vector>

namespace ty {

/// A rectangle: centre and full sizes, m.
struct FlowRegion {
  double cx = 0, cy = 0, sx = 0, sy = 0;
};

struct FlowAngle {
  double flow = 0;             ///< power-flow angle from +x, rad
  double refraction = 0;       ///< flow from the normal, rad, in (-pi/2, pi/2]
  double line_refraction = 0;  ///< the centre line from the normal, rad (NaN with fewer than two lines)
};

/// x, y: the map's nodes; sx, sy: Re <S> [y][x]; normal_is_x: the interface normal is x
/// (else y). BadInput when no power flows in the region.
FlowAngle power_flow_angle(const std::vector<double>& x, const std::vector<double>& y, const std::vector<double>& sx,
                           const std::vector<double>& sy, const FlowRegion& region, bool normal_is_x);

}  // namespace ty

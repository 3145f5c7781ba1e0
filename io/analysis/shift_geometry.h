/// \file shift_geometry.h
/// \brief Where a reflected beam's shift is measured from: the face plane of the body the
/// beam meets (solver/grid/face_plane.h), the grid's cells and step, and the refractive index
/// of the incidence side for the polarization the beam carries, all from the run's own
/// scene.
#pragma once
#include "io/analysis/shift.h"
#include "io/scene/scene.h"

namespace ty {

/// The geometry of `lateral_shift` for a line along x (line_axis 'y': the line is y = const)
/// or along y, the face near `interface` (user coordinate across the line), at angular
/// frequency omega; the face is looked for across from the incident beam's centroid on the
/// line.
ShiftGeometry shift_geometry(const Scene& s, char line_axis, double interface, double omega, const LineCut& incident);

}  // namespace ty

/// \file face_plane.h
/// \brief Where a body's flat face acts on the Yee grid: the one definition that `measure
/// shift` uses for the plane a reflected beam's zero point refers to, and that `medium
/// --line-distance` is measured from.
///
/// The tangential E of a face normal to y (Ez, and Ex of the Hz wave) sits on the node rows
/// y = j dy, the normal Ey half a cell off (yee_grid.h); likewise for a face normal to x.
/// - A perfect conductor zeroes every E node inside it (solver/media/coefficient_runs.cpp):
///   E_t = 0 holds on the first tangential-E node plane inside the body (on the edge when a
///   node lies on it), and the Yee fields are odd about that plane (image theory), so the
///   mirror is there exactly.
/// - A dielectric or magnetic body: each E node takes the mean permittivity of its cell, so
///   a face on a node row gives that row the mean of the two sides, the right mean for a
///   field tangential to the layers (the arithmetic mean of eps across a boundary parallel to
///   E; e.g. Farjadpour et al., Opt. Lett. 31, 2972 (2006)); the tangential-E condition acts
///   on that row, the plane taken is the node plane nearest the edge. The tangential H (and a
///   magnet's cells) sit half a cell off it, so the face is known to half a cell.
#pragma once
#include "io/scene/scene.h"
#include "solver/grid/yee_grid.h"

namespace ty {

struct FacePlane {
  double at = 0;           ///< the face plane's coordinate along the normal (user coordinates), m
  double half_cell = 0;    ///< half the node spacing along the normal: how well the face is known, m
  bool conductor = false;  ///< the body beyond is a perfect conductor
};

/// The face near `edge` (user coordinates along axis `normal`, 0 = x, 1 = y) of the body a
/// wave coming from `from` meets, looked for at `along` (the tangential coordinate where the
/// beam hits it).
FacePlane face_plane(const Scene& s, const YeeGrid& g, int normal, double edge, double from, double along);

}  // namespace ty

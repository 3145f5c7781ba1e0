/// \file tensor_energy.h
/// \brief The energy the rotated tensors' list keeps (tensor_cells.h): its instances'
/// sum_inst w W, W = sum_a [eps_inf,a E_a^2/2 + sum_k (j_k^2 + w0_k^2 p_k^2)/(2 W_k^2)], the
/// driven oscillator's energy of each pole (Jackson, Classical Electrodynamics, 3rd ed., sec.
/// 7.5, 7.10), conserved by the trapezoidal scheme when lossless (docs/method.md, "Rotated
/// in-plane tensors"). It stands for the list's nodes in place of (1/2) E^2: the sweep steps
/// them as vacuum, so the grid's field energy counts them so (Simulation::held_energy).
#pragma once
#include "solver/media/tensor_cells.h"

namespace ty {

/// sum_inst w W in V^2/m^2 (times eps0 dx dy: J/m).
double instance_energy(const TensorCells& t);

}  // namespace ty

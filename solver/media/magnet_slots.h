/// \file magnet_slots.h
/// \brief The magnets of a scene as the magnetic cells hold them: one slot (a model and its
/// starting state) per magnetic medium that a body without its own order uses, and one per
/// body with its own (an antiferromagnetic domain, materials/magnetic/domain_state.h).
#pragma once
#include <string>
#include <vector>

#include "solver/media/magnetic_cells.h"

namespace ty {

/// Fills M.models, M.ground and M.net slot by slot, each slot's highest line into
/// f_max_of and a note per slot (the state it took, and how); returns each body's slot
/// (-1: not magnetic).
std::vector<int> magnet_slots(const Scene& s, double dt, MagneticCells& M, std::vector<double>& f_max_of,
                              std::vector<std::string>& notes);

}  // namespace ty

/// \file refinement_table.h
/// \brief The convergence table of a `--refine` sweep: each measured number at every cell
/// size, its Richardson-extrapolated value, the observed order and the error estimate
/// (richardson.h), per combination of the other swept values; DIR/refinement.csv and .json.
#pragma once
#include <string>
#include <vector>

#include "io/analysis/sweep/results_table.h"

namespace ty {

/// `rows` in sweep order, the refined key ("grid.cell") the last swept key.
void write_refinement(const std::string& dir, const std::vector<ResultRow>& rows);

}  // namespace ty

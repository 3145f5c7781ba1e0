/// \file checkpoint.h
/// \brief Saving and restoring a running simulation (RUN/checkpoint.h5), so that a long
/// run can be stopped and resumed to the same bits. The state is whatever
/// Simulation::visit_state lists; the file also holds the resolved scene, and a resume
/// from a different scene is refused.
#pragma once
#include <string>

namespace ty {

/// Writes the state of `sim` to `path` (through a temporary file and a rename, so a
/// checkpoint is never half-written). Over MPI ranks it is collective: every rank calls it
/// at the same step and writes its own rows' parts of one file, the file one process writes.
template <class Sim>
void save_checkpoint(const std::string& path, Sim& sim, const std::string& scene_yaml);

/// Restores the state of `sim` (built from the same scene) from `path`; throws BadInput
/// when the file was written for another scene. Over MPI ranks it is collective: every rank
/// reads and checks its parts of the file (its rows', and what every rank holds alike), and when
/// any rank refuses it, every rank throws BadInput.
template <class Sim>
void load_checkpoint(const std::string& path, Sim& sim, const std::string& scene_yaml);

}  // namespace ty

/// \file checkpoint.h
/// \brief Saving and restoring a running simulation (RUN/checkpoint.h5), so that a long
/// run can be stopped and resumed to the same bits. The state is whatever
/// Simulation::visit_state lists; the file also holds the resolved scene, and a resume
/// from a different scene is refused.
#pragma once
#include <string>

namespace ty {

/// Writes the state of `sim` to `path` (through a temporary file and a rename, so a
/// checkpoint is never half-written).
template <class Sim>
void save_checkpoint(const std::string& path, Sim& sim, const std::string& scene_yaml);

/// Restores the state of `sim` (built from the same scene) from `path`; throws BadInput
/// when the file was written for another scene.
template <class Sim>
void load_checkpoint(const std::string& path, Sim& sim, const std::string& scene_yaml);

}  // namespace ty

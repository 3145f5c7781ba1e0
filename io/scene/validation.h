/// \file validation.h
/// \brief The rules that look at a whole scene rather than one key: sizes and counts that
/// must fit their integers, the memory a run will need against this machine's, where
/// bodies, sources, probes and lines may be, and where sources may be launched. `terayee check` and `terayee run` both
/// call validate_scene after reading, before anything is allocated; the solver repeats none of these rules.
#pragma once
#include <string>
#include <vector>

#include "io/scene/scene.h"

namespace ty {

/// One part of a run's memory, with the place in the scene that asks for it, and when it
/// is held: through the run, only while the simulation is built, or only while the results
/// are written at the end.
struct MemoryItem {
  enum class Phase { held, build, finish };
  std::string what;  ///< "fields and absorber", "probe 'p'", ...
  double bytes = 0;
  Mark where;
  Phase phase = Phase::held;
};

/// The sizes a run of the scene will have, computed from the Scene alone by the solver's
/// rules (whole cells, the absorber added on absorbing sides, the 2D Courant limit
/// dt = step-fraction / (c0 sqrt(1/dx^2 + 1/dy^2)), steps = ceil(stop / dt)); doubles, so
/// that a scene too large for the integers can still be measured and reported.
struct RunSizes {
  double nx = 0, ny = 0;          ///< cells, absorber included
  double npml_x = 0, npml_y = 0;  ///< absorbing cells on each side
  double dt = 0;                  ///< s
  double steps = 0;
  std::vector<MemoryItem> memory;
  /// The peak: what is held through the run, plus the larger of the build and the finish
  /// parts (the process's own code and libraries not included: resident_bytes()).
  double memory_bytes() const;
};
RunSizes run_sizes(const Scene& s);
/// run_sizes' memory items (validation_memory.cpp): every allocation of the solver, its
/// recorders and the closing write that grows with the scene.
void add_memory(const Scene& s, RunSizes& z);

/// The memory this process holds now (resident), bytes: its code, libraries and what it
/// has read; a run holds about as much before it builds anything.
double resident_bytes();

/// The memory this process may use, bytes: the machine's physical memory, or the control
/// group's limit when that is lower (a container or a batch job).
double machine_memory_bytes();

/// Checks every cross-field, size, memory and launch rule; throws BadInput with all the
/// errors (each with its file:line:col) and returns the warnings. `memory_limit` in bytes
/// (machine_memory_bytes() for a real run).
std::vector<std::string> validate_scene(const Scene& s, double memory_limit);

}  // namespace ty

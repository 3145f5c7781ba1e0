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

/// One part of a run's memory, with the place in the scene that asks for it.
struct MemoryItem {
  std::string what;  ///< "fields and absorber", "probe 'p'", ...
  double bytes = 0;
  Mark where;
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
  double memory_bytes() const;
};
RunSizes run_sizes(const Scene& s);

/// The memory this process may use, bytes: the machine's physical memory, or the control
/// group's limit when that is lower (a container or a batch job).
double machine_memory_bytes();

/// Checks every cross-field, size, memory and launch rule; throws BadInput with all the
/// errors (each with its file:line:col) and returns the warnings. `memory_limit` in bytes
/// (machine_memory_bytes() for a real run).
std::vector<std::string> validate_scene(const Scene& s, double memory_limit);

}  // namespace ty

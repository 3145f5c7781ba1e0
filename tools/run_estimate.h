/// \file run_estimate.h
/// \brief What `terayee run` will take on this machine, for `terayee check`: the scene's own
/// simulation is built (as the run builds it, on the thread count the run will use) and its
/// parts are timed briefly, each the fastest of a few short repeats (on a busy machine the
/// fastest repeat is the one least disturbed by other processes), then multiplied by the
/// solver's own counts for the whole run: steps for the step (every cell kind at once:
/// vacuum, bodies, absorber, magnetic and dispersive cells), steps for the probes, the
/// sampled steps inside each frequency's window for the running DFTs (frequencies x points),
/// frames for the snapshots, and the run's hundred field checks.
#pragma once
#include <string>
#include <vector>

#include "io/scene/scene.h"

namespace ty {

struct TimePart {
  std::string what;    ///< "time steps", "power spectrum 'r'", ...
  double seconds = 0;  ///< over the whole run
  std::string count;   ///< the count it was multiplied by, in words
};

struct RunTimeEstimate {
  int threads = 1;
  long steps = 0;
  bool built = true;  ///< false: the scene was too large to build here, the cell-rate model was used
  std::vector<TimePart> parts;
  std::string blocking;  ///< the steps per pass `run` would take (block depth auto) and why
  double total() const;
};

/// threads = 0: what the run would take (time.threads, else fitted to the work).
/// memory: the run's peak estimate (validation.h); above build_limit (bytes) the scene is not built.
RunTimeEstimate estimate_run_time(const Scene& s, int threads, double memory, double build_limit);

}  // namespace ty

/// \file checkpoint.cpp
/// \brief Checkpoint files through the HDF5 wrapper. The resolved scene is a text
/// dataset (/scene), so a scene of any size fits. A checkpoint read back is input: every
/// dataset's shape is checked before it is read, every value must be finite, and the
/// clock must be a step this run can be at (exit 2 naming the dataset otherwise).
/// Over MPI ranks the file is the same: every rank writes the parts of each array its rows
/// own, together, in one collective write per dataset (hdf5_shared.cpp), and rank 0 renames
/// the finished temporary file into place; on a resume over any rank count each rank reads the
/// parts its rows own and the row beyond each side (an array every rank holds alike, whole).
#include "io/run/checkpoint.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <iostream>
#include <type_traits>

#include "io/run/atomic_file.h"
#include "io/run/hdf5_file.h"
#include "io/run/kill_point.h"
#include "io/scene/diagnostics.h"
#include "solver/parallel/ranks.h"
#include "solver/simulation.h"

namespace ty {
namespace {

constexpr hsize_t kMaxScene = hsize_t(1) << 30;  // 1 GiB of YAML is no scene

[[noreturn]] void corrupt(const std::string& path, const std::string& dataset, const std::string& what) {
  throw BadInput(
      fmt::format("{}: error: {}: {}; the checkpoint is damaged (rerun without --resume, with "
                  "--overwrite, to start again)",
                  path, dataset, what));
}

/// The clock must name a step this run can be at, and the snapshot frames taken by then.
template <class Sim>
void check_clock(const std::string& path, const Sim& sim, double steps, double frames) {
  if (!(steps >= 0 && steps < static_cast<double>(sim.total_steps()) && steps == std::floor(steps)))
    corrupt(path, "/clock/steps", fmt::format("{:g} is not a step between 0 and {}", steps, sim.total_steps() - 1));
  const auto& at = sim.snapshot_plan().steps;
  const long n = static_cast<long>(steps);
  const auto taken = std::count_if(at.begin(), at.end(), [&](long k) { return k < n; });
  if (frames != static_cast<double>(taken))
    corrupt(path, "/clock/frames", fmt::format("{:g} frames, but {} are taken by step {}", frames, taken, n));
}

/// The checkpoint's datasets, every rank writing the parts its rows own (Simulation::owned_parts):
/// the same datasets, shapes and values as one process writes, whatever the rank count.
template <class Sim>
void write_state(const std::string& tmp, Sim& sim, const std::string& scene_yaml) {
  h5::File f = h5::File::create_shared(tmp);
  const bool root = parallel::rank() == 0;
  f.write_parts("/scene", scene_yaml.size(), scene_yaml.data(),
                root ? h5::File::Parts{{0, scene_yaml.size()}} : h5::File::Parts{});
  f.attribute("/", "terayee-version", TERAYEE_VERSION);
  sim.visit_state([&](const std::string& name, auto* data, std::size_t n) {
    f.write_parts("/" + name, static_cast<hsize_t>(n), data, sim.owned_parts(name, n));
  });
  f.flush();
}

}  // namespace

template <class Sim>
void save_checkpoint(const std::string& path, Sim& sim, const std::string& scene_yaml) {
  static long written = 0;
  if (parallel::size() == 1) {
    write_atomically(path, [&](const std::string& tmp) {
      write_state(tmp, sim, scene_yaml);
      kill_point(KillPoint::checkpoint, ++written);
    });
    return;
  }
  // Over ranks: all write the temporary file together, then rank 0 alone puts it in place;
  // a failure on any rank is a failure on every rank (and the old checkpoint stays).
  const std::string tmp = temporary_name(path);
  std::string failed;
  try {
    write_state(tmp, sim, scene_yaml);
  } catch (const std::exception& e) {
    failed = e.what();
  }
  if (parallel::max_over_ranks(failed.empty() ? 0 : 1) == 0) {
    kill_point(KillPoint::checkpoint, ++written);
    if (parallel::rank() == 0) {
      try {
        commit_file(tmp, path);
      } catch (const std::exception& e) {
        failed = e.what();
      }
    }
    if (parallel::max_over_ranks(failed.empty() ? 0 : 1) == 0) return;
  }
  if (parallel::rank() == 0) discard_temporary(tmp);
  throw std::runtime_error(failed.empty() ? fmt::format("another rank could not write {}", path) : failed);
}

/// Reading a checkpoint back: every value this rank reads checked, then applied. Over ranks a rank
/// reads an array divided by rows in its own rows and the row beyond each side (its first step reads
/// the neighbour cells' state before any exchange), so its memory stays its rows'; an array every
/// rank holds alike, whole (Simulation::owned_parts with widen 1); one process reads everything.
template <class Sim>
void read_state(const std::string& path, Sim& sim, const std::string& scene_yaml) {
  if (!std::filesystem::exists(path)) throw BadInput(fmt::format("{}: error: there is no checkpoint to resume", path));
  const h5::File f = h5::File::open(path);
  if (f.read_text("/scene", std::max<hsize_t>(kMaxScene, scene_yaml.size())) != scene_yaml)
    throw BadInput(
        fmt::format("{}: error: the checkpoint was written for another scene (or other --set values); "
                    "resume with the scene and settings the run started with",
                    path));
  // Two passes: every dataset read and checked, then (the clock checked too) read again and
  // applied, so nothing of `sim` changes on a refusal and no more than one dataset's parts are
  // held twice (a whole second copy of the state would double the run's memory while it resumes).
  double steps = -1, frames = -1;
  std::vector<h5::File::Parts> reads;  // each array's parts, found on the first pass
  for (const bool apply : {false, true}) {
    if (apply) check_clock(path, sim, steps, frames);
    std::size_t next = 0;
    sim.visit_state([&](const std::string& name, auto* data, std::size_t n) {
      using T = std::remove_pointer_t<decltype(data)>;
      if (!apply) reads.push_back(sim.owned_parts(name, n, parallel::rank(), parallel::size(), 1));
      const h5::File::Parts& parts = reads[next++];
      const std::vector<double> v = f.read_checked_parts("/" + name, static_cast<hsize_t>(n), parts);
      std::size_t at = 0;
      for (const auto& [a, b] : parts)
        for (std::size_t k = a; k < b; ++k, ++at)
          if (!std::isfinite(v[at])) corrupt(path, "/" + name, fmt::format("value {} is {}", k, v[at]));
      if (name == "clock/steps") steps = v[0];
      if (name == "clock/frames") frames = v[0];
      at = 0;
      for (const auto& [a, b] : parts)  // float and long values round-trip exactly
        for (std::size_t k = a; k < b && apply; ++k) data[k] = static_cast<T>(v[at++]);
    });
  }
}

template <class Sim>
void load_checkpoint(const std::string& path, Sim& sim, const std::string& scene_yaml) {
  if (parallel::size() == 1) return read_state(path, sim, scene_yaml);
  // Over ranks every rank reads and checks its parts of the file (read_state) with the same
  // checked readers; should any rank fail (its own parts, or its own read error), every rank
  // refuses, rank 0 with its reason or that another rank could not read the file: none goes on
  // to wait for the others.
  std::string failed;
  try {
    read_state(path, sim, scene_yaml);
  } catch (const BadInput& e) {
    failed = e.what();
  } catch (const std::exception& e) {
    failed = fmt::format("{}: error: {}; the checkpoint cannot be read", path, e.what());
  }
  const bool root = parallel::rank() == 0;
  if (parallel::max_over_ranks(failed.empty() ? 0 : 1) == 0) return;
  const bool root_failed = parallel::max_over_ranks(root && !failed.empty() ? 1 : 0) > 0;
  if (!root_failed && !failed.empty())  // rank 0 speaks for the run (tools/main.cpp); this rank's reason
    std::cerr << fmt::format("terayee (rank {}): {}\n", parallel::rank(), failed);
  throw BadInput(root_failed ? failed : fmt::format("{}: error: another rank could not read the checkpoint", path));
}

template void save_checkpoint(const std::string&, Simulation<float>&, const std::string&);
template void save_checkpoint(const std::string&, Simulation<double>&, const std::string&);
template void load_checkpoint(const std::string&, Simulation<float>&, const std::string&);
template void load_checkpoint(const std::string&, Simulation<double>&, const std::string&);

}  // namespace ty

/// \file checkpoint.cpp
/// \brief Checkpoint files through the HDF5 wrapper. The resolved scene is a text
/// dataset (/scene), so a scene of any size fits. A checkpoint read back is input: every
/// dataset's shape is checked before it is read, every value must be finite, and the
/// clock must be a step this run can be at (exit 2 naming the dataset otherwise).
#include "io/run/checkpoint.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <type_traits>

#include "io/run/atomic_file.h"
#include "io/run/hdf5_file.h"
#include "io/run/kill_point.h"
#include "io/scene/diagnostics.h"
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

}  // namespace

template <class Sim>
void save_checkpoint(const std::string& path, Sim& sim, const std::string& scene_yaml) {
  write_atomically(path, [&](const std::string& tmp) {
    h5::File f = h5::File::create(tmp);
    f.write_text("/scene", scene_yaml);
    f.attribute("/", "terayee-version", TERAYEE_VERSION);
    sim.visit_state([&](const std::string& name, auto* data, std::size_t n) {
      f.write("/" + name, {static_cast<hsize_t>(n)}, data, "");
    });
    f.flush();
    static long written = 0;
    kill_point(KillPoint::checkpoint, ++written);
  });
}

template <class Sim>
void load_checkpoint(const std::string& path, Sim& sim, const std::string& scene_yaml) {
  if (!std::filesystem::exists(path)) throw BadInput(fmt::format("{}: error: there is no checkpoint to resume", path));
  const h5::File f = h5::File::open(path);
  if (f.read_text("/scene", std::max<hsize_t>(kMaxScene, scene_yaml.size())) != scene_yaml)
    throw BadInput(
        fmt::format("{}: error: the checkpoint was written for another scene (or other --set values); "
                    "resume with the scene and settings the run started with",
                    path));
  // Everything is read and checked before anything of `sim` changes.
  std::vector<std::vector<double>> values;
  double steps = -1, frames = -1;
  sim.visit_state([&](const std::string& name, auto*, std::size_t n) {
    std::vector<double> v = f.read_checked("/" + name, {static_cast<hsize_t>(n)});
    for (std::size_t k = 0; k < n; ++k)
      if (!std::isfinite(v[k])) corrupt(path, "/" + name, fmt::format("value {} is {}", k, v[k]));
    if (name == "clock/steps") steps = v[0];
    if (name == "clock/frames") frames = v[0];
    values.push_back(std::move(v));
  });
  check_clock(path, sim, steps, frames);
  std::size_t next = 0;
  sim.visit_state([&](const std::string&, auto* data, std::size_t n) {
    using T = std::remove_pointer_t<decltype(data)>;
    const std::vector<double>& v = values[next++];
    for (std::size_t k = 0; k < n; ++k) data[k] = static_cast<T>(v[k]);  // float and long values round-trip exactly
  });
}

template void save_checkpoint(const std::string&, Simulation<float>&, const std::string&);
template void save_checkpoint(const std::string&, Simulation<double>&, const std::string&);
template void load_checkpoint(const std::string&, Simulation<float>&, const std::string&);
template void load_checkpoint(const std::string&, Simulation<double>&, const std::string&);

}  // namespace ty

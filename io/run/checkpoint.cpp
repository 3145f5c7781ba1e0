/// \file checkpoint.cpp
/// \brief Checkpoint files through the HDF5 wrapper.
#include "io/run/checkpoint.h"

#include <fmt/format.h>

#include <cstring>
#include <filesystem>
#include <type_traits>

#include "io/scene/diagnostics.h"
#include "io/run/hdf5_file.h"
#include "solver/simulation.h"

namespace ty {

template <class Sim>
void save_checkpoint(const std::string& path, Sim& sim, const std::string& scene_yaml) {
  const std::string tmp = path + ".tmp";
  {
    h5::File f = h5::File::create(tmp);
    f.attribute("/", "scene", scene_yaml);
    f.attribute("/", "terayee-version", TERAYEE_VERSION);
    sim.visit_state([&](const std::string& name, auto* data, std::size_t n) {
      f.write("/" + name, {static_cast<hsize_t>(n)}, data, "");
    });
  }
  std::filesystem::rename(tmp, path);
}

template <class Sim>
void load_checkpoint(const std::string& path, Sim& sim, const std::string& scene_yaml) {
  if (!std::filesystem::exists(path)) throw BadInput(fmt::format("{}: error: there is no checkpoint to resume", path));
  const h5::File f = h5::File::open(path);
  if (f.read_attribute("/", "scene") != scene_yaml)
    throw BadInput(fmt::format("{}: error: the checkpoint was written for another scene (or other --set values); "
                               "resume with the scene and settings the run started with",
                               path));
  sim.visit_state([&](const std::string& name, auto* data, std::size_t n) {
    using T = std::remove_pointer_t<decltype(data)>;
    const std::vector<double> v = f.read("/" + name);
    if (v.size() != n) throw BadInput(fmt::format("{}: error: '{}' does not match this run's layout", path, name));
    for (std::size_t k = 0; k < n; ++k) data[k] = static_cast<T>(v[k]);  // float and long values round-trip exactly
  });
}

template void save_checkpoint(const std::string&, Simulation<float>&, const std::string&);
template void save_checkpoint(const std::string&, Simulation<double>&, const std::string&);
template void load_checkpoint(const std::string&, Simulation<float>&, const std::string&);
template void load_checkpoint(const std::string&, Simulation<double>&, const std::string&);

}  // namespace ty

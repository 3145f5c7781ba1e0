/// \file folder_scene.cpp
/// \brief The scene a run folder holds: written, read back, matched.
#include "io/run/folder_scene.h"

#include <fmt/format.h>

#include <filesystem>
#include <fstream>
#include <iterator>

#include "io/scene/diagnostics.h"
#include "io/scene/scene_writer.h"

namespace ty {

namespace fs = std::filesystem;

std::string folder_scene(const Scene& scene) {
  return "# resolved by terayee: every default filled in, every value in SI\n" + resolved_scene_yaml(scene);
}

std::string read_folder_scene(const std::string& dir) {
  std::ifstream in(fs::path(dir) / "scene.yaml");
  return std::string((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
}

bool holds_completed(const std::string& dir, const Scene& scene) {
  const fs::path d(dir);
  if (!fs::exists(d / "summary.json") || fs::exists(d / "checkpoint.h5")) return false;
  if (read_folder_scene(dir) != folder_scene(scene))
    throw BadInput(fmt::format("{}: error: it holds a completed run of another scene or other --set values; "
                               "nothing was resumed (a new run needs an empty folder or --overwrite)",
                               dir));
  return true;
}

}  // namespace ty

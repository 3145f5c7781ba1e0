/// \file folder_scene.h
/// \brief The scene a run folder holds (scene.yaml: the resolved scene, every default filled
/// in, every value in SI), by which a resumed run is matched to the run it goes on with.
#pragma once
#include <string>

#include "io/scene/scene.h"

namespace ty {

/// scene.yaml's text for `scene`, as a run folder writes it.
std::string folder_scene(const Scene& scene);

/// The text of `dir`/scene.yaml ("" if there is none).
std::string read_folder_scene(const std::string& dir);

/// Whether `dir` holds a completed run (its summary and no checkpoint), which `run --resume`
/// leaves alone. One of another resolved scene (another scene file or other --set values)
/// is refused (BadInput, exit 2), not taken for the run asked for.
bool holds_completed(const std::string& dir, const Scene& scene);

}  // namespace ty

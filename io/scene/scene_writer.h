/// \file scene_writer.h
/// \brief Writes a Scene back as YAML with every default filled in and every value in SI
/// units; the result is itself a valid scene file (it reads back to the same Scene).
#pragma once
#include <string>

#include "io/scene/scene.h"

namespace ty {

std::string resolved_scene_yaml(const Scene& s);

}  // namespace ty

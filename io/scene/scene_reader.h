/// \file scene_reader.h
/// \brief Reads a YAML scene file into a plain Scene, checking every key, type, unit
/// and value; all errors of the file are collected and thrown together as BadInput.
#pragma once
#include <string>
#include <vector>

#include "io/scene/scene.h"

namespace ty {

/// `overrides` are "key.path=value" strings (the --set option) applied to the YAML tree
/// before it is read; list items are addressed by their index ("sources.0.beam.angle").
Scene read_scene(const std::string& path, const std::vector<std::string>& overrides = {});

/// The same from YAML text (for tests); `name` stands in for the file name in messages.
Scene read_scene_text(const std::string& text, const std::string& name,
                      const std::vector<std::string>& overrides = {});


}  // namespace ty

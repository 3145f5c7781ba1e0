/// \file scene_reader.cpp
/// \brief The strict scene reader's entry: parses the YAML, rejects keys given twice,
/// applies the `--set` options and reads the sections (io/scene/reader/, one file per
/// section). Every error is recorded with its file:line:col and reading goes on, so that
/// one run of `check` shows all of them.
#include "io/scene/scene_reader.h"

#include <fstream>
#include <sstream>

#include "io/scene/reader/reader.h"

namespace ty {
namespace reader {

Scene SceneBuilder::build(const YAML::Node& root) {
  if (!root.IsMap()) {
    r_.error(root, "a scene file must be a map with the keys title, grid, time, media, bodies, sources, outputs");
    return scene_;
  }
  r_.allow(root, {"title", "grid", "time", "bias", "media", "bodies", "sources", "outputs"}, "the scene");
  for (auto k : {"grid", "time", "sources"}) r_.require(root, k, "the scene");
  if (root["title"]) {
    if (auto t = r_.text(root["title"], "title")) scene_.title = *t;
  }
  if (root["bias"]) {
    if (auto b = r_.vec3(root["bias"], "bias", Kind::magnetic_field)) scene_.bias = *b;
  }
  if (root["media"]) read_media(root["media"]);
  if (root["sources"] && r_.is_seq(root["sources"], "sources")) prescan_sources(root["sources"]);
  if (root["grid"] && r_.is_map(root["grid"], "grid")) read_grid(root["grid"]);
  if (root["time"] && r_.is_map(root["time"], "time")) read_time(root["time"]);
  if (root["bodies"] && r_.is_seq(root["bodies"], "bodies"))
    for (const auto& b : root["bodies"]) read_body(b);
  if (root["sources"] && root["sources"].IsSequence()) {
    if (root["sources"].size() == 0) r_.error(root["sources"], "'sources' is empty: a run needs at least one source");
    for (size_t k = 0; k < root["sources"].size(); ++k) read_source(root["sources"][k], k);
  }
  if (root["outputs"] && r_.is_seq(root["outputs"], "outputs"))
    for (const auto& o : root["outputs"]) read_output(o);
  return scene_;
}

void find_duplicate_keys(const YAML::Node& n, Reader& r) {
  if (n.IsSequence())
    for (const auto& c : n) find_duplicate_keys(c, r);
  if (!n.IsMap()) return;
  std::vector<std::pair<std::string, YAML::Node>> seen;
  for (const auto& kv : n) {
    const std::string k = kv.first.IsScalar() ? kv.first.Scalar() : "";
    for (const auto& [name, first] : seen)
      if (name == k) {
        const Mark m = r.mark(first);
        r.error(kv.first, fmt::format("the key '{}' is given twice in this map (first at line {}, column {})", k,
                                      m.line, m.column));
        break;
      }
    seen.emplace_back(k, kv.first);
    find_duplicate_keys(kv.second, r);
  }
}

}  // namespace reader

namespace {

Scene read_yaml(YAML::Node root, const std::string& name, const std::vector<std::string>& overrides) {
  Diagnostics d;
  {
    reader::Reader plain(d, name);
    reader::find_duplicate_keys(root, plain);
  }
  for (const auto& o : overrides) reader::apply_override(root, o);
  std::vector<reader::OverrideNode> marks;
  for (const auto& o : overrides) reader::collect_override_nodes(root, o, marks);
  reader::SceneBuilder b(d, name, std::move(marks));
  Scene s = b.build(root);
  d.throw_if_any();
  return s;
}

Scene load_checked(const std::string& text, const std::string& name, const std::vector<std::string>& overrides) {
  YAML::Node root;
  try {
    root = YAML::Load(text);
  } catch (const YAML::ParserException& e) {
    throw BadInput(
        fmt::format("{}:{}:{}: error: this is not valid YAML: {}", name, e.mark.line + 1, e.mark.column + 1, e.msg));
  }
  if (!root || root.IsNull()) throw BadInput(fmt::format("{}: error: the scene file is empty", name));
  return read_yaml(root, name, overrides);
}

}  // namespace

Scene read_scene_text(const std::string& text, const std::string& name, const std::vector<std::string>& overrides) {
  return load_checked(text, name, overrides);
}

Scene read_scene(const std::string& path, const std::vector<std::string>& overrides) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw BadInput(fmt::format("{}: error: cannot open the scene file", path));
  std::stringstream ss;
  ss << in.rdbuf();
  return load_checked(ss.str(), path, overrides);
}

}  // namespace ty

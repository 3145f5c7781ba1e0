/// \file overrides.cpp
/// \brief The `--set KEY=VALUE` options: each replaces one value of the YAML tree before
/// it is read (list items by their index, "sources.0.beam.angle"). A broken option is
/// reported as "--set KEY=VALUE: ...", and so are the errors found later in what it set.
#include <algorithm>
#include <sstream>

#include "io/scene/reader/reader.h"

namespace ty::reader {
namespace {

std::vector<std::string> split_path(const std::string& path) {
  std::vector<std::string> keys;
  std::stringstream ss(path);
  for (std::string k; std::getline(ss, k, '.');) keys.push_back(k);
  return keys;
}

size_t list_index(const YAML::Node& list, const std::string& item, const std::string& k) {
  size_t idx = 0, used = 0;
  try {
    idx = std::stoul(k, &used);
  } catch (const std::exception&) {
    used = 0;
  }
  if (used == 0 || used != k.size()) throw BadInput(fmt::format("--set {}: '{}' should be a list index", item, k));
  if (idx >= list.size()) throw BadInput(fmt::format("--set {}: there is no item {} in that list", item, idx));
  return idx;
}

/// One step down the tree (a missing key of a map is created; `cur` is not const for that).
YAML::Node child(YAML::Node cur, const std::string& item, const std::vector<std::string>& keys, size_t a) {
  const std::string& k = keys[a];
  if (cur.IsSequence()) return cur[list_index(cur, item, k)];
  if (cur.IsMap() || cur.IsNull() || !cur.IsDefined()) return cur[k];
  std::string at;
  for (size_t b = 0; b < a; ++b) at += (b ? "." : "") + keys[b];
  throw BadInput(fmt::format("--set {}: '{}' is a single value; it has no key '{}'", item, at, k));
}

}  // namespace

void apply_override(YAML::Node root, const std::string& item) {
  const auto eq = item.find('=');
  if (eq == std::string::npos || eq == 0) throw BadInput(fmt::format("--set {}: expected KEY=VALUE", item));
  const std::vector<std::string> keys = split_path(item.substr(0, eq));
  if (keys.empty() || std::find(keys.begin(), keys.end(), "") != keys.end())
    throw BadInput(fmt::format("--set {}: the key path has an empty part", item));
  // yaml-cpp nodes are handles: walk with fresh handles, never assign one node to another
  std::vector<YAML::Node> chain{root};
  for (size_t a = 0; a + 1 < keys.size(); ++a) chain.push_back(child(chain.back(), item, keys, a));
  YAML::Node parent = chain.back();
  YAML::Node v;
  try {
    v = YAML::Load(item.substr(eq + 1));
  } catch (const YAML::Exception& e) {
    throw BadInput(fmt::format("--set {}: the value is not valid YAML ({})", item, e.msg));
  }
  if (parent.IsSequence()) {
    parent[list_index(parent, item, keys.back())] = v;
  } else if (parent.IsMap() || parent.IsNull() || !parent.IsDefined()) {
    parent[keys.back()] = v;
  } else {
    child(parent, item, keys, keys.size() - 1);  // throws: a single value has no keys
  }
}

void collect_override_nodes(const YAML::Node& root, const std::string& item, std::vector<OverrideNode>& out) {
  const auto keys = split_path(item.substr(0, item.find('=')));
  YAML::Node cur = root;
  for (const auto& k : keys) {
    YAML::Node next = cur.IsSequence() ? cur[std::stoul(k)] : cur[k];
    cur.reset(next);
    if (cur.Mark().line < 0) out.push_back({cur, item});  // a map the option created
  }
  std::vector<YAML::Node> todo{cur};
  while (!todo.empty()) {
    YAML::Node n = todo.back();
    todo.pop_back();
    out.push_back({n, item});
    if (n.IsSequence())
      for (const auto& c : n) todo.push_back(c);
    if (n.IsMap())
      for (const auto& kv : n) todo.push_back(kv.first), todo.push_back(kv.second);
  }
}

}  // namespace ty::reader

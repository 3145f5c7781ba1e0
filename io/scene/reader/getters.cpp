/// \file getters.cpp
/// \brief The reader's typed getters: text, quantities with units (resolving `cells` per axis and
/// `periods`), vectors, whole numbers, booleans; each error at its node's file:line:col.
#include <algorithm>
#include <stdexcept>

#include "io/scene/reader/reader.h"

namespace ty::reader {

Mark Reader::mark(const YAML::Node& n) const {
  for (const auto& o : overrides_)
    if (o.node.is(n)) return {"--set " + o.item, 0, 0};
  const auto m = n.Mark();
  if (m.line < 0) return {file_, 0, 0};
  return {file_, m.line + 1, m.column + 1};
}

bool Reader::is_map(const YAML::Node& n, std::string_view what) {
  if (n.IsMap()) return true;
  error(n, fmt::format("'{}' must be a map of keys", what));
  return false;
}

bool Reader::is_seq(const YAML::Node& n, std::string_view what) {
  if (n.IsSequence()) return true;
  error(n, fmt::format("'{}' must be a list", what));
  return false;
}

void Reader::allow(const YAML::Node& map, std::initializer_list<std::string_view> keys, std::string_view where) {
  if (!map.IsMap()) return;
  for (const auto& kv : map) {
    const std::string k = kv.first.as<std::string>("");
    if (std::find(keys.begin(), keys.end(), k) != keys.end()) continue;
    std::string list;
    for (auto a : keys) list += (list.empty() ? "" : ", ") + std::string(a);
    error(kv.first, fmt::format("unknown key '{}' in {} (allowed: {})", k, where, list));
  }
}

std::optional<std::string> Reader::text(const YAML::Node& n, std::string_view key) {
  if (!n.IsScalar()) {
    error(n, fmt::format("'{}' must be a single value", key));
    return std::nullopt;
  }
  return n.Scalar();
}

std::optional<double> Reader::quantity(const YAML::Node& n, std::string_view key, Kind k, double cell, double period) {
  auto t = text(n, key);
  if (!t) return std::nullopt;
  std::string why;
  auto q = parse_quantity(*t, k, why);
  if (!q) {
    error(n, fmt::format("'{}': {}", key, why));
    return std::nullopt;
  }
  if (q->relative == Quantity::Relative::cells) {
    if (cell < 0) {
      error(n, fmt::format("'{}': 'cells' is ambiguous here: the cell is not square and this length has no axis; "
                           "give it in m, mm or um",
                           key));
      return std::nullopt;
    }
    if (cell == 0) {
      error(n, fmt::format("'{}': the unit 'cells' cannot be used here", key));
      return std::nullopt;
    }
    return q->value * cell;
  }
  if (q->relative == Quantity::Relative::periods) {
    if (period <= 0) {
      error(n, fmt::format("'{}': 'periods' needs a source frequency, and one only (the sources here have "
                           "none or several); give a time in s, ns or ps",
                           key));
      return std::nullopt;
    }
    return q->value * period;
  }
  return q->value;
}

std::optional<double> Reader::positive(const YAML::Node& n, std::string_view key, Kind k, double cell, double period) {
  auto v = quantity(n, key, k, cell, period);
  if (v && !(*v > 0)) {
    error(n, fmt::format("'{}' must be positive, got {}", key, n.Scalar()));
    return std::nullopt;
  }
  return v;
}

std::optional<Vec2> Reader::vec2(const YAML::Node& n, std::string_view key, Kind k, Vec2 cell) {
  if (!n.IsSequence() || n.size() != 2) {
    error(n, fmt::format("'{}' must be a list of two values [x, y]", key));
    return std::nullopt;
  }
  auto a = quantity(n[0], key, k, cell.x), b = quantity(n[1], key, k, cell.y);
  if (!a || !b) return std::nullopt;
  return Vec2{*a, *b};
}

std::optional<std::array<double, 3>> Reader::vec3(const YAML::Node& n, std::string_view key, Kind k) {
  if (!n.IsSequence() || n.size() != 3) {
    error(n, fmt::format("'{}' must be a list of three values [x, y, z]", key));
    return std::nullopt;
  }
  auto a = quantity(n[0], key, k), b = quantity(n[1], key, k), c = quantity(n[2], key, k);
  if (!a || !b || !c) return std::nullopt;
  return std::array<double, 3>{*a, *b, *c};
}

std::optional<int> Reader::integer(const YAML::Node& n, std::string_view key, int lo, int hi) {
  auto t = text(n, key);
  if (!t) return std::nullopt;
  try {
    size_t used = 0;
    const long v = std::stol(*t, &used);
    if (used != t->size()) throw std::invalid_argument("");
    if (v < lo || v > hi) {
      error(n, fmt::format("'{}' must be a whole number from {} to {}, got {}", key, lo, hi, v));
      return std::nullopt;
    }
    return static_cast<int>(v);
  } catch (const std::exception&) {
    error(n, fmt::format("'{}' must be a whole number, got '{}'", key, *t));
    return std::nullopt;
  }
}

std::optional<bool> Reader::boolean(const YAML::Node& n, std::string_view key) {
  auto t = text(n, key);
  if (!t) return std::nullopt;
  if (*t == "true") return true;
  if (*t == "false") return false;
  error(n, fmt::format("'{}' must be true or false, got '{}'", key, *t));
  return std::nullopt;
}

void Reader::require(const YAML::Node& map, std::string_view key, std::string_view where) {
  if (!map[std::string(key)]) error(map, fmt::format("{} needs the key '{}'", where, key));
}

}  // namespace ty::reader

/// \file sweep_plan.cpp
/// \brief Parsing sweep axes and expanding them into points (see sweep_plan.h).
#include "io/analysis/sweep/sweep_plan.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <charconv>
#include <cmath>
#include <fstream>
#include <set>

#include "io/scene/diagnostics.h"

namespace ty {
namespace {

std::string trim(const std::string& s) {
  const auto a = s.find_first_not_of(" \t\r\n"), b = s.find_last_not_of(" \t\r\n");
  return a == std::string::npos ? "" : s.substr(a, b - a + 1);
}

std::vector<std::string> split(const std::string& s, char sep) {
  std::vector<std::string> out;
  size_t from = 0;
  for (size_t at; (at = s.find(sep, from)) != std::string::npos; from = at + 1) out.push_back(trim(s.substr(from, at - from)));
  out.push_back(trim(s.substr(from)));
  return out;
}

/// "NUMBER UNIT" -> (number, unit); false when the text does not start with a number.
bool number_and_unit(const std::string& text, double& v, std::string& unit) {
  const char* b = text.data();
  const auto [end, ec] = std::from_chars(b, b + text.size(), v);
  if (ec != std::errc() || !std::isfinite(v)) return false;
  unit = trim(std::string(end, b + text.size()));
  return true;
}

std::string number_text(double v, const std::string& unit) {
  std::string s = fmt::format("{:.10g}", v);
  if (s == "-0") s = "0";
  return unit.empty() ? s : s + " " + unit;
}

/// "-2T:2T:9" -> nine values; empty when `text` is not a range.
std::vector<std::string> range_values(const std::string& spec, const std::string& text) {
  const auto parts = split(text, ':');
  if (parts.size() != 3) return {};
  double a, b, n;
  std::string ua, ub, un;
  if (!number_and_unit(parts[0], a, ua) || !number_and_unit(parts[1], b, ub) || !number_and_unit(parts[2], n, un))
    return {};
  if (ua != ub || !un.empty() || n != std::floor(n) || n < 2 || n > 100000)
    throw BadInput(fmt::format("--vary {}: a range is FROM:TO:COUNT with FROM and TO in one unit and a whole COUNT "
                               "of at least 2",
                               spec));
  std::vector<std::string> v;
  for (int k = 0; k < static_cast<int>(n); ++k) v.push_back(number_text(a + (b - a) * k / (n - 1), ua));
  return v;
}

std::string safe_name(const std::string& s) {
  std::string out;
  for (char c : s) {
    if (c == ' ') continue;  // "1 T" -> "1T"
    const bool keep = std::isalnum(static_cast<unsigned char>(c)) || c == '.' || c == '-' || c == '+' || c == '=';
    out += keep ? c : '_';
  }
  return out;
}

}  // namespace

std::vector<std::string> SweepPoint::overrides() const {
  std::vector<std::string> o;
  for (const auto& [k, v] : sets) o.push_back(k + "=" + v);
  return o;
}

SweepAxis parse_axis(const std::string& spec) {
  const auto eq = spec.find('=');
  SweepAxis a;
  if (eq == std::string::npos || eq == 0) throw BadInput(fmt::format("--vary {}: expected KEY=VALUES", spec));
  a.key = trim(spec.substr(0, eq));
  const std::string text = trim(spec.substr(eq + 1));
  if (!text.empty() && text[0] == '@') {
    std::ifstream in(text.substr(1));
    if (!in) throw BadInput(fmt::format("--vary {}: cannot read the file '{}'", spec, text.substr(1)));
    for (std::string line; std::getline(in, line);)
      if (auto t = trim(line.substr(0, line.find('#'))); !t.empty()) a.values.push_back(t);
  } else if (auto r = range_values(spec, text); !r.empty()) {
    a.values = r;
  } else {
    for (const auto& v : split(text, ','))
      if (!v.empty()) a.values.push_back(v);
  }
  if (a.values.empty()) throw BadInput(fmt::format("--vary {}: no values", spec));
  return a;
}

SweepAxis refine_axis(const std::string& key, const std::string& base, int levels) {
  double v;
  std::string unit;
  if (!number_and_unit(base, v, unit) || !(v > 0) || levels < 2 || levels > 8)
    throw BadInput(fmt::format("--refine: needs the scene's cell as a positive length and 2 to 8 levels (got '{}', {})",
                               base, levels));
  SweepAxis a{key, {}};
  for (int k = 0; k < levels; ++k) a.values.push_back(number_text(v / std::pow(2.0, k), unit));
  return a;
}

std::vector<SweepPoint> expand(const std::vector<SweepAxis>& axes, bool zip) {
  std::set<std::string> keys;
  for (const auto& a : axes)
    if (!keys.insert(a.key).second) throw BadInput(fmt::format("--vary: the key '{}' is varied twice", a.key));
  std::vector<SweepPoint> pts;
  if (axes.empty()) return pts;
  size_t count = 1;
  if (zip) {
    count = axes[0].values.size();
    for (const auto& a : axes)
      if (a.values.size() != count)
        throw BadInput(fmt::format("--zip: '{}' has {} values and '{}' has {}", axes[0].key, count, a.key, a.values.size()));
  } else {
    for (const auto& a : axes) {
      count *= a.values.size();
      if (count > 100000) throw BadInput("--vary: more than 100000 points");
    }
  }
  for (size_t p = 0; p < count; ++p) {
    SweepPoint pt;
    pt.index = static_cast<int>(p);
    size_t rest = p;
    std::vector<size_t> idx(axes.size());
    for (size_t k = axes.size(); k-- > 0;) {  // the last axis fastest
      idx[k] = zip ? p : rest % axes[k].values.size();
      if (!zip) rest /= axes[k].values.size();
    }
    std::string name = fmt::format("{:04d}", p);
    for (size_t k = 0; k < axes.size(); ++k) {
      pt.sets.emplace_back(axes[k].key, axes[k].values[idx[k]]);
      name += "_" + safe_name(axes[k].key + "=" + axes[k].values[idx[k]]);
    }
    pt.name = name;
    pts.push_back(pt);
  }
  return pts;
}

}  // namespace ty

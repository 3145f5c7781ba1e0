/// \file results_table.cpp
/// \brief Flattening measurements into the sweep's results table (see results_table.h).
#include "io/analysis/sweep/results_table.h"

#include <fmt/format.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <set>
#include <stdexcept>

#include "io/run/atomic_file.h"

namespace ty {
namespace {

std::string csv_field(const std::string& s) {
  if (s.find_first_of(",\"\n") == std::string::npos) return s;
  std::string q = "\"";
  for (char c : s) q += c == '"' ? std::string("\"\"") : std::string(1, c);
  return q + "\"";
}

std::string text_of(const nlohmann::json& v) {
  if (v.is_string()) return v.get<std::string>();
  if (v.is_number_float()) return fmt::format("{:.10g}", v.get<double>());
  return v.dump();
}

}  // namespace

void flatten_measurement(const nlohmann::json& j, const std::string& prefix, nlohmann::json& flat) {
  if (j.is_object()) {
    for (auto it = j.begin(); it != j.end(); ++it) flatten_measurement(it.value(), prefix + "." + it.key(), flat);
  } else if (j.is_array()) {
    if (j.size() > 3) return;  // spectra and profiles stay in the point's own files
    for (size_t k = 0; k < j.size(); ++k)
      if (j[k].is_number()) flat[fmt::format("{}[{}]", prefix, k)] = j[k];
  } else if (j.is_number() || j.is_boolean() || j.is_string()) {
    flat[prefix] = j;
  }
}

std::string column_unit(const std::string& column) {
  std::string key = column.substr(column.rfind('.') + 1);
  key = key.substr(0, key.find('['));
  static const std::map<std::string, std::string> units = {
      {"shift", "m"},          {"uncertainty", "m"},       {"specular-centroid", "m"}, {"incident-centroid", "m"},
      {"incident-width", "m"}, {"reflected-centroid", "m"}, {"reflected-width", "m"}, {"non-reciprocal", "m"},
      {"reciprocal", "m"},     {"peak-position", "m"},      {"fwhm-along-axis", "m"}, {"fwhm-across-axis", "m"},
      {"distance-from-face", "m"}, {"frequency", "Hz"},     {"peak-intensity", "(V/m)^2"},
      {"line-distance", "m"},  {"face-shift", "m"},         {"face-uncertainty", "m"}};
  if (auto it = units.find(key); it != units.end()) return it->second;
  if (key.size() > 4 && key.substr(key.size() - 4) == "-rad") return "rad";
  return "";
}

void write_results(const std::string& dir, const std::vector<std::string>& swept_keys, const std::vector<ResultRow>& rows) {
  std::set<std::string> columns;  // measured columns, sorted, the union over points
  for (const auto& r : rows)
    for (auto it = r.measured.begin(); it != r.measured.end(); ++it) columns.insert(it.key());
  std::string csv = "point,status";
  for (const auto& k : swept_keys) csv += "," + csv_field(k);
  for (const auto& c : columns) {
    const std::string u = column_unit(c);
    csv += "," + csv_field(u.empty() ? c : c + " [" + u + "]");
  }
  csv += "\n";
  nlohmann::json j = nlohmann::json::object();
  j["swept"] = swept_keys;
  nlohmann::json units = nlohmann::json::object();
  for (const auto& c : columns) units[c] = column_unit(c);
  j["units"] = units;
  j["points"] = nlohmann::json::array();
  for (const auto& r : rows) {
    csv += csv_field(r.point) + "," + r.status;
    nlohmann::json p;
    p["point"] = r.point, p["status"] = r.status;
    for (const auto& [k, v] : r.swept) csv += "," + csv_field(v), p["swept"][k] = v;
    for (const auto& c : columns) csv += "," + (r.measured.contains(c) ? csv_field(text_of(r.measured[c])) : std::string());
    p["measured"] = r.measured;
    j["points"].push_back(p);
    csv += "\n";
  }
  write_text_atomically(dir + "/results.csv", csv);
  write_text_atomically(dir + "/results.json", j.dump(2) + "\n");
}

}  // namespace ty

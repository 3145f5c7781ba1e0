/// \file measurement_files.cpp
/// \brief Reading measurement tables and summaries back (see measurement_files.h).
#include "io/analysis/measurement_files.h"

#include <fmt/format.h>

#include <cmath>
#include <cstdlib>
#include <fstream>
#include <sstream>

#include "io/scene/diagnostics.h"

namespace ty {

const std::vector<double>& Table::col(const std::string& name, const std::string& file) const {
  auto it = num.find(name);
  if (it == num.end()) throw BadInput(fmt::format("{}: error: no column '{}'", file, name));
  return it->second;
}

Table read_table(const std::string& file, const std::string& made_by) {
  std::ifstream in(file);
  if (!in) throw BadInput(fmt::format("{}: error: not found; {} writes it", file, made_by));
  std::string line;
  std::getline(in, line);
  std::vector<std::string> names;
  for (std::stringstream ss(line); std::getline(ss, line, ',');) names.push_back(line);
  Table t;
  while (std::getline(in, line)) {
    if (line.empty()) continue;
    std::stringstream ss(line);
    std::string cell;
    for (size_t c = 0; c < names.size() && std::getline(ss, cell, ','); ++c) {
      char* end = nullptr;
      const double v = std::strtod(cell.c_str(), &end);
      if (end != cell.c_str() && *end == '\0')
        t.num[names[c]].push_back(v);
      else if (cell == "nan" || cell == "-nan")
        t.num[names[c]].push_back(NAN);
      else
        t.text[names[c]].push_back(cell);
    }
    ++t.rows;
  }
  return t;
}

nlohmann::json read_json_file(const std::string& file, const std::string& made_by) {
  std::ifstream in(file);
  if (!in) throw BadInput(fmt::format("{}: error: not found; {} writes it", file, made_by));
  return nlohmann::json::parse(in);
}

Profiles read_profiles(const std::string& run, const std::string& kind, const std::string& tag_column) {
  const std::string made_by = "`terayee measure " + kind + "`", file = run + "/" + kind + "-profiles.csv";
  Profiles p;
  p.summary = read_json_file(run + "/" + kind + ".json", made_by);
  const Table t = read_table(file, made_by);
  if (!t.text.count(tag_column)) throw BadInput(fmt::format("{}: error: no column '{}'", file, tag_column));
  p.tag = t.text.at(tag_column);
  p.s = t.col("s_m", file);
  p.intensity = t.col("intensity", file);
  return p;
}

}  // namespace ty

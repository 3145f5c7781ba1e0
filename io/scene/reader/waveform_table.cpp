/// \file waveform_table.cpp
/// \brief A file waveform's table: two columns (time, value) per line, separated by a comma
/// and/or spaces; blank lines and lines starting with '#' are skipped. Read strictly: every
/// other line must hold exactly two finite numbers, times strictly increasing, at least four
/// samples; each bad line is an error at its file:line:col, collected with the scene's.
#include <cerrno>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>

#include "io/scene/reader/reader.h"

namespace ty::reader {

namespace {

/// The numbers of one line with their columns (1-based); the first column of a bad token in
/// `bad_col` (0: none).
struct Fields {
  std::vector<double> v;
  std::vector<int> col;
  int bad_col = 0;
};

Fields split_numbers(const std::string& line) {
  Fields f;
  size_t i = 0;
  while (i < line.size()) {
    while (i < line.size() && (line[i] == ' ' || line[i] == '\t' || line[i] == ',' || line[i] == '\r')) ++i;
    if (i >= line.size()) break;
    size_t j = i;
    while (j < line.size() && line[j] != ' ' && line[j] != '\t' && line[j] != ',' && line[j] != '\r') ++j;
    const std::string tok = line.substr(i, j - i);
    char* end = nullptr;
    errno = 0;
    const double v = std::strtod(tok.c_str(), &end);
    if (end != tok.c_str() + tok.size() || errno == ERANGE || !std::isfinite(v)) {
      if (!f.bad_col) f.bad_col = static_cast<int>(i) + 1;
    } else {
      f.v.push_back(v);
      f.col.push_back(static_cast<int>(i) + 1);
    }
    i = j;
  }
  return f;
}

}  // namespace

void read_waveform_table(Reader& r, const YAML::Node& at, const std::string& path, double time_unit, Waveform& w) {
  std::ifstream in(path);
  if (!in) {
    r.error(at, fmt::format("cannot read the waveform file '{}'", path));
    return;
  }
  std::string line;
  int number = 0;
  bool ok = true;
  while (std::getline(in, line)) {
    ++number;
    const size_t first = line.find_first_not_of(" \t\r");
    if (first == std::string::npos || line[first] == '#') continue;
    const Fields f = split_numbers(line);
    Mark m{path, number, f.bad_col ? f.bad_col : static_cast<int>(first) + 1};
    if (f.bad_col) {
      r.error(m, "not a finite number: each line of a waveform file is 'time, value'");
      ok = false;
    } else if (f.v.size() != 2) {
      if (f.v.size() > 2) m.column = f.col[2];
      r.error(m, fmt::format("{} numbers on the line: each line of a waveform file is 'time, value'", f.v.size()));
      ok = false;
    } else {
      const double t = f.v[0] * time_unit;
      if (!w.table_time.empty() && !(t > w.table_time.back())) {
        r.error(m, "the times of a waveform file must increase strictly from line to line");
        ok = false;
      }
      w.table_time.push_back(t);
      w.table_value.push_back(f.v[1]);
    }
  }
  if (ok && w.table_time.size() < 4)
    r.error(Mark{path, number, 1},
            fmt::format("a waveform file needs at least 4 samples; it has {}", w.table_time.size()));
  if (ok && !w.table_time.empty() && w.table_time.front() < 0)
    r.error(Mark{path, 1, 1}, "a waveform file's times start at 0 or later (the run starts at t = 0)");
}

}  // namespace ty::reader

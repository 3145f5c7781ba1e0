/// \file measurement_files.h
/// \brief Reading back what `terayee measure` and `terayee medium --csv` wrote into a run
/// folder, for plots: a CSV table by columns, and a measurement's summary (KIND.json) with
/// its profiles (KIND-profiles.csv: tag, s_m, intensity). A missing file is a BadInput naming
/// the command that writes it.
#pragma once
#include <map>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

namespace ty {

/// A CSV file by columns: numeric columns in `num`, text columns in `text`.
struct Table {
  std::map<std::string, std::vector<double>> num;
  std::map<std::string, std::vector<std::string>> text;
  size_t rows = 0;
  /// The numeric column `name` (BadInput naming `file` when there is none).
  const std::vector<double>& col(const std::string& name, const std::string& file) const;
};

/// made_by: the command that writes the file, for the message when it is missing.
Table read_table(const std::string& file, const std::string& made_by);
nlohmann::json read_json_file(const std::string& file, const std::string& made_by);

/// What `terayee measure KIND` wrote: KIND.json and KIND-profiles.csv.
struct Profiles {
  nlohmann::json summary;
  std::vector<std::string> tag;
  std::vector<double> s, intensity;
};
Profiles read_profiles(const std::string& run, const std::string& kind, const std::string& tag_column);

}  // namespace ty

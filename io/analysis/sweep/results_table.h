/// \file results_table.h
/// \brief The results table of a sweep: one row per point, the swept values and the
/// numbers every measurement wrote (RUN/<kind>.json), flattened to "kind.key" columns
/// with their SI units in the header; written as results.csv and results.json.
#pragma once
#include <nlohmann/json.hpp>
#include <string>
#include <utility>
#include <vector>

namespace ty {

struct ResultRow {
  std::string point;                                         ///< the point's folder name
  std::vector<std::pair<std::string, std::string>> swept;    ///< (key, value) per axis
  std::string status;                                        ///< done, failed, missing
  nlohmann::json measured = nlohmann::json::object();        ///< flat: column -> number or text
};

/// Adds the scalars of `j` (numbers, booleans, text; short arrays of numbers as key[0],
/// key[1], ...; nested objects as a.b) under `prefix` to the flat object `flat`.
void flatten_measurement(const nlohmann::json& j, const std::string& prefix, nlohmann::json& flat);

/// The SI unit of a measured column from its last key ("shift" -> "m"), "" when dimensionless.
std::string column_unit(const std::string& column);

/// Writes DIR/results.csv (header "name [unit]") and DIR/results.json, through a temporary
/// file and a rename each.
void write_results(const std::string& dir, const std::vector<std::string>& swept_keys, const std::vector<ResultRow>& rows);

}  // namespace ty

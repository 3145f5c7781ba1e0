/// \file refinement_table.cpp
/// \brief Richardson extrapolation over a refinement sweep (see refinement_table.h).
#include "io/analysis/sweep/refinement_table.h"

#include <fmt/format.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <set>
#include <stdexcept>

#include "io/analysis/sweep/richardson.h"
#include "io/run/atomic_file.h"

namespace ty {

void write_refinement(const std::string& dir, const std::vector<ResultRow>& rows) {
  // group the rows by every swept value but the last (the cell), keeping sweep order
  std::vector<std::string> group_names;
  std::map<std::string, std::vector<const ResultRow*>> groups;
  for (const auto& r : rows) {
    std::string g;
    for (size_t k = 0; k + 1 < r.swept.size(); ++k) g += (g.empty() ? "" : "; ") + r.swept[k].first + "=" + r.swept[k].second;
    if (!groups.count(g)) group_names.push_back(g);
    groups[g].push_back(&r);
  }
  std::string csv = "group,column,unit";
  size_t levels = 0;
  for (const auto& [g, rs] : groups) levels = std::max(levels, rs.size());
  for (size_t k = 0; k < levels; ++k) csv += fmt::format(",cell {}", k);
  csv += ",extrapolated,order,order observed,error estimate\n";
  nlohmann::json j = nlohmann::json::array();
  for (const auto& g : group_names) {
    const auto& rs = groups[g];
    std::set<std::string> columns;
    for (const auto* r : rs)
      for (auto it = r->measured.begin(); it != r->measured.end(); ++it)
        if (it.value().is_number()) columns.insert(it.key());
    for (const auto& c : columns) {
      std::vector<double> f;
      bool complete = true;
      for (const auto* r : rs) {
        complete = complete && r->status == "done" && r->measured.contains(c) && r->measured[c].is_number();
        if (complete) f.push_back(r->measured[c].get<double>());
      }
      const auto e = complete ? richardson(f) : std::nullopt;
      std::string line = fmt::format("\"{}\",{},{}", g, c, column_unit(c));
      for (size_t k = 0; k < levels; ++k) line += k < f.size() ? fmt::format(",{:.10g}", f[k]) : ",";
      if (e) line += fmt::format(",{:.10g},{:.4g},{},{:.4g}", e->value, e->order, e->order_observed ? "yes" : "no", e->error);
      else line += ",,,,";
      csv += line + "\n";
      nlohmann::json x{{"group", g}, {"column", c}, {"unit", column_unit(c)}, {"values", f}};
      if (e) x["extrapolated"] = e->value, x["order"] = e->order, x["order-observed"] = e->order_observed,
             x["error-estimate"] = e->error, x["monotone"] = e->monotone;
      j.push_back(x);
    }
  }
  write_text_atomically(dir + "/refinement.csv", csv);
  write_text_atomically(dir + "/refinement.json", j.dump(2) + "\n");
}

}  // namespace ty

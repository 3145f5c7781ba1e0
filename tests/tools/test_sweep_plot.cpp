/// \file test_sweep_plot.cpp
/// \brief `terayee render DIR --plot sweep`: over a results table written by the sweep's own
/// writer (a grid of bias × cell, one point failed), the pictures decode as PNG (cairo's
/// reader) at the plot's size, the data beside them hold exactly the numbers of results.csv
/// (read back as plain CSV text), the map's cells carry the sequential colour map's ends at
/// the smallest and largest value, and unknown names are refused with exit status 2 and the
/// names that exist.
#include <cairo.h>
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>
#include <map>
#include <memory>
#include <sstream>

#include "io/analysis/sweep/results_table.h"
#include "io/pictures/colour_map.h"
#include "tests/helpers.h"
#include "tests/tools/capture.h"

namespace fs = std::filesystem;
using ty::test::shell;

namespace {

/// RFC 4180 rows: fields split at commas outside double quotes.
std::vector<std::vector<std::string>> read_csv(const fs::path& p) {
  std::ifstream in(p);
  std::vector<std::vector<std::string>> rows;
  for (std::string line; std::getline(in, line);) {
    std::vector<std::string> f(1);
    bool quoted = false;
    for (size_t k = 0; k < line.size(); ++k) {
      const char c = line[k];
      if (c == '"')
        quoted = !(quoted && !(k + 1 < line.size() && line[k + 1] == '"' && (++k, true)));
      else if (c == ',' && !quoted)
        f.emplace_back();
      else
        f.back() += c;
    }
    rows.push_back(f);
  }
  return rows;
}

using ty::test::capture;

/// A 3 × 2 sweep (bias.2 × grid.cell) with a shift column; the point at 0 T, 12.5 um failed.
/// Each test case has its own folder (`ctest -j` runs them at once).
fs::path table(const std::string& name) {
  const fs::path dir = fs::temp_directory_path() / ("terayee-test-sweep-plot-" + name);
  fs::remove_all(dir);
  fs::create_directories(dir);
  std::ofstream(dir / "sweep.json") << R"({"zip": false})";
  std::vector<ty::ResultRow> rows;
  int k = 0;
  for (const char* b : {"-2 T", "0 T", "2 T"})
    for (const char* c : {"25 um", "12.5 um"}) {
      ty::ResultRow r{std::to_string(k++), {{"bias.2", b}, {"grid.cell", c}}, "done", nlohmann::json::object()};
      const double bias = std::stod(b), cell = std::stod(c) * 1e-6;
      if (bias == 0 && cell < 2e-5)
        r.status = "failed";
      else
        r.measured = {{"shift.run.shift", 1.7e-5 * bias + 0.3 * cell}, {"shift.note", "text"}};
      rows.push_back(r);
    }
  ty::write_results(dir.string(), {"bias.2", "grid.cell"}, rows);
  return dir;
}

}  // namespace

TEST_CASE("render --plot sweep: lines and a map of a results column, their data the numbers of results.csv") {
  const fs::path dir = table("lines");
  const std::string base = std::string(TERAYEE_BINARY) + " render '" + dir.string() + "' --plot sweep";
  REQUIRE(shell(base + " --x bias.2 --y shift.run.shift --with-map") == 0);
  const fs::path lines = dir / "pictures" / "sweep-shift.run.shift-vs-bias.2.png";
  const fs::path map = dir / "pictures" / "sweep-shift.run.shift-map.png";
  for (const auto& png : {lines, map}) {  // a PNG a decoder reads, at the plot's size (plot.h: 900 x 600)
    cairo_surface_t* s = cairo_image_surface_create_from_png(png.c_str());
    CHECK(cairo_surface_status(s) == CAIRO_STATUS_SUCCESS);
    CHECK(cairo_image_surface_get_width(s) == 900);
    CHECK(cairo_image_surface_get_height(s) == 600);
    cairo_surface_destroy(s);
  }
  // results.csv's columns: point, status, bias.2, grid.cell, shift.note, shift.run.shift [m]
  const auto res = read_csv(dir / "results.csv");
  REQUIRE(res.size() == 7);
  REQUIRE(res[0][5] == "shift.run.shift [m]");
  // the lines' data: one series per cell, x the bias in tesla, y the shift in metres
  const auto got = read_csv(fs::path(lines).replace_extension(".csv"));
  REQUIRE(got.size() == 1 + 5);  // the failed point has no value and no row
  std::map<std::pair<std::string, double>, double> drawn;
  for (size_t k = 1; k < got.size(); ++k) drawn[{got[k][1], std::stod(got[k][2])}] = std::stod(got[k][3]);
  for (size_t k = 1; k < res.size(); ++k) {
    if (res[k][1] != "done") continue;
    const auto it = drawn.find({"grid.cell = " + res[k][3], std::stod(res[k][2])});
    REQUIRE(it != drawn.end());
    CHECK(it->second == doctest::Approx(std::stod(res[k][5])).epsilon(1e-9));
  }
  // the map's data: every cell of the grid, x in T, y in m, z the shift (NaN where it failed)
  const auto m = read_csv(fs::path(map).replace_extension(".csv"));
  REQUIRE(m.size() == 1 + 6);
  int nans = 0;
  for (size_t k = 1; k < m.size(); ++k) {
    const double x = std::stod(m[k][0]), y = std::stod(m[k][1]), z = std::stod(m[k][2]);
    if (std::isnan(z)) {
      ++nans;
      CHECK(x == 0);
      CHECK(y == doctest::Approx(12.5e-6));
      continue;
    }
    CHECK(z == doctest::Approx(1.7e-5 * x + 0.3 * y).epsilon(1e-9));
  }
  CHECK(nans == 1);
  // the map's cells: viewport x 10..80 %, y 12..90 % of the page (plot.cpp), 3 columns of
  // bias, 2 rows of cell (12.5 um below); the smallest value (-2 T, 12.5 um) takes the
  // sequential map's dark end, the largest (2 T, 25 um) its light end, the failed cell none
  cairo_surface_t* s = cairo_image_surface_create_from_png(map.c_str());
  const auto colour = [&](int col, int row) {
    const int px = static_cast<int>(900 * (0.1 + 0.7 * (col + 0.5) / 3));
    const int py = static_cast<int>(600 * (1 - (0.12 + 0.78 * (row + 0.5) / 2)));
    const auto* line = cairo_image_surface_get_data(s) + static_cast<size_t>(py) * cairo_image_surface_get_stride(s);
    const uint32_t p = reinterpret_cast<const uint32_t*>(line)[px];
    return ty::Rgb{((p >> 16) & 255) / 255.0, ((p >> 8) & 255) / 255.0, (p & 255) / 255.0};
  };
  const auto& seq = ty::ColourMap::sequential();
  CHECK(seq.invert(colour(0, 0)) < 0.02);
  CHECK(seq.invert(colour(2, 1)) > 0.98);
  const ty::Rgb blank = colour(1, 0);
  CHECK(blank.r + blank.g + blank.b > 2.95);  // the white page
  cairo_surface_destroy(s);
  fs::remove_all(dir);
}

TEST_CASE("render --plot sweep: an unknown key or column, or a map of one key, is refused with the names that exist") {
  const fs::path dir = table("refused");
  const std::string base = std::string(TERAYEE_BINARY) + " render '" + dir.string() + "' --plot sweep";
  const std::string err = capture(base + " --x bias.3 --y shift.run.shfit 2>&1");
  CHECK(err.find("--x 'bias.3' is not a swept key; the sweep varies: bias.2, grid.cell") != std::string::npos);
  CHECK(err.find("--y 'shift.run.shfit' is not a column of numbers in the results; those are: shift.run.shift") !=
        std::string::npos);
  CHECK(shell(base + " --x bias.3 --y shift.run.shift") == 2);
  CHECK(shell(base + " --x bias.2 --y shift.note") == 2);  // text, not numbers
  CHECK(shell(base + " --x bias.2") == 2);
  std::ofstream(dir / "sweep.json") << R"({"zip": true})";  // in step: no grid to map
  CHECK(shell(base + " --x bias.2 --y shift.run.shift --with-map") == 2);
  CHECK(!fs::exists(dir / "pictures" / "sweep-shift.run.shift-map.png"));
  fs::remove_all(dir);
}

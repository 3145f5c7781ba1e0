/// \file test_bench_command.cpp
/// \brief `terayee bench`: its magnetic cases are MnF2 in every cell (an earlier grid was
/// 44% vacuum, sized before its cell was set, so every magnetic cost it printed was an
/// average with vacuum cells), and its last line is `cell_updates_per_s=` (docs/performance.md).
#include <doctest/doctest.h>

#include <filesystem>
#include <string>

#include "tests/helpers.h"

namespace {
std::string bench_output(const std::string& args) {
  const std::string out = (std::filesystem::temp_directory_path() / "terayee-bench.txt").string();
  // in a subshell: shell() sends the command's own output to /dev/null
  REQUIRE(ty::test::shell("(" + std::string(TERAYEE_BINARY) + " bench " + args + " > '" + out + "')") == 0);
  return ty::test::read_text(out);
}
}  // namespace

TEST_CASE("terayee bench: the magnetic and tilted grids are magnetic in every cell") {
  for (const char* c : {"magnetic", "tilted"}) {
    const std::string text = bench_output(std::string("--size 40 --threads 1 --seconds 0.05 --case ") + c);
    CHECK(text.find("# 1600 of the 1600 cells magnetic") != std::string::npos);
    const auto last = text.rfind("cell_updates_per_s=");
    REQUIRE(last != std::string::npos);
    CHECK(std::stod(text.substr(last + 19)) > 0);
  }
  // a vacuum grid says nothing of magnetic cells
  CHECK(bench_output("--size 40 --threads 1 --seconds 0.05 --case vacuum").find("magnetic") == std::string::npos);
}

/// \file test_measure_shift.cpp
/// \brief `terayee measure shift` on total internal reflection, eps = 5.5 to vacuum at
/// 45 deg, a Gaussian beam of waist 8 wavelengths in the medium: the difference of the TE
/// (Ez) and TM (Hz) lateral shifts matches Artmann's stationary-phase result, D_TE - D_TM
/// = (0.2406 - 0.1069) lambda0 (Artmann, Ann. Phys. 437, 87 (1948); the check values of
/// shared/references.md), within 10%. The difference cancels the half-cell uncertainty of
/// where the discrete interface lies, which shifts each polarization alike.
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>

#include "tests/helpers.h"

namespace fs = std::filesystem;

namespace {

using ty::test::shell;

double shift_of(const std::string& pol) {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/tir-shift.yaml";
  const std::string bin = TERAYEE_BINARY;
  const fs::path run = fs::temp_directory_path() / ("terayee-tir-" + pol), ref = fs::temp_directory_path() / ("terayee-tir-ref-" + pol);
  const std::string set = " --quiet --set sources.0.beam.polarization=" + pol;
  REQUIRE(shell(bin + " run '" + scene + "' -o '" + run.string() + "'" + set) == 0);
  REQUIRE(shell(bin + " run '" + scene + "' -o '" + ref.string() + "' --reference" + set) == 0);
  REQUIRE(shell(bin + " measure shift '" + run.string() + "' --reference '" + ref.string() +
                "' --map cut --line 'y=1.7 mm' --interface '2.2 mm' --angle '45 deg'") == 0);
  std::ifstream in(run / "shift.json");
  const auto j = nlohmann::json::parse(in);
  fs::remove_all(run);
  fs::remove_all(ref);
  return j["run"]["shift"].get<double>();
}

}  // namespace

TEST_CASE("measure shift: TE - TM lateral shift of total internal reflection matches Artmann") {
  const double lambda0 = 299792458.0 / 1e12;
  const double te = shift_of("Ez"), tm = shift_of("Hz");
  const double expected = (0.2406 - 0.1069) * lambda0;
  MESSAGE("TE shift " << te * 1e6 << " um (Artmann " << 0.2406 * lambda0 * 1e6 << "), TM " << tm * 1e6 << " um ("
                      << 0.1069 * lambda0 * 1e6 << "); difference " << (te - tm) * 1e6 << " um against "
                      << expected * 1e6);
  CHECK(std::abs((te - tm) / expected - 1) < 0.10);
  CHECK(te > tm);  // the TE shift is the larger, as Artmann's formula has it
}

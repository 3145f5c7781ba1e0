/// \file test_negative_refraction.cpp
/// \brief The negative-refraction study (scenarios/negative-refraction): a beam entering an
/// a-cut MnF2 plate at 30 deg inside the band where mu_perp < 0. The iso-frequency curve is
/// a hyperbola (kx^2/mu_yy + ky^2/mu_xx = eps k0^2 with mu_yy < 0 < mu_xx), and the power
/// flow S ~ (kx/mu_yy, ky/mu_xx) turns to the incidence side of the normal (Smith & Schurig,
/// Phys. Rev. Lett. 90, 077405 (2003)). `measure angle` on the run must find negative
/// refraction within 2 deg of `medium`'s prediction for the same crystal (losses included,
/// materials/refraction.h); and the crystal inside the absorbers must stay quiet. The same
/// run in single precision must give the same angle to rounding.
#include <doctest/doctest.h>

#include <filesystem>

#include "tests/helpers.h"

namespace fs = std::filesystem;
using ty::test::read_json;
using ty::test::shell;

namespace {

/// The study's run (with extra --set options) and `measure angle` over the plate: the run
/// folder, holding angle.json and summary.json.
fs::path run_study(const std::string& scene, const std::string& name, const std::string& sets) {
  const std::string bin = TERAYEE_BINARY;
  const fs::path run = fs::temp_directory_path() / name;
  fs::remove_all(run);
  REQUIRE(shell(bin + " run '" + scene + "' -o '" + run.string() + "' --quiet" + sets) == 0);
  // inside the plate, 0.5 to 2.5 mm deep, where the refracted beam runs
  REQUIRE(shell(bin + " measure angle '" + run.string() +
                "' --map steady --region '0.5 mm' '1.5 mm' '6 mm' '2 mm' --normal y --incidence '30 deg'") == 0);
  return run;
}

}  // namespace

TEST_CASE("negative-refraction study: power flows to the incidence side, within 2 deg of medium") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/negative-refraction/negative-refraction.yaml";
  const std::string bin = TERAYEE_BINARY;
  const fs::path pred = fs::temp_directory_path() / "terayee-test-negative-refraction.json";
  const fs::path run = run_study(scene, "terayee-test-negative-refraction", "");
  REQUIRE(shell(bin + " medium '" + scene + "' --medium mnf2 --from '262.5 GHz' --to '262.5 GHz' --count 1 --angle "
                      "'30 deg' --json '" + pred.string() + "'") == 0);
  const auto m = read_json((run / "angle.json").string());
  const auto p = read_json(pred.string());
  const double measured = m["refraction-angle-rad"].get<double>() * 180 / ty::constants::pi;
  const double predicted = p["rows"][0]["refraction-angle-deg"].get<double>();
  MESSAGE("power flow " << measured << " deg from the normal, medium predicts " << predicted << " deg ("
                        << p["rows"][0]["character"].get<std::string>() << ")");
  CHECK(p["rows"][0]["character"] == "hyperbola");
  CHECK(m["negative-refraction"].get<bool>());
  CHECK(measured < -5);
  CHECK(std::abs(measured - predicted) < 2.0);
  // the plate runs on through the absorbers, where a PML amplifies a hyperbolic medium's
  // backward waves (Becache, Fauqueux & Joly 2003): with a PML there, cells in the corners
  // tilted past the small-signal limit by 2 ns and reached 0.07 rad by 4 ns; the default
  // absorber gives those sides the graded loss (solver/grid/graded_loss.h), in which no cell
  // leaves the small-signal step and the absorber's cells tilt no more than the rest
  const auto summary = read_json((run / "summary.json").string());
  CHECK(summary["magnetic-cells"]["large-tilt-fraction"].get<double>() == 0.0);
  CHECK(summary["magnetic-cells"]["largest-tilt-in-absorber-rad"].get<double>() <=
        summary["magnetic-cells"]["largest-tilt-rad"].get<double>());
  // the same study in single precision (float fields; the magnetic cells' state and the
  // recorders' sums in double): the angle as in double, to rounding (measured: 7.5e-8 deg apart)
  const fs::path single = run_study(scene, "terayee-test-negative-refraction-single", " --set time.precision=single");
  const double in_single = read_json((single / "angle.json").string())["refraction-angle-rad"].get<double>() * 180 /
                           ty::constants::pi;
  MESSAGE("single precision: " << in_single << " deg, " << in_single - measured << " from double");
  CHECK(std::abs(in_single - measured) < 1e-4);
  fs::remove_all(single);
  fs::remove_all(run);
  fs::remove(pred);
}

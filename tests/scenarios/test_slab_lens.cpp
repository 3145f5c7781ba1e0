/// \file test_slab_lens.cpp
/// \brief The slab-lens study (scenarios/slab-lens): a line source 0.25 mm before a 3 mm
/// a-cut MnF2 plate at 262.5 GHz, inside the hyperbolic band. The prediction is made without
/// the simulation: the source's plane-wave (Sommerfeld-Weyl) spectrum through the plate's 4x4
/// transfer matrix (materials/angular_spectrum.h; the same sum reproduces the free-space
/// Hankel field to 1e-13 in test_angular_spectrum.cpp), whose axial intensity maximum puts
/// the focus 1.02 mm behind the far face with a 0.64 mm FWHM across it (the paraxial
/// b = |rho| d - a, rho = sqrt(mu_xx/eps) Re(1/mu_yy), says 1.74 mm: loss and the wide
/// angles of a source this close move the focus in). The run's `measure focus` must find
/// the focus behind the plate, where the prediction puts it within the 25 um grid's error:
/// measured 1.9% short in the focal distance and 0.2% in the spot (the earlier gather of G H
/// to the magnetic cells: 18% and 6%, solver/media/magnetic_cells.h), so the test allows
/// issue 12's 5% in both.
#include <doctest/doctest.h>

#include <filesystem>

#include "io/analysis/sweep/richardson.h"
#include "tests/helpers.h"

namespace fs = std::filesystem;
using ty::test::read_json;
using ty::test::shell;

TEST_CASE("slab-lens study: the focus lies where the transfer matrix puts it") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/slab-lens/slab-lens.yaml";
  const std::string bin = TERAYEE_BINARY;
  const fs::path run = fs::temp_directory_path() / "terayee-test-slab-lens";
  const fs::path pred = fs::temp_directory_path() / "terayee-test-slab-lens.json";
  fs::remove_all(run);
  REQUIRE(shell(bin + " medium '" + scene + "' --medium mnf2 --from '262.5 GHz' --to '262.5 GHz' --count 1 "
                      "--thickness '3 mm' --source-distance '0.25 mm' --image-range '4 mm' --json '" + pred.string() +
                      "'") == 0);
  REQUIRE(shell(bin + " run '" + scene + "' -o '" + run.string() + "' --quiet") == 0);
  REQUIRE(shell(bin + " measure focus '" + run.string() + "' --map image --axis y --face '1 mm'") == 0);
  const auto f = read_json((run / "focus.json").string());
  const auto img = read_json(pred.string())["rows"][0]["image"];
  const double at = f["distance-from-face"].get<double>(), across = f["fwhm-across-axis"].get<double>();
  const double p_at = img["focus"].get<double>(), p_across = img["fwhm-across"].get<double>();
  MESSAGE("focus " << at * 1e3 << " mm behind the plate, FWHM " << across * 1e6 << " um; transfer matrix " << p_at * 1e3
                   << " mm, " << p_across * 1e6 << " um; paraxial " << img["paraxial"].get<double>() * 1e3 << " mm");
  CHECK(p_at > 0.5e-3);  // a real image behind the plate, not the face
  CHECK(std::abs(f["peak-position"][0].get<double>()) < 25e-6);  // on the axis
  CHECK(std::abs(at / p_at - 1) < 0.05);
  CHECK(std::abs(across / p_across - 1) < 0.05);
  fs::remove_all(run);
  fs::remove(pred);
}

// The convergence of the focal distance with the cell (long: the 12.5 um run alone takes
// about half an hour on 2 idle cores; skipped by default):
//   ./build/terayee_studies -tc="slab-lens convergence*" --no-skip
// The face and the source sit on nodes at every size here (they divide 0.25 mm), so the
// runs differ by the grid's error alone; the order comes from three sizes in the ratio
// 1 : 0.8 : 0.5.
TEST_CASE("slab-lens convergence: focal distance at 25, 20 and 12.5 um cells" * doctest::skip()) {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/slab-lens/slab-lens.yaml";
  const std::string bin = TERAYEE_BINARY;
  const fs::path pred = fs::temp_directory_path() / "terayee-test-slab-lens-conv.json";
  REQUIRE(shell(bin + " medium '" + scene + "' --medium mnf2 --from '262.5 GHz' --to '262.5 GHz' --count 1 "
                      "--thickness '3 mm' --source-distance '0.25 mm' --image-range '4 mm' --json '" + pred.string() +
                      "'") == 0);
  const double p_at = read_json(pred.string())["rows"][0]["image"]["focus"].get<double>();
  std::vector<double> h, err;
  for (double cell : {25.0, 20.0, 12.5}) {
    const fs::path run = fs::temp_directory_path() / ("terayee-test-slab-lens-" + std::to_string(int(cell * 10)));
    fs::remove_all(run);
    REQUIRE(shell(bin + " run '" + scene + "' -o '" + run.string() + "' --quiet --set 'grid.cell=" +
                  std::to_string(cell) + " um'") == 0);
    REQUIRE(shell(bin + " measure focus '" + run.string() + "' --map image --axis y --face '1 mm'") == 0);
    const double at = read_json((run / "focus.json").string())["distance-from-face"].get<double>();
    h.push_back(cell);
    err.push_back(at / p_at - 1);
    MESSAGE(std::to_string(cell) << " um: focus " << at * 1e3 << " mm behind the plate, prediction " << p_at * 1e3 << " mm, error "
                 << 100 * err.back() << "%");
    fs::remove_all(run);
  }
  // The observed order from the three runs themselves, not from their distance to the
  // prediction (whose model differs from the scene by more than the grid's error):
  // f = f0 + C h^p through the three points (Roache, Verification and Validation in
  // Computational Science and Engineering, 1998, ch. 5; cells in any ratio: Celik et al.,
  // J. Fluids Eng. 130, 078001 (2008)). Measured: 0.9983, 1.0146, 1.0324 mm at 25, 20,
  // 12.5 um: p = 1.96, f0 = 1.044 mm +- 0.015 (GCI), 2.6% beyond the prediction. A first-order part
  // (issue 12) would show as p near 1.
  std::vector<double> f;
  for (double e : err) f.push_back(p_at * (1 + e));
  const auto x = ty::richardson_cells(h, f);
  REQUIRE(x);
  MESSAGE("observed order " << x->order << (x->order_observed ? "" : " (assumed)") << ", extrapolated focus "
                            << x->value * 1e3 << " mm +- " << x->error * 1e3 << " mm (GCI), prediction "
                            << p_at * 1e3 << " mm");
  CHECK(x->order_observed);
  CHECK(x->order > 1.5);  // second order: no first-order part left
  CHECK(x->order < 2.5);
  CHECK(std::abs(x->value / p_at - 1) < 0.05);
  for (double e : err) CHECK(std::abs(e) < 0.05);  // issue 12's target, at 25 um and finer
  fs::remove(pred);
}

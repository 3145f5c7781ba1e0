/// \file test_shift_reversal.cpp
/// \brief The shift-reversal study (scenarios/shift-reversal): a Gaussian beam reflected at
/// 45 deg off c-cut MnF2 biased with +1 T and -1 T along its easy axis, just above the upper
/// line. A bias along the easy axis makes the permeability gyrotropic (mu_xy != 0), so the
/// reflection's phase depends on the sign of the tangential wavevector, r(k_x, B0) =
/// r(-k_x, -B0) but r(k_x, B0) != r(k_x, -B0) (shared/references.md, the magnetic
/// half-space), and the lateral (Goos-Haenchen) shift, -dphi/dk_t (Artmann, Ann. Phys. 437,
/// 87 (1948)), changes with the bias. The prediction sums the beam's angular spectrum through
/// the same crystal's transfer matrix, seen on the same line as the measurement
/// (materials/angular_spectrum.h). Checked: the non-reciprocal part (the difference of the
/// two runs' shifts) has the predicted sign and size within 20%; with no bias the beam and
/// its mirror image (incidence -45 deg) are shifted alike, within the measurement's stated
/// uncertainty (reciprocity: D(-theta) = -D(theta) along t).
#include <doctest/doctest.h>

#include <filesystem>

#include "tests/helpers.h"

namespace fs = std::filesystem;
using ty::test::read_json;
using ty::test::shell;

namespace {

const std::string kScene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/shift-reversal/shift-reversal.yaml";
const std::string kBin = TERAYEE_BINARY;
const fs::path kTmp = fs::temp_directory_path();

void run(const std::string& name, const std::string& sets, bool reference = false) {
  fs::remove_all(kTmp / name);
  REQUIRE(shell(kBin + " run '" + kScene + "' -o '" + (kTmp / name).string() + "' --quiet" +
                (reference ? " --reference" : "") + sets) == 0);
}

double predicted(const std::string& sets) {  // the beam's shift on the line y = -0.4 mm, 0.9 mm before the crystal
  const fs::path p = kTmp / "terayee-test-shift-prediction.json";
  REQUIRE(shell(kBin + " medium '" + kScene + "' --medium mnf2 --from '290.7 GHz' --to '290.7 GHz' --count 1 "
                       "--angle '45 deg' --waist '2.5 mm' --line-distance '0.9 mm' --json '" + p.string() + "'" + sets) ==
          0);
  const double d = read_json(p.string())["rows"][0]["beam-shift-plus"].get<double>();
  fs::remove(p);
  return d;
}

const std::string kShift = " --map cut --line 'y=-0.4 mm' --interface '0.5 mm'";

}  // namespace

TEST_CASE("shift-reversal study: the shift's non-reciprocal part has the predicted sign and size") {
  const std::string minus = " --set 'bias=[0, 0, -1 T]'";
  run("terayee-test-shift-plus", "");
  run("terayee-test-shift-minus", minus);
  run("terayee-test-shift-ref", "", true);
  const fs::path plus = kTmp / "terayee-test-shift-plus";
  REQUIRE(shell(kBin + " measure shift '" + plus.string() + "' --reference '" + (kTmp / "terayee-test-shift-ref").string() +
                "'" + kShift + " --angle '45 deg' --reversed '" + (kTmp / "terayee-test-shift-minus").string() +
                "' --reversed-reference '" + (kTmp / "terayee-test-shift-ref").string() + "'") == 0);
  const auto j = read_json((plus / "shift.json").string());
  const double measured = j["non-reciprocal"].get<double>();
  const double dp = predicted(""), dm = predicted(minus);
  MESSAGE("shift at +1 T " << j["run"]["shift"].get<double>() * 1e6 << " um (predicted " << dp * 1e6 << "), at -1 T "
                           << j["reversed"]["shift"].get<double>() * 1e6 << " um (predicted " << dm * 1e6
                           << "); non-reciprocal part " << measured * 1e6 << " um, predicted " << (dp - dm) * 1e6);
  CHECK((dp - dm) > 50e-6);  // a tenth of a wavelength: the effect is really there
  CHECK(std::abs(measured / (dp - dm) - 1) < 0.20);
  for (const char* n : {"terayee-test-shift-plus", "terayee-test-shift-minus", "terayee-test-shift-ref"})
    fs::remove_all(kTmp / n);
}

TEST_CASE("shift-reversal study: with no bias a beam and its mirror image are shifted alike") {
  const std::string zero = " --set 'bias=[0, 0, 0]' --set 'time.stop=1.5 ns'", mirror = " --set 'sources.0.beam.angle=45 deg'";
  run("terayee-test-shift-a", zero);
  run("terayee-test-shift-b", zero + mirror);
  run("terayee-test-shift-ra", zero, true);
  run("terayee-test-shift-rb", zero + mirror, true);
  auto measure = [&](const char* r, const char* ref, const char* angle) {
    REQUIRE(shell(kBin + " measure shift '" + (kTmp / r).string() + "' --reference '" + (kTmp / ref).string() + "'" +
                  kShift + " --angle '" + angle + "'") == 0);
    return read_json((kTmp / r / "shift.json").string())["run"];
  };
  const auto a = measure("terayee-test-shift-a", "terayee-test-shift-ra", "45 deg");
  const auto b = measure("terayee-test-shift-b", "terayee-test-shift-rb", "-45 deg");
  const double da = a["shift"].get<double>(), db = b["shift"].get<double>();
  const double u = std::hypot(a["uncertainty"].get<double>(), b["uncertainty"].get<double>());
  MESSAGE("no bias: shift at +45 deg " << da * 1e6 << " um, at -45 deg " << db * 1e6 << " um along t, +- " << u * 1e6
                                       << " um; predicted " << predicted(zero) * 1e6 << " um");
  CHECK(std::abs(da + db) < u);
  CHECK(std::abs(da - predicted(zero)) < a["uncertainty"].get<double>());
  for (const char* n : {"terayee-test-shift-a", "terayee-test-shift-b", "terayee-test-shift-ra", "terayee-test-shift-rb"})
    fs::remove_all(kTmp / n);
}

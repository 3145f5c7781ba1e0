/// \file test_domain_shift.cpp
/// \brief Two antiferromagnetic domains of one weak ferromagnet give mirror-image beam shifts
/// (tests/data/domain-shift.yaml: an invented crystal whose weak moment D x L, 0.16 T along z,
/// makes the permeability gyrotropic with no bias). The reversed domain (`order: reversed`:
/// opposite Neel vector and weak moment) is the time-reversed state, mu(-M) = mu(M)^T
/// (Onsager's relations; Gurevich & Melkov, Magnetization Oscillations and Waves, ch. 1), so
/// r(k_x, M) = r(-k_x, -M): a beam at -45 deg off the reversed domain is the mirror image of a
/// beam at +45 deg off the first, and its lateral (Goos-Haenchen) shift along t = z x n, -dphi/dk_t
/// (Artmann, Ann. Phys. 437, 87 (1948)), is minus the first's. Each domain alone is not
/// reciprocal: its shifts at +45 and -45 deg differ by the non-reciprocal part, so a domain
/// that failed to turn over would be caught. Each measured shift (`measure shift` against the
/// reference run without the crystal, on the cut 0.9 mm before the face) is held against
/// `medium --body` for that domain's state (the beam's angular spectrum through the 4x4
/// transfer matrix, materials/layered/angular_spectrum.h), as the shift-reversal study does.
#include <doctest/doctest.h>

#include <filesystem>

#include "tests/helpers.h"

namespace fs = std::filesystem;
using ty::test::read_json;
using ty::test::shell;

namespace {

const std::string kScene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/domain-shift.yaml";
const std::string kBin = TERAYEE_BINARY;
const fs::path kTmp = fs::temp_directory_path();
const std::string kReversed = " --set bodies.0.order=reversed", kMirror = " --set 'sources.0.beam.angle=45 deg'";

void run(const std::string& name, const std::string& sets, bool reference = false) {
  fs::remove_all(kTmp / name);
  REQUIRE(shell(kBin + " run '" + kScene + "' -o '" + (kTmp / name).string() + "' --quiet" +
                (reference ? " --reference" : "") + sets) == 0);
}

/// `medium --body 1`'s beam shifts at +45 and -45 deg on the cut (as measure shift sees them).
std::pair<double, double> predicted(const std::string& sets) {
  const fs::path p = kTmp / "terayee-test-domain-prediction.json";
  REQUIRE(shell(kBin + " medium '" + kScene + "' --body 1 --from '263.25 GHz' --to '263.25 GHz' --count 1 " +
                "--angle '45 deg' --waist '2.5 mm' --line-distance '0.9 mm' --json '" + p.string() + "'" + sets) == 0);
  const auto row = read_json(p.string())["rows"][0];
  fs::remove(p);
  return {row["beam-shift-plus"].get<double>(), row["beam-shift-minus"].get<double>()};
}

struct Shift {
  double d = 0, u = 0;  // m along t = z x n, and the measurement's uncertainty
};

Shift measure(const std::string& r, const std::string& ref, const char* angle) {
  REQUIRE(shell(kBin + " measure shift '" + (kTmp / r).string() + "' --reference '" + (kTmp / ref).string() +
                "' --map cut --line 'y=-0.4 mm' --interface '0.5 mm' --angle '" + angle + "'") == 0);
  const auto j = read_json((kTmp / r / "shift.json").string())["run"];
  return {j["shift"].get<double>(), j["uncertainty"].get<double>()};
}

/// Domain 1 at +45 deg and the reversed domain at -45 deg (with their reference runs): both
/// shifts, against each other and the predictions. `cell`: the grid's cell (m).
void mirror_domains(const std::string& sets, double cell) {
  run("terayee-test-domain-a", sets);
  run("terayee-test-domain-b", sets + kReversed + kMirror);
  run("terayee-test-domain-ra", sets, true);
  run("terayee-test-domain-rb", sets + kMirror, true);
  const Shift a = measure("terayee-test-domain-a", "terayee-test-domain-ra", "45 deg");
  const Shift b = measure("terayee-test-domain-b", "terayee-test-domain-rb", "-45 deg");
  const auto [pa, pa_minus] = predicted(sets);             // domain 1 at +45 and at -45 deg
  const auto [pb_plus, pb] = predicted(sets + kReversed);  // the reversed domain at -45 deg
  MESSAGE("domain 1 at +45 deg: " << a.d * 1e6 << " +- " << a.u * 1e6 << " um (predicted " << pa * 1e6
                                  << "); reversed domain at -45 deg: " << b.d * 1e6 << " +- " << b.u * 1e6
                                  << " um (predicted " << pb * 1e6 << "); domain 1 at -45 deg, predicted "
                                  << pa_minus * 1e6 << " um");
  // The two runs share the grid and the face, so the measurement's uncertainty (the face's
  // half-cell ambiguity) is common to both and cancels in their sum; what is left is the grid's
  // own asymmetry (tests/solver/test_domains.cpp: 4.5e-6 of the peak field). A tenth of a cell
  // allowed for it; the domain's non-reciprocal part, which a domain that did not turn over would
  // add (it would shift by pa_minus, not -pa), is ten times that.
  const double mirror = 0.1 * cell;
  CHECK(pb == doctest::Approx(-pa).epsilon(1e-6).scale(0));  // the prediction itself: mirror images (m: relative)
  CHECK(std::abs(pa + pa_minus) > 10 * mirror);
  CHECK(a.d * b.d < 0);  // opposite signs
  CHECK(std::abs(a.d + b.d) < mirror);  // equal sizes
  // each as predicted for its domain's state: the cell's dispersion and the face's staircase
  // (a half cell, which moves the beam by a cell at 45 deg); measured 5.0% at 50 um cells
  // (0.5% at 25 um, the long case), so twice that
  CHECK(std::abs(a.d / pa - 1) < 0.1);
  CHECK(std::abs(b.d / pb - 1) < 0.1);
  for (const char* n : {"terayee-test-domain-a", "terayee-test-domain-b", "terayee-test-domain-ra", "terayee-test-domain-rb"})
    fs::remove_all(kTmp / n);
}

}  // namespace

// The scene as it is: 25 um cells, damping 1e-4, 4 ns (four ring-downs of the line); 4.5 min
// of CPU (measured: -49.25 and +49.25 um against -49.52 predicted), so skipped by default:
//   ./build/terayee_studies -tc="domain shift (long)*" --no-skip
TEST_CASE("domain shift (long): two weak-ferromagnet domains give mirror-image beam shifts, as predicted" *
          doctest::skip()) {
  mirror_domains("", 25e-6);
}

TEST_CASE("domain shift: two weak-ferromagnet domains give mirror-image beam shifts (coarse, short)") {
  // 50 um cells (22 per vacuum wavelength), damping 3e-4 so that 1.5 ns holds four ring-downs;
  // 17 s of CPU (measured: -56.39 and +56.39 um against -59.34 predicted)
  mirror_domains(" --set grid.cell=50um --set time.stop=1.5ns --set media.wf.magnet.sublattices.0.damping=3e-4"
                 " --set media.wf.magnet.sublattices.1.damping=3e-4",
                 50e-6);
}

/// \file test_measure_polarization.cpp
/// \brief `terayee measure polarization` on a full run against the 4x4 transfer matrix:
/// tests/data/faraday-slab.yaml, a 200 um MnF2 plate biased with 0.3 T along x, the direction
/// the plane wave travels (the Faraday geometry: the sublattices' precession couples the Ez and
/// Hz waves). Each column of J comes from a run driven by that polarization (--set
/// sources.0.plane.polarization=Hz) against its reference run; the prediction is the transfer
/// matrix's J of the same crystal's linear response (io/analysis/spectroscopy/jones_prediction.h,
/// itself checked against the circular eigenwaves' closed form in test_jones.cpp). The same
/// bench with a dielectric plate (eps 5.5, no magnet) must give a diagonal J and no rotation
/// (an isotropic plate at normal incidence: Born & Wolf sec. 7.6). `medium --polarization` on the
/// same scene must give the rotation measured. Bad arguments: exit status 2.
#include <doctest/doctest.h>

#include <cmath>
#include <complex>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>

#include "tests/helpers.h"

namespace fs = std::filesystem;
using ty::test::shell;
using cd = std::complex<double>;

namespace {

const std::string kScene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/faraday-slab.yaml";

std::string run(const std::string& out, const std::string& args) {
  const std::string dir = (fs::temp_directory_path() / ("terayee-test-faraday-" + out)).string();
  REQUIRE(shell(std::string(TERAYEE_BINARY) + " run '" + kScene + "' -o '" + dir + "' --quiet --overwrite " + args) ==
          0);
  return dir;
}

nlohmann::json measure(const std::string& runs, const std::string& refs, const std::string& args,
                       const std::string& band = "--from 230GHz --to 300GHz --count 71") {
  const std::string json = (fs::temp_directory_path() / "terayee-test-faraday.json").string();
  fs::remove(json);
  REQUIRE(shell(std::string(TERAYEE_BINARY) + " measure polarization " + runs + " --reference " + refs + " " + band +
                " --json '" + json + "' " + args + " > /dev/null") == 0);
  std::ifstream in(json);
  return nlohmann::json::parse(in);
}

std::vector<cd> element(const nlohmann::json& j, const char* e) {
  std::vector<cd> v;
  for (size_t k = 0; k < j["jones"][e]["real"].size(); ++k)
    v.emplace_back(j["jones"][e]["real"][k], j["jones"][e]["imag"][k]);
  return v;
}

/// The largest |measured - predicted| of an element, and of the rotation and ellipticity (deg).
struct Errors {
  double J = 0, theta = 0, eta = 0, largest_theta = 0;
};
Errors compare(const nlohmann::json& j, const char* what) {
  Errors e;
  for (const char* el : {"zz", "uz", "zu", "uu"}) {
    const auto m = element(j, el), p = element(j["predicted"], el);
    for (size_t k = 0; k < m.size(); ++k) e.J = std::max(e.J, std::abs(m[k] - p[k]));
  }
  for (const char* in : {"Ez-input", "Hz-input"}) {
    const auto &m = j[what][in], &p = j["predicted"][what][in];
    for (size_t k = 0; k < m["rotation-deg"].size(); ++k) {
      e.theta = std::max(e.theta, std::abs(m["rotation-deg"][k].get<double>() - p["rotation-deg"][k].get<double>()));
      e.eta = std::max(e.eta, std::abs(m["ellipticity-deg"][k].get<double>() - p["ellipticity-deg"][k].get<double>()));
      e.largest_theta = std::max(e.largest_theta, std::abs(p["rotation-deg"][k].get<double>()));
    }
  }
  return e;
}

}  // namespace

TEST_CASE("measure polarization: Faraday and Kerr rotation of a biased MnF2 plate against the transfer matrix") {
  const std::string hz = "--set sources.0.plane.polarization=Hz";
  const std::string ez_run = run("ez", ""), ez_ref = run("ez-ref", "--reference");
  const std::string hz_run = run("hz", hz), hz_ref = run("hz-ref", "--reference " + hz);
  const std::string runs = "'" + ez_run + "' '" + hz_run + "'", refs = "'" + ez_ref + "' '" + hz_ref + "'";

  const std::string png = (fs::temp_directory_path() / "terayee-test-faraday.png").string();
  fs::remove(png);
  const auto t = measure(runs, refs, "--probe behind --plot '" + png + "'");
  CHECK(fs::file_size(png) > 10000);  // the overlay of measured and predicted rotation and ellipticity
  REQUIRE(t.contains("predicted"));
  const Errors et = compare(t, "faraday");
  MESSAGE("transmitted, 230-300 GHz: |J - J_tm| <= " << et.J << ", rotation within " << et.theta
                                                     << " deg, ellipticity within " << et.eta
                                                     << " deg (largest rotation " << et.largest_theta << " deg)");
  CHECK(et.largest_theta > 5);  // the bias does rotate: a missing coupling would fail the comparison
  CHECK(et.J < 0.01);           // measured 0.0033
  CHECK(et.theta < 0.2);        // measured 0.049 deg
  CHECK(et.eta < 0.2);          // measured 0.052 deg

  // the same from the power-spectrum line behind the plate (its own 15 frequencies)
  const auto tl = measure(runs, refs, "--line transmitted", "");
  REQUIRE(tl["frequency"].size() == 15);
  const Errors el = compare(tl, "faraday");
  MESSAGE("line: |J - J_tm| <= " << el.J << ", rotation within " << el.theta << " deg, ellipticity within " << el.eta);
  CHECK(el.J < 0.01);
  CHECK(el.theta < 0.2);
  CHECK(el.eta < 0.2);

  // `medium --polarization` gives the same transfer-matrix rotation (the plate: 200 um along x)
  const std::string mj = (fs::temp_directory_path() / "terayee-test-faraday-medium.json").string();
  REQUIRE(shell(std::string(TERAYEE_BINARY) + " medium '" + kScene +
                "' --medium mnf2 --from 230GHz --to 300GHz "
                "--count 71 --normal x --thickness 200um --polarization --json '" +
                mj + "' > /dev/null") == 0);
  std::ifstream min(mj);
  const auto medium = nlohmann::json::parse(min);
  double worst_medium = 0;
  for (size_t k = 0; k < 71; ++k)
    worst_medium = std::max(
        worst_medium, std::abs(medium["rows"][k]["polarization"]["faraday"]["Ez-input"]["rotation-deg"].get<double>() -
                               t["faraday"]["Ez-input"]["rotation-deg"][k].get<double>()));
  MESSAGE("medium --polarization against the measured Faraday rotation: within " << worst_medium << " deg");
  CHECK(worst_medium < 0.2);

  const auto r = measure(runs, refs, "--probe before --reflected");
  REQUIRE(r.contains("predicted"));
  CHECK(r["referred-to"] == "the sample's front face");
  const Errors er = compare(r, "kerr");
  MESSAGE("reflected: |J - J_tm| <= " << er.J << ", Kerr rotation within " << er.theta << " deg, ellipticity within "
                                      << er.eta << " deg (largest " << er.largest_theta << " deg)");
  CHECK(er.J < 0.01);     // measured 0.0029
  CHECK(er.theta < 0.6);  // measured 0.23 deg, near the lines where |r| is small
  CHECK(er.eta < 0.6);    // measured 0.15 deg
  CHECK(er.largest_theta > 1);

  // the same bench with a dielectric plate: J diagonal, no rotation
  const std::string glass = "--set bodies.0.medium=glass";
  const std::string g_ez = run("glass-ez", glass), g_hz = run("glass-hz", glass + " " + hz);
  const auto g = measure("'" + g_ez + "' '" + g_hz + "'", refs, "--probe behind");
  double cross = 0, rot = 0, diag = 0;
  const auto zz = element(g, "zz"), uu = element(g, "uu"), uz = element(g, "uz"), zu = element(g, "zu");
  for (size_t k = 0; k < zz.size(); ++k) {
    cross = std::max({cross, std::abs(uz[k]), std::abs(zu[k])});
    diag = std::max(diag, std::abs(zz[k] - uu[k]));
    for (const char* in : {"Ez-input", "Hz-input"})
      rot = std::max(rot, std::abs(g["faraday"][in]["rotation-deg"][k].get<double>()));
  }
  MESSAGE("dielectric plate: |J_uz|, |J_zu| <= " << cross << ", |J_zz - J_uu| <= " << diag << ", rotation <= " << rot
                                                 << " deg");
  CHECK(cross < 1e-6);  // measured 0: no magnet, nothing couples the two waves
  CHECK(rot < 1e-4);
  CHECK(diag < 1e-6);  // measured 1.4e-11: at normal incidence both waves see the same 1D scheme

  // An EO detector (eo_detector.h) on sample and reference alike cancels in t = S/R (a fact of
  // ratio measurements), though it reshapes each trace.
  auto material = [&](const std::string& extra, const std::string& name) {
    const std::string json = (fs::temp_directory_path() / ("terayee-test-faraday-" + name + ".json")).string();
    REQUIRE(shell(std::string(TERAYEE_BINARY) + " measure material '" + g_ez + "' --reference '" + ez_ref +
                  "' --probe behind --thickness 200um --window all --from 230GHz --to 300GHz --json '" + json + "' " +
                  extra + " > /dev/null") == 0);
    std::ifstream in(json);
    return nlohmann::json::parse(in);
  };
  const std::string traces = (fs::temp_directory_path() / "terayee-test-faraday-traces.csv").string();
  const auto plain = material("", "plain"),
             eo = material("--detector ZnTe --detector-thickness 1mm --traces '" + traces + "'", "eo");
  double dt = 0;
  for (size_t k = 0; k < plain["t"]["real"].size(); ++k)
    dt = std::max(
        dt, std::abs(cd(plain["t"]["real"][k], plain["t"]["imag"][k]) - cd(eo["t"]["real"][k], eo["t"]["imag"][k])));
  MESSAGE("t with a 1 mm ZnTe detector against t without: within " << dt);
  CHECK(dt < 1e-4);
  CHECK(eo["detector"]["crystal"] == "ZnTe");
  CHECK(fs::file_size(traces) > 1000);
  const std::string mat = std::string(TERAYEE_BINARY) + " measure material '" + g_ez + "' --reference '" + ez_ref +
                          "' --probe behind --thickness 200um ";
  CHECK(shell(mat + "--detector quartz --detector-thickness 1mm") == 2);
  CHECK(shell(mat + "--detector ZnTe") == 2);
  CHECK(shell(mat + "--detector ZnTe --detector-thickness 0mm") == 2);
}

TEST_CASE("measure polarization: bad arguments are refused with exit status 2") {
  const std::string bin = std::string(TERAYEE_BINARY) + " measure polarization ";
  const std::string ez_run = run("bad-ez", ""), ez_ref = run("bad-ez-ref", "--reference");
  const std::string one = "'" + ez_run + "' --reference '" + ez_ref + "'";
  CHECK(shell(bin + one + " --probe behind > /dev/null") == 0);  // one column alone is measured
  CHECK(shell(bin + one + " --probe nowhere") == 2);
  CHECK(shell(bin + "'" + ez_run + "' '" + ez_run + "' --reference '" + ez_ref + "' --probe behind") == 2);
  CHECK(shell(bin + "'" + ez_run + "' '" + ez_run + "' --reference '" + ez_ref + "' '" + ez_ref + "' --probe behind") ==
        2);
  CHECK(shell(bin + one + " --probe behind --from 300GHz") == 2);
  CHECK(shell(bin + one + " --probe behind --from 300GHz --to 200GHz") == 2);
  CHECK(shell(bin + one + " --probe behind --count 1") == 2);
  CHECK(shell(bin + one) == 2);  // neither probe nor line
  CHECK(shell(bin + one + " --probe behind --line transmitted") == 2);
  CHECK(shell(bin + one + " --line transmitted --from 230GHz --to 300GHz") == 2);
  CHECK(shell(bin + one + " --line nowhere") == 2);
  CHECK(shell(bin + one + " --probe behind --plot /tmp/x.png --csv /tmp/x.csv") == 2);  // the plot's own data file
}

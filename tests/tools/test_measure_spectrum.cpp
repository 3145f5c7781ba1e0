/// \file test_measure_spectrum.cpp
/// \brief `terayee measure spectrum` on a lossless dielectric slab against the Airy formula
/// t = 1 / [cos(n k0 d) - (i/2)(n + 1/n) sin(n k0 d)] (Born & Wolf, Principles of Optics,
/// sec. 7.6): T within 1% where the slab is resolved by at least 20 cells per wavelength,
/// and R + T = 1 within 0.5%. The reference run is the same scene with --reference.
/// Measured: at 5 um cells (25 cells per wavelength in the slab at 1 THz) the worst T error
/// is 1.07%, the grid's phase error moving the fringes; the test scene uses 2.5 um.
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <array>
#include <complex>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "tests/helpers.h"

namespace fs = std::filesystem;

namespace {

using ty::test::shell;

namespace {
/// The scene, its reference run, and `measure spectrum` over the two (sets: extra --set options).
void run_with_reference(const std::string& scene, const fs::path& run, const fs::path& ref,
                        const std::string& sets = "") {
  fs::remove_all(run);
  fs::remove_all(ref);
  const std::string bin = TERAYEE_BINARY;
  REQUIRE(shell(bin + " run '" + scene + "' -o '" + run.string() + "' --quiet" + sets) == 0);
  REQUIRE(shell(bin + " run '" + scene + "' -o '" + ref.string() + "' --reference --quiet" + sets) == 0);
  REQUIRE(shell(bin + " measure spectrum '" + run.string() + "' --reference '" + ref.string() + "' > /dev/null") == 0);
}
}  // namespace

}  // namespace

TEST_CASE("measure spectrum: a dielectric slab's T and R follow the Airy formula") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/slab-airy.yaml";
  const fs::path run = fs::temp_directory_path() / "terayee-test-slab", ref = fs::temp_directory_path() / "terayee-test-slab-ref";
  const std::string bin = TERAYEE_BINARY;
  run_with_reference(scene, run, ref);
  std::ifstream csv(run / "spectrum.csv");
  std::string line;
  std::getline(csv, line);
  CHECK(line == "frequency_Hz,reflectance,transmittance,absorptance");
  const double n = std::sqrt(5.5), d = 100e-6, c = 299792458.0, cell = 2.5e-6;
  double worst_t = 0, worst_sum = 0;
  int rows = 0;
  while (std::getline(csv, line)) {
    std::istringstream ss(line);
    double f, R, T, A;
    char comma;
    ss >> f >> comma >> R >> comma >> T >> comma >> A;
    const double k0 = 2 * ty::constants::pi * f / c;
    const std::complex<double> I(0, 1);
    const std::complex<double> t = 1.0 / (std::cos(n * k0 * d) - 0.5 * I * (n + 1 / n) * std::sin(n * k0 * d));
    if (c / (f * n) / cell >= 20) worst_t = std::max(worst_t, std::abs(T / std::norm(t) - 1));
    worst_sum = std::max(worst_sum, std::abs(R + T - 1));
    ++rows;
  }
  MESSAGE("slab: worst |T/T_Airy - 1| " << worst_t << ", worst |R + T - 1| " << worst_sum << " over " << rows
                                        << " frequencies");
  CHECK(rows == 81);
  CHECK(worst_t < 0.01);
  CHECK(worst_sum < 0.005);
  // The complex t and r (spectrum-complex.csv, exp(-i omega t)) against the Airy formula's:
  // t at its line is t_slab e^{-i k0 d}; r at the reflected line, L = 0.5 mm before the front
  // face, is r_slab e^{2 i k0 L}.
  std::ifstream cx(run / "spectrum-complex.csv");
  std::getline(cx, line);
  CHECK(line == "frequency_Hz,t_real,t_imag,t_amplitude,t_phase_rad,r_real,r_imag,r_amplitude,r_phase_rad");
  double worst_ct = 0, worst_cr = 0;
  while (std::getline(cx, line)) {
    std::vector<double> v;
    std::istringstream ss(line);
    for (std::string cell; std::getline(ss, cell, ',');) v.push_back(std::stod(cell));
    REQUIRE(v.size() == 9);
    const double k0 = 2 * ty::constants::pi * v[0] / c;
    const std::complex<double> I(0, 1), q = n * k0 * d;
    const std::complex<double> ts = 1.0 / (std::cos(q) - 0.5 * I * (n + 1 / n) * std::sin(q));
    const std::complex<double> rs = -0.5 * I * (1 / n - n) * std::sin(q) * ts;
    worst_ct = std::max(worst_ct, std::abs(std::complex<double>(v[1], v[2]) - ts * std::exp(-I * k0 * d)));
    worst_cr = std::max(worst_cr, std::abs(std::complex<double>(v[5], v[6]) - rs * std::exp(2.0 * I * k0 * 0.5e-3)));
  }
  MESSAGE("slab: worst |t - t_Airy| " << worst_ct << ", |r - r_Airy| " << worst_cr);
  CHECK(worst_ct < 0.01);
  CHECK(worst_cr < 0.01);
  fs::remove_all(run);
  fs::remove_all(ref);
}

TEST_CASE("measure spectrum: an MnF2 slab's R and T match medium's transfer matrix over its lines") {
  // MnF2 (references.md values, from memory there), 200 um, easy axis and a 0.3 T bias along z:
  // the lines sit at 253 and 270 GHz. The run's reflectance and transmittance from the power-spectrum
  // lines and a reference run, against `terayee medium --thickness` (the 4x4 transfer matrix
  // of the same crystal's linear response), within 0.02 over 240-285 GHz.
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/mnf2-slab.yaml";
  const fs::path run = fs::temp_directory_path() / "terayee-test-mnf2-slab",
                 ref = fs::temp_directory_path() / "terayee-test-mnf2-slab-ref",
                 csv = fs::temp_directory_path() / "terayee-test-mnf2-slab.csv";
  const std::string bin = TERAYEE_BINARY;
  run_with_reference(scene, run, ref);
  REQUIRE(shell(bin + " medium '" + scene +
                "' --medium mnf2 --from '240 GHz' --to '285 GHz' --count 91 --thickness "
                "'200 um' --normal x --csv '" +
                csv.string() + "'") == 0);
  auto rows = [](const fs::path& p) {
    std::ifstream in(p);
    std::string line;
    std::getline(in, line);
    std::vector<std::vector<std::string>> out;
    while (std::getline(in, line)) {
      std::vector<std::string> cells;
      std::stringstream ss(line);
      for (std::string c; std::getline(ss, c, ',');) cells.push_back(c);
      out.push_back(cells);
    }
    return out;
  };
  const auto sim = rows(run / "spectrum.csv"), tm = rows(csv);
  REQUIRE(sim.size() == 91);
  REQUIRE(tm.size() == 91);
  double worst_r = 0, worst_t = 0, swing = 0;
  for (size_t k = 0; k < sim.size(); ++k) {
    CHECK(std::stod(sim[k][0]) == doctest::Approx(std::stod(tm[k][0])));
    const double r = std::pow(std::stod(tm[k][13]), 2), t = std::stod(tm[k][18]);
    worst_r = std::max(worst_r, std::abs(std::stod(sim[k][1]) - r));
    worst_t = std::max(worst_t, std::abs(std::stod(sim[k][2]) - t));
    swing = std::max(swing, std::abs(t - std::stod(tm[0][18])));
  }
  MESSAGE("MnF2 slab: worst |R - R_matrix| " << worst_r << ", worst |T - T_matrix| " << worst_t
                                             << " over 240-285 GHz (T swings by " << swing << " across the lines)");
  CHECK(swing > 0.3);  // the band really holds the lines
  CHECK(worst_r < 0.02);
  CHECK(worst_t < 0.02);

  // the plot of both: measured R and T with the transfer matrix's beside them, the data file
  // holding the measured R as written by measure and the predicted R as |r|^2 of medium's table
  REQUIRE(shell(bin + " render '" + run.string() + "' --plot spectrum --predicted '" + csv.string() + "'") == 0);
  const fs::path plot = run / "pictures" / "spectrum.png";
  CHECK(fs::file_size(plot) > 5000);
  const auto data = rows(run / "pictures" / "spectrum.csv");
  size_t measured = 0, predicted = 0;
  for (const auto& d : data) {
    if (d[1] == "R measured") CHECK(std::stod(d[3]) == doctest::Approx(std::stod(sim[measured++][1])).epsilon(1e-8));
    if (d[1] == "R transfer matrix")
      CHECK(std::stod(d[3]) == doctest::Approx(std::pow(std::stod(tm[predicted++][13]), 2)).epsilon(1e-8));
  }
  CHECK(measured == 91);
  CHECK(predicted == 91);
  fs::remove_all(run);
  fs::remove_all(ref);
  fs::remove(csv);
}

namespace {

/// The Airy slab of the first case with extra --set options, its reference run, and the
/// exit status of `measure spectrum` over the two (its stderr in `err`).
int slab_spectrum(const std::string& sets, const fs::path& run, const fs::path& ref, std::string& err) {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/slab-airy.yaml", bin = TERAYEE_BINARY;
  fs::remove_all(run);
  fs::remove_all(ref);
  REQUIRE(shell(bin + " run '" + scene + "' -o '" + run.string() + "' --quiet" + sets) == 0);
  REQUIRE(shell(bin + " run '" + scene + "' -o '" + ref.string() + "' --reference --quiet" + sets) == 0);
  const fs::path e = run.string() + ".err";
  const int s = std::system((bin + " measure spectrum '" + run.string() + "' --reference '" + ref.string() +
                             "' > /dev/null 2> '" + e.string() + "'")
                                .c_str());
  std::ifstream in(e);
  std::stringstream ss;
  ss << in.rdbuf();
  err = ss.str();
  return WIFEXITED(s) ? WEXITSTATUS(s) : -1;
}

}  // namespace

TEST_CASE("measure spectrum: a reflected line behind the one-sided launch line gives the Airy R") {
  // The plane wave's launch line at x = 0.3 mm sends nothing backwards, so a reflected line at
  // 0.2 mm sees only the reflected wave; the reference run's power there is round-off (the
  // ratio to it once gave R = -1e10). R is then normalised to the incident power through the
  // transmitted line (the same plane wave in vacuum) and must follow Airy's R = 1 - |t|^2 of
  // the lossless slab (Born & Wolf sec. 7.6) as the in-front line does: within 1% where resolved.
  const fs::path run = fs::temp_directory_path() / "terayee-test-slab-behind",
                 ref = fs::temp_directory_path() / "terayee-test-slab-behind-ref";
  std::string err;
  REQUIRE(slab_spectrum(" --set outputs.0.power-spectrum.line.x=0.2mm", run, ref, err) == 0);
  std::ifstream js(run / "spectrum.json");
  const auto j = nlohmann::json::parse(js);
  CHECK(j["reflectance-incident-line"] == "transmitted");
  CHECK(j["transmittance-incident-line"] == "transmitted");
  const double n = std::sqrt(5.5), d = 100e-6, c = 299792458.0, cell = 2.5e-6;
  double worst = 0;
  int rows = 0;
  for (const auto& e : j["spectrum"]) {
    const double f = e["frequency"], R = e["reflectance"];
    const double k0 = 2 * ty::constants::pi * f / c;
    const std::complex<double> I(0, 1);
    const std::complex<double> t = 1.0 / (std::cos(n * k0 * d) - 0.5 * I * (n + 1 / n) * std::sin(n * k0 * d));
    if (c / (f * n) / cell >= 20) worst = std::max(worst, std::abs(R - (1 - std::norm(t))));
    ++rows;
  }
  MESSAGE("reflected line behind the source: worst |R - R_Airy| " << worst << " over " << rows << " frequencies");
  CHECK(rows == 81);
  CHECK(worst < 0.01);
  fs::remove_all(run);
  fs::remove_all(ref);
}

TEST_CASE("measure spectrum: refused where no line carries the incident power, or the band leaves the source's") {
  const fs::path run = fs::temp_directory_path() / "terayee-test-slab-refused",
                 ref = fs::temp_directory_path() / "terayee-test-slab-refused-ref";
  std::string err;
  // both lines behind the source: neither reference power is the incident wave's
  CHECK(slab_spectrum(" --set outputs.0.power-spectrum.line.x=0.2mm --set outputs.1.power-spectrum.line.x=0.1mm", run,
                      ref, err) == 2);
  MESSAGE(err);
  CHECK(err.find("is negligible") != std::string::npos);
  CHECK(err.find("no incident power to normalise to") != std::string::npos);
  // a band reaching 3 THz, where the 1 ps pulse about 0.6 THz radiates ~exp(-160) of its peak
  CHECK(slab_spectrum(" --set outputs.0.power-spectrum.band.to=3THz --set outputs.1.power-spectrum.band.to=3THz", run,
                      ref, err) == 2);
  MESSAGE(err);
  CHECK(err.find("narrow the line's band") != std::string::npos);
  fs::remove_all(run);
  fs::remove_all(ref);
  fs::remove(run.string() + ".err");
}

namespace {

/// spectrum.csv of a scene measured against its reference run, in double or single precision:
/// per row frequency, R, T, A.
std::vector<std::array<double, 4>> spectrum_in(const std::string& scene, const std::string& precision) {
  const fs::path run = fs::temp_directory_path() / ("terayee-test-precision-" + precision),
                 ref = fs::temp_directory_path() / ("terayee-test-precision-" + precision + "-ref");
  run_with_reference(scene, run, ref, " --set time.precision=" + precision);
  std::ifstream csv(run / "spectrum.csv");
  std::string line;
  std::getline(csv, line);
  std::vector<std::array<double, 4>> rows;
  while (std::getline(csv, line)) {
    std::array<double, 4> r{};
    char comma;
    std::istringstream ss(line);
    ss >> r[0] >> comma >> r[1] >> comma >> r[2] >> comma >> r[3];
    rows.push_back(r);
  }
  fs::remove_all(run);
  fs::remove_all(ref);
  return rows;
}

}  // namespace

TEST_CASE("measure spectrum in single precision: the Airy slab and the MnF2 slab as in double") {
  // The two scenes of the cases above (their double-precision spectra against the Airy formula
  // and the 4x4 transfer matrix there); in single precision the fields are floats, the
  // magnetic cells' state, the probes' sums and the spectra stay double. So single differs
  // from double by rounding alone (measured: 9.3e-7 in R and 7.6e-7 in T for the slab,
  // 2.4e-7 and 2.8e-7 for MnF2); the bound is 1e-5, a thousandth of either case's own
  // tolerance against its formula.
  for (const char* name : {"slab-airy.yaml", "mnf2-slab.yaml"}) {
    const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/" + name;
    const auto dbl = spectrum_in(scene, "double"), sgl = spectrum_in(scene, "single");
    REQUIRE(dbl.size() == sgl.size());
    REQUIRE(dbl.size() > 20);
    double worst_r = 0, worst_t = 0;
    for (size_t k = 0; k < dbl.size(); ++k) {
      CHECK(sgl[k][0] == dbl[k][0]);
      worst_r = std::max(worst_r, std::abs(sgl[k][1] - dbl[k][1]));
      worst_t = std::max(worst_t, std::abs(sgl[k][2] - dbl[k][2]));
    }
    MESSAGE(std::string(name) << ": single against double, worst |dR| " << worst_r << ", worst |dT| " << worst_t << " over "
                 << dbl.size() << " frequencies");
    CHECK(worst_r < 1e-5);
    CHECK(worst_t < 1e-5);
    CHECK(worst_r + worst_t > 0);  // the two runs really ran in different precisions
  }
}

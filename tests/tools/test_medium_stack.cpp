/// \file test_medium_stack.cpp
/// \brief `terayee medium SCENE --stack`: the stack the scene's plane wave meets, against
/// closed forms. A glass slab in vacuum at the Bloch k_x of 30 deg at 1 THz, both waves, and a
/// slab on a substrate met from above (-y), against the Airy sum of the Fresnel coefficients
/// (Born & Wolf, Principles of Optics, 7th ed., sec. 1.5.2 and 1.6.4 (eqs. 57-58 of 1.6)); the
/// Otto bench of scenarios/otto-atr (silicon prism, 30 um gap, FeF2) with the crystal turned to
/// vacuum: total internal reflection, R = 1 exactly (Born & Wolf sec. 1.5.4), and turned to
/// silicon: frustrated total internal reflection through the gap, the same Airy sum with an
/// imaginary cosine (Born & Wolf sec. 1.5.4 and 7.6 for the gap), R + T = 1; the FeF2 bench's
/// surface-mode dips at the frequencies the Otto study's test finds them, one sign of k_x
/// each; and scenes that are not stacks refused with exit status 2, naming each body.
#include <doctest/doctest.h>

#include <cmath>
#include <complex>
#include <filesystem>
#include <fstream>
#include <iterator>
#include <map>
#include <sstream>

#include "tests/helpers.h"
#include "tests/tools/capture.h"

namespace fs = std::filesystem;

namespace {

using cd = std::complex<double>;
constexpr double kC0 = 299792458.0;

/// A CSV as columns by header name.
std::map<std::string, std::vector<double>> read_csv(const std::string& file) {
  std::ifstream in(file);
  std::string line;
  std::getline(in, line);
  std::vector<std::string> head;
  for (std::stringstream ss(line); std::getline(ss, line, ',');) head.push_back(line);
  std::map<std::string, std::vector<double>> cols;
  while (std::getline(in, line)) {
    std::stringstream ss(line);
    for (const std::string& h : head) {
      std::string cell;
      std::getline(ss, cell, ',');
      cols[h].push_back(std::strtod(cell.c_str(), nullptr));
    }
  }
  return cols;
}

/// Fresnel's r and t of one face for the TE (Ez) or TM (Hz) wave, in terms of the normal
/// wavenumbers q = n cos(theta) (Born & Wolf 1.5.2, eqs. 20-21): TE r = (q1 - q2)/(q1 + q2);
/// TM, of the magnetic field: r = (q1/e1 - q2/e2)/(q1/e1 + q2/e2).
cd face_r(cd q1, cd q2, double e1, double e2, bool tm) {
  return tm ? (q1 / e1 - q2 / e2) / (q1 / e1 + q2 / e2) : (q1 - q2) / (q1 + q2);
}

/// R and T of a slab (e2, thickness d) between e1 and e3 at tangential index s = k_x c / w
/// (Born & Wolf 1.6.4: r = (r12 + r23 e^{2i beta}) / (1 + r12 r23 e^{2i beta}), beta = k0 q2 d;
/// T from the energy balance of a lossless stack is checked separately).
std::pair<double, double> airy(double e1, double e2, double e3, double d, double f, double s, bool tm) {
  const auto q = [&](double e) {
    cd v = std::sqrt(cd(e - s * s));
    return v.imag() < 0 ? -v : v;
  };
  const cd q1 = q(e1), q2 = q(e2), q3 = q(e3);
  const cd r12 = face_r(q1, q2, e1, e2, tm), r23 = face_r(q2, q3, e2, e3, tm);
  const cd ph = std::exp(cd(0, 2) * (2 * ty::constants::pi * f / kC0) * q2 * d);
  const cd r = (r12 + r23 * ph) / (1.0 + r12 * r23 * ph);
  // t of the field (E for TE, H for TM); the transmitted power over the incident one
  const cd t12 = tm ? 2.0 * q1 / e1 / (q1 / e1 + q2 / e2) : 2.0 * q1 / (q1 + q2);
  const cd t23 = tm ? 2.0 * q2 / e2 / (q2 / e2 + q3 / e3) : 2.0 * q2 / (q2 + q3);
  const cd t = t12 * t23 * std::sqrt(ph) / (1.0 + r12 * r23 * ph);
  const double flux = tm ? (q3 / e3).real() / (q1 / e1).real() : q3.real() / q1.real();
  return {std::norm(r), std::norm(t) * flux};
}

std::string write_scene(const std::string& name, const std::string& text) {
  const fs::path p = fs::temp_directory_path() / name;
  std::ofstream(p) << text;
  return p.string();
}

std::string medium_stack(const std::string& scene, const std::string& args, const std::string& csv) {
  return ty::test::capture(std::string(TERAYEE_BINARY) + " medium '" + scene + "' --stack " + args + " --csv '" + csv +
                           "' 2>&1");
}

const char* kSlab = R"(title: "glass slab"
grid: {extent: [10 um, 1 mm], cell: 5 um, boundaries: {x: bloch, y: absorbing}, bloch: {angle: 30 deg, at: 1 THz}, origin: corner}
time: {stop: 10 ps}
media:
  glass: {permittivity: 2.25}
  dense: {permittivity: 4}
bodies:
  - {medium: glass, rectangle: {centre: [5 um, 0.6 mm], size: [1 mm, 100 um]}}
sources:
  - plane: {polarization: POL, direction: +y, launch: {y: 0.2 mm}, frequency: 1 THz, amplitude: 1 V/m,
            waveform: {kind: pulse, fwhm: 1 ps, delay: 4 ps}}
)";

std::string replaced(std::string s, const std::string& what, const std::string& with) {
  for (size_t at = 0; (at = s.find(what, at)) != std::string::npos; at += with.size()) s.replace(at, what.size(), with);
  return s;
}

}  // namespace

TEST_CASE("medium --stack: a glass slab at an oblique Bloch k_x against the Airy formula, both waves") {
  const std::string csv = (fs::temp_directory_path() / "terayee-stack-slab.csv").string();
  const double kx = 2 * ty::constants::pi * 1e12 * 0.5 / kC0;  // 30 deg at 1 THz
  for (const char* pol : {"Ez", "Hz"}) {
    const std::string scene = write_scene("terayee-stack-slab.yaml", replaced(kSlab, "POL", pol));
    const std::string out = medium_stack(scene, "--from '0.6 THz' --to '1.4 THz' --count 9", csv);
    INFO(out);
    auto c = read_csv(csv);
    REQUIRE(c["frequency_Hz"].size() == 9);
    const bool tm = std::string(pol) == "Hz";
    double worst = 0;
    for (size_t k = 0; k < 9; ++k) {
      const double f = c["frequency_Hz"][k], s = kx * kC0 / (2 * ty::constants::pi * f);
      const auto [R, T] = airy(1, 2.25, 1, 100e-6, f, s, tm);
      worst = std::max({worst, std::abs(c["reflectance"][k] - R), std::abs(c["transmittance"][k] - T)});
      CHECK(c["reflectance"][k] + c["transmittance"][k] == doctest::Approx(1).epsilon(3e-8));  // lossless (8 digits each)
      CHECK(c[tm ? "R_Hz_Ez" : "R_Ez_Hz"][k] < 1e-20);  // isotropic: no cross-polarized reflection
    }
    MESSAGE(std::string(pol) << " wave: worst |R - R_Airy|, |T - T_Airy| = " << worst);
    CHECK(worst < 1e-7);
    CHECK(out.find("layer 1: glass, 100 um") != std::string::npos);
  }
  // met from above: vacuum, the glass slab, then eps = 4 below it down through the absorber
  std::string down = replaced(kSlab, "POL", "Hz");
  down = replaced(down, "direction: +y, launch: {y: 0.2 mm}", "direction: -y, launch: {y: 0.9 mm}");
  down = replaced(down, "bodies:\n", "bodies:\n  - {medium: dense, rectangle: {centre: [5 um, 0.275 mm], size: [1 mm, 0.55 mm]}}\n");
  const std::string scene = write_scene("terayee-stack-down.yaml", down);
  const std::string out = medium_stack(scene, "--from '0.6 THz' --to '1.4 THz' --count 5", csv);
  INFO(out);
  auto c = read_csv(csv);
  REQUIRE(c["frequency_Hz"].size() == 5);
  for (size_t k = 0; k < 5; ++k) {
    const double f = c["frequency_Hz"][k], s = kx * kC0 / (2 * ty::constants::pi * f);
    for (const bool tm : {false, true}) {
      const auto [R, T] = airy(1, 2.25, 4, 100e-6, f, s, tm);
      CHECK(c[tm ? "R_Hz_Hz" : "R_Ez_Ez"][k] == doctest::Approx(R).epsilon(1e-7));
      CHECK(c[tm ? "T_Hz" : "T_Ez"][k] == doctest::Approx(T).epsilon(1e-7));
    }
  }
  fs::remove(csv);
}

TEST_CASE("medium --stack: the Otto bench's total internal reflection, its frustration, and its surface-mode dips") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/otto-atr/otto-atr-fef2.yaml";
  const std::string csv = (fs::temp_directory_path() / "terayee-stack-otto.csv").string();
  const double kx = 40000, n = std::sqrt(11.7);
  // the crystal turned to vacuum: silicon / vacuum at k_x = 40000 rad/m > k0 (1.53-1.63 THz): R = 1
  std::string out = medium_stack(scene, "--set bodies.2.medium=gap --count 11", csv);
  INFO(out);
  auto c = read_csv(csv);
  REQUIRE(c["frequency_Hz"].size() == 11);
  for (size_t k = 0; k < 11; ++k) {
    CHECK(c["reflectance"][k] == doctest::Approx(1).epsilon(1e-12));
    CHECK(std::abs(c["transmittance"][k]) < 1e-12);
  }
  // turned to silicon: the 30 um gap between two silicon half-spaces (frustrated total reflection)
  out = medium_stack(scene, "--set bodies.2.medium=silicon --count 11", csv);
  c = read_csv(csv);
  REQUIRE(c["frequency_Hz"].size() == 11);
  for (size_t k = 0; k < 11; ++k) {
    const double f = c["frequency_Hz"][k], s = kx * kC0 / (2 * ty::constants::pi * f);
    const auto [R, T] = airy(11.7, 1, 11.7, 30e-6, f, s, false);
    CHECK(s > 1);
    CHECK(s < n);
    CHECK(c["reflectance"][k] == doctest::Approx(R).epsilon(3e-8));
    CHECK(c["transmittance"][k] == doctest::Approx(T).epsilon(3e-8));
    CHECK(c["reflectance"][k] + c["transmittance"][k] == doctest::Approx(1).epsilon(3e-8));
  }
  // the FeF2 bench itself: the dips the Otto study's test finds (4x4: 0.009 at 1548.0 GHz for +k_x,
  // 0.086 at 1611.0 GHz for -k_x; the other sign there 0.94, totally reflected but for the loss)
  double R[2][2];
  for (int q = 0; q < 2; ++q) {
    out = medium_stack(scene, std::string("--set grid.bloch.wavenumber=") + (q ? "-40000" : "40000") +
                                  " --from '1548 GHz' --to '1611 GHz' --count 127", csv);
    c = read_csv(csv);
    REQUIRE(c["frequency_Hz"].size() == 127);
    R[q][0] = c["reflectance"][0], R[q][1] = c["reflectance"][126];
  }
  MESSAGE("R(+k_x): " << R[0][0] << " at 1548 GHz, " << R[0][1] << " at 1611 GHz; R(-k_x): " << R[1][0] << ", "
                      << R[1][1]);
  // relative bounds (doctest's Approx epsilon is relative to max(1, |x|): 0.06 let R be 0 to 0.07)
  CHECK(std::abs(R[0][0] / 0.0092 - 1) < 0.03);
  CHECK(std::abs(R[1][1] / 0.086 - 1) < 0.03);
  CHECK(R[1][0] > 0.9);
  CHECK(R[0][1] > 0.9);
  fs::remove(csv);
}

TEST_CASE("medium --stack: the Otto bench met from above, mirrored, reflects as the bench met from below") {
  // The mirror y -> 600 um - y of the FeF2 bench: the prism above, the crystal below, the wave
  // along -y. A mirror through the xz plane keeps k_x and turns a pseudovector (M, the bias)
  // (Mx, My, Mz) -> (-Mx, My, -Mz) (Jackson, Classical Electrodynamics, 3rd ed., sec. 6.10), so
  // the mirrored bench with its bias reversed is the same physics: its R equals the bench's at
  // every frequency, the non-reciprocal dips included. With the bias kept it is the bench at
  // -k_x: its dip moves from 1548 to 1611 GHz (that case tells a wrong turn of the tensors).
  std::ifstream in(std::string(TERAYEE_SOURCE_DIR) + "/scenarios/otto-atr/otto-atr-fef2.yaml");
  const std::string bench((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  std::string down = replaced(bench, "centre: [5 um, 415 um]", "centre: [5 um, 185 um]");
  down = replaced(down, "centre: [5 um, 630 um]", "centre: [5 um, -30 um]");
  down = replaced(down, "direction: +y, launch: {y: 50 um}", "direction: -y, launch: {y: 550 um}");
  down = replaced(down, "line: {y: 200 um}", "line: {y: 400 um}");
  REQUIRE(down.find("bias: [0, 0, 1 T]") != std::string::npos);
  const std::string csv = (fs::temp_directory_path() / "terayee-stack-mirror.csv").string();
  const std::string band = "--from '1540 GHz' --to '1615 GHz' --count 151";
  const std::string up = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/otto-atr/otto-atr-fef2.yaml";
  std::string out = medium_stack(up, band, csv);
  const auto a = read_csv(csv);
  const std::string mirrored = write_scene("terayee-stack-mirror.yaml", replaced(down, "bias: [0, 0, 1 T]", "bias: [0, 0, -1 T]"));
  out = medium_stack(mirrored, band, csv);
  INFO(out);
  const auto b = read_csv(csv);
  const std::string kept = write_scene("terayee-stack-mirror-kept.yaml", down);
  out = medium_stack(kept, band, csv);
  const auto k = read_csv(csv);
  REQUIRE(a.at("reflectance").size() == 151);
  REQUIRE(b.at("reflectance").size() == 151);
  REQUIRE(k.at("reflectance").size() == 151);
  double worst = 0, apart = 0;
  for (size_t q = 0; q < 151; ++q) {
    worst = std::max(worst, std::abs(a.at("reflectance")[q] - b.at("reflectance")[q]));
    apart = std::max(apart, std::abs(a.at("reflectance")[q] - k.at("reflectance")[q]));
  }
  MESSAGE("mirrored, bias reversed: worst |dR| " << worst << "; bias kept: " << apart);
  CHECK(worst < 1e-9);
  CHECK(apart > 0.5);  // the surface mode's dip is at the other line
  fs::remove(csv);
}

TEST_CASE("medium --stack: a scene that is not a stack is refused with exit status 2, naming each body") {
  std::string text = replaced(kSlab, "POL", "Ez");
  text = replaced(text, "bodies:\n", "bodies:\n  - {medium: dense, circle: {centre: [5 um, 0.8 mm], radius: 20 um}}\n"
                                      "  - {medium: dense, rectangle: {centre: [4 um, 0.1 mm], size: [4 um, 10 um]}}\n");
  const std::string scene = write_scene("terayee-stack-not.yaml", text);
  const std::string bin = TERAYEE_BINARY;
  const std::string out = ty::test::capture(bin + " medium '" + scene + "' --stack 2>&1");
  INFO(out);
  CHECK(out.find(scene + ":8:") != std::string::npos);  // the circle
  CHECK(out.find("not an unrotated rectangle") != std::string::npos);
  CHECK(out.find(scene + ":9:") != std::string::npos);  // the narrow rectangle
  CHECK(out.find("does not span the width") != std::string::npos);
  CHECK(ty::test::shell(bin + " medium '" + scene + "' --stack") == 2);
  // a point source instead of the plane wave; and --stack with an option of one medium
  const std::string point = write_scene(
      "terayee-stack-point.yaml",
      replaced(replaced(replaced(kSlab, "POL", "Ez"), "plane: {polarization: Ez, direction: +y, launch: {y: 0.2 mm},",
                        "point: {component: Ez, at: [5 um, 0.2 mm],"),
               "amplitude: 1 V/m", "amplitude: 1 mA"));
  CHECK(ty::test::capture(bin + " medium '" + point + "' --stack 2>&1").find("not a plane wave") != std::string::npos);
  CHECK(ty::test::shell(bin + " medium '" + point + "' --stack") == 2);
  CHECK(ty::test::shell(bin + " medium '" + scene + "' --stack --medium glass") == 2);
  CHECK(ty::test::shell(bin + " medium '" + scene + "' --from '1 THz' --to '1 THz'") == 2);  // no --medium
  for (const char* f : {"terayee-stack-not.yaml", "terayee-stack-point.yaml", "terayee-stack-slab.yaml",
                        "terayee-stack-down.yaml"})
    fs::remove(fs::temp_directory_path() / f);
}

/// \file test_check_command.cpp
/// \brief `terayee check` on a biased barium hexaferrite (tests/data/hexaferrite-voigt.yaml)
/// against the Polder tensor of a saturated ferrite with Kittel's line (Pozar, Microwave
/// Engineering, 4th ed., sec. 9.1-9.3; Gurevich & Melkov, Magnetization Oscillations and
/// Waves, sec. 1.6): f0 = g muB/h (B0 + mu0 H_A), fm = g muB/h mu0 Ms (CODATA muB/h =
/// 13.996 GHz/T), mu = 1 + f0 fm / (f0^2 - f^2), kappa = f fm / (f0^2 - f^2). Across the bias
/// mu_perp = (mu^2 - kappa^2) / mu is negative for sqrt(f0 (f0 + fm)) < f < f0 + fm; along
/// it the circular waves see mu -+ kappa, one negative for f0 < f < f0 + fm.
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <array>
#include <cmath>
#include <cstdio>
#include <regex>
#include <string>

#include "tests/helpers.h"

namespace {

// the crystal library's BaFe12O19: g = 2, mu0 Ms = 0.47 T, mu0 H_A = 1.7 T, eps = 17; bias 0.3 T
constexpr double kGamma = 2 * 13.99624493e9, kEps = 17;  // Hz/T (g muB / h, CODATA 2018)
constexpr double kF0 = kGamma * (0.3 + 1.7), kFm = kGamma * 0.47;

double mu_perp(double f) {
  const double mu = 1 + kF0 * kFm / (kF0 * kF0 - f * f), kappa = f * kFm / (kF0 * kF0 - f * f);
  return (mu * mu - kappa * kappa) / mu;
}

/// `terayee check` on tests/data/NAME with the given --set options: what it printed (it must pass).
std::string check_scene(const std::string& name, const std::string& sets = "") {
  const std::string cmd = std::string(TERAYEE_BINARY) + " check '" + TERAYEE_SOURCE_DIR + "/tests/data/" + name +
                          "' " + sets + " 2>&1";
  std::string out;
  FILE* p = popen(cmd.c_str(), "r");
  REQUIRE(p);
  std::array<char, 4096> buf{};
  while (fgets(buf.data(), buf.size(), p)) out += buf.data();
  REQUIRE(pclose(p) == 0);
  return out;
}

std::string check(const std::string& sets) { return check_scene("hexaferrite-voigt.yaml", sets); }

/// The two numbers of the first match of `pattern` (two groups) in text.
std::pair<double, double> two(const std::string& text, const std::string& pattern) {
  std::smatch m;
  REQUIRE_MESSAGE(std::regex_search(text, m, std::regex(pattern)), pattern << " in\n" << text);
  return {std::stod(m[1]), m.size() > 2 && m[2].matched ? std::stod(m[2]) : 0.0};
}

}  // namespace

TEST_CASE("terayee check: cells per wavelength with the crystal's own n(f), per axis") {
  // 20 um cells, source band 40-61 GHz: fewest at 61 GHz, n = sqrt(eps mu_perp) (eps alone gave 59.6, no warning)
  std::string out = check("");
  const double expect = 299792458.0 / (61e9 * std::sqrt(kEps * mu_perp(61e9))) / 20e-6;
  const double got = two(out, R"(hexa \(n\(f\)\)\s+x:\s+([0-9.]+))").first;
  MESSAGE("cells per wavelength in the crystal: " << got << " (Polder: " << expect << ")");
  CHECK(got == doctest::Approx(expect).epsilon(0.005));  // printed with one decimal
  CHECK(out.find("under 30 along x in a magnet") != std::string::npos);
  // periodic along y with a plane wave along x: nothing varies along y, so a cell 2 mm tall
  // (2.5 cells per vacuum wavelength) is not counted (it was: "2.5 cells per wavelength", a warning)
  out = check("--set 'grid.extent=[2 mm, 2 mm]' --set 'grid.cell=[20 um, 2 mm]'");
  CHECK(std::regex_search(out, std::regex(R"(vacuum\s+x:\s+245\.\d y: uniform\n)")));
  // without the periodic side it counts
  out = check("--set 'grid.extent=[2 mm, 2 mm]' --set 'grid.cell=[20 um, 2 mm]' --set grid.boundaries.y=absorbing");
  CHECK(std::regex_search(out, std::regex(R"(vacuum\s+x:\s+245\.\d y:\s+2\.5  <- warning: under 10 along y,)")));
}

TEST_CASE("terayee check: negative bands run to their ends, the Hz wave and the Faraday geometry (Polder)") {
  // the scan ends at 1.2 f0 = 67.18 GHz; the band of mu_perp runs on to f0 + fm = 69.14 GHz
  std::string out = check("");
  auto [a, b] = two(out, R"(Ez wave, eps_zz mu_V \(mu_V = mu_yy[^)]*\) < 0: ([0-9.]+)-([0-9.]+) GHz)");
  CHECK(a * 1e9 == doctest::Approx(std::sqrt(kF0 * (kF0 + kFm))).epsilon(1e-5));
  CHECK(b * 1e9 == doctest::Approx(kF0 + kFm).epsilon(1e-5));
  // c axis and bias along y (cut a): across the bias along x the Hz wave carries mu_perp, along
  // y the waves couple and the circular one with mu + kappa... negative from f0 to f0 + fm
  out = check("--set 'bias=[0, 0.3 T, 0]' --set media.hexa.cut=a");
  CHECK(out.find("Ez wave, eps_zz mu_V (mu_V = mu_yy - mu_yx mu_xy / mu_xx) < 0: none") != std::string::npos);
  std::tie(a, b) = two(out, R"(Hz wave, eps'_yy mu'_zz [^<]*< 0: ([0-9.]+)-([0-9.]+) GHz)");
  CHECK(a * 1e9 == doctest::Approx(std::sqrt(kF0 * (kF0 + kFm))).epsilon(1e-5));
  CHECK(b * 1e9 == doctest::Approx(kF0 + kFm).epsilon(1e-5));
  CHECK(out.find("normal y (waves along y): the Ez and Hz waves are coupled") != std::string::npos);
  std::tie(a, b) = two(out, R"(coupled wave of lower \(k/k0\)\^2 [^<]*< 0: ([0-9.]+)-([0-9.]+) GHz)");
  CHECK(a * 1e9 == doctest::Approx(kF0).epsilon(1e-5));
  CHECK(b * 1e9 == doctest::Approx(kF0 + kFm).epsilon(1e-5));
}

TEST_CASE("terayee check: run-length and decay-length warnings only where a negative band is") {
  // MnF2 slab, damping 1e-3: no negative band at all, so no "band too narrow" warning (there were two)
  std::string out = check_scene("mnf2-slab.yaml");
  CHECK(out.find("run resolves") == std::string::npos);
  // the hexaferrite's band (6.9 GHz wide) in the source band: a 100 ps run resolves 10 GHz, too coarse
  const std::string band = "--set sources.0.plane.waveform.from='64 GHz' --set sources.0.plane.waveform.to='69 GHz'";
  out = check(band + " --set 'time.stop=100 ps'");
  CHECK(out.find("warning: the run resolves 10 GHz, coarser than half the band") != std::string::npos);
  // evanescent inside the band: 1/e length c / (2 pi f sqrt(eps |mu_perp|)), shortest at 64 GHz (104 um):
  // under 4 cells of 30 um, not of 20 um
  const double expect = 299792458.0 / (2 * ty::constants::pi * 64e9 * std::sqrt(kEps * -mu_perp(64e9))) * 1e6;
  out = check(band + " --set 'grid.cell=30 um'");
  const double got = two(out, R"(decays by 1/e in under 4 cells .*shortest ([0-9.]+) um)").first;
  MESSAGE("shortest decay length " << got << " um (Polder: " << expect << ")");
  CHECK(got == doctest::Approx(expect).epsilon(0.005));
  out = check(band);
  CHECK(out.find("decays by 1/e") == std::string::npos);
}

TEST_CASE("terayee check: the evanescent field of total internal reflection against its cells") {
  // eps = 5.5 to vacuum at 45 deg, 1 THz: 1/e length lambda0 / (2 pi sqrt(n1^2 sin^2 45 - 1)) = 36.07 um
  // (Born & Wolf, Principles of Optics, sec. 1.5.4): 3.0 cells of 12 um (a warning), 4.5 of 8 um (none)
  const std::string scene =
      std::string(TERAYEE_BINARY) + " check '" + TERAYEE_SOURCE_DIR + "/tests/data/tir-shift.yaml'";
  auto run = [&](const std::string& sets) {
    std::string out;
    FILE* p = popen((scene + " " + sets + " 2>&1").c_str(), "r");
    REQUIRE(p);
    std::array<char, 4096> buf{};
    while (fgets(buf.data(), buf.size(), p)) out += buf.data();
    REQUIRE(pclose(p) == 0);
    return out;
  };
  const double expect = 299792458.0 / 1e12 / (2 * ty::constants::pi * std::sqrt(5.5 * 0.5 - 1)) * 1e6;
  std::string out = run("--set 'grid.cell=12 um'");
  const double got = two(out, R"(totally reflected on a face normal to y .* decays by 1/e in ([0-9.]+) um)").first;
  CHECK(got == doctest::Approx(expect).epsilon(1e-3));
  out = run("");
  CHECK(out.find("totally reflected") == std::string::npos);
}

TEST_CASE("terayee check: a line's ring-down time, in a few digits, against the exchange-enhanced damping") {
  // The MnF2 slab (Gilbert damping alpha = 1e-3 on each sublattice, mu0 H_E = 55 T, mu0 H_A =
  // 0.787 T, g = 2, 0.3 T along the easy axis). Linearising the two sublattices' LLG
  // equations about the antiparallel state to first order in alpha (the exchange enhancement
  // of antiferromagnetic damping, worked out here): the two lines w0 +- gamma mu0 H0 decay at
  // alpha gamma mu0 (H_E + H_A) (1 +- gamma mu0 H0 / w0), so the mean of their rates (the
  // harmonic mean of the ring-down times) is alpha gamma mu0 (H_E + H_A): 1/e in 1.019e-10 s.
  // The times were printed with 17 digits ("1.0500000000000001e-10 s"); now three, so the
  // printed times agree with it to their rounding (0.5% each).
  const std::string out = check_scene("mnf2-slab.yaml");
  const std::string t = R"(([0-9]\.?[0-9]{0,2}e-[0-9]+) s\))";  // a time in at most three digits
  const auto [t1, t2] = two(out, "rings down by 1/e in " + t + ", [0-9.]+ GHz \\(rings down by 1/e in " + t);
  const double gamma = 2 * 2 * ty::constants::pi * 13.99624493e9;  // rad/(s T): g = 2 times muB/h (CODATA 2018)
  const double expect = 1 / (1e-3 * gamma * (55.0 + 0.787));
  MESSAGE("ring-down " << t1 << " s and " << t2 << " s; alpha gamma mu0 (H_E + H_A) gives " << expect << " s");
  CHECK(2 / (1 / t1 + 1 / t2) / expect == doctest::Approx(1).epsilon(0.01));
  CHECK(std::abs(t1 / t2 - 1) > 0.03);  // the bias splits the rates: +-3.2% (8.4 / 261 GHz)
}

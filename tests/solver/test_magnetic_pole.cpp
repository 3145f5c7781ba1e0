/// \file test_magnetic_pole.cpp
/// \brief The coupled solver near the pole of the Voigt permeability: a BaFe12O19 half-space
/// biased with 0.3 T along c (z), at normal incidence for the Ez wave (tests/data/
/// hexaferrite-halfspace.yaml), 58-61.5 GHz, just below the pole of mu_V = mu_xx - mu_xy mu_yx /
/// mu_xx at 62.22 GHz (mu_xx = 0). There the longitudinal field H_x = -M_x of the plane wave
/// (B_x = 0) decides the response: a gather that shows a cell cos^2(k dx/2) of its M_x (the
/// earlier G H with G P != 1) moves the pole, and at 20 um cells (18 per wavelength in the
/// crystal at 61.5 GHz) reflected R = 0.40 where the closed form gives 0.011.
/// Reference: the normal-incidence Fresnel formula with the Voigt permeability,
/// r = (sqrt(mu_V / eps) - 1) / (sqrt(mu_V / eps) + 1) (Born & Wolf sec. 1.5 for mu = 1; the
/// effective permeability of a transversely biased ferrite, Pozar, Microwave Engineering,
/// sec. 9.2-9.3), mu from the crystal's linear response (materials/magnetic/linear_response.h).
#include <doctest/doctest.h>

#include "io/scene/scene_reader.h"
#include "materials/magnetic/linear_response.h"
#include "materials/magnetic/state_choice.h"
#include "solver/simulation.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

const std::string kScene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/hexaferrite-halfspace.yaml";
constexpr double kProbe = -1.35e-3;  // behind the one-sided launch line at -1.2 mm: reflected wave only

double predicted_R(const Scene& s, double f) {
  const Medium& m = s.media[0];
  const MagnetModel M(*m.magnet, s.bias);
  const MagneticState st = choose_state(*m.magnet, s.bias).state;  // the state the solver starts in
  const Mat3c mu = Mat3c::Identity() + susceptibility(M, st, 2 * constants::pi * f);
  const std::complex<double> muv = voigt_permeability(mu, 0);
  std::complex<double> n2 = std::sqrt(m.permittivity[2] * muv);
  // the transmitted wave decays away from the interface, or, nearly lossless, carries power
  // away (Re(n2 / mu_V) > 0): round-off in Im n2 must not flip a propagating root
  const double tiny = 1e-9 * std::abs(n2);
  if (n2.imag() < -tiny || (std::abs(n2.imag()) <= tiny && (n2 / muv).real() < 0)) n2 = -n2;
  const std::complex<double> r = (muv / n2 - 1.0) / (muv / n2 + 1.0);
  return std::norm(r);
}

struct Result {
  std::vector<double> f, R, P;
  double worst = 0, f_worst = 0;
};

// R from the Ez probe behind the launch line over the incident field at the face (x = 0) of
// the same scene without the body
Result reflectance(double cell) {
  Scene s = read_scene(kScene, {"grid.cell=" + std::to_string(cell * 1e6) + " um"});
  s.time.threads = 2;
  s.outputs.clear();
  Scene ref = s;
  ref.bodies.clear();
  double dt = 0;
  auto series = [&](const Scene& sc, double x) {  // x in the scene file's coordinates
    Simulation<double> sim(sc, 2);
    dt = sim.grid().dt;
    return test::probe_series(sim, Component::Ez, {x + sc.origin_shift.x, sc.origin_shift.y}, sim.total_steps());
  };
  const auto reflected = series(s, kProbe), incident = series(ref, 0.0);
  Result out;
  for (double f = 58e9; f <= 61.5e9 + 1; f += 0.1e9) {
    const double R = std::norm(test::dft(reflected, dt, f) / test::dft(incident, dt, f)), P = predicted_R(s, f);
    out.f.push_back(f), out.R.push_back(R), out.P.push_back(P);
    if (std::abs(R - P) > out.worst) out.worst = std::abs(R - P), out.f_worst = f;
  }
  return out;
}

}  // namespace

TEST_CASE("coupled solver: hexaferrite half-space reflectance below the pole of mu_V at 20 um cells") {
  const Result r = reflectance(20e-6);
  for (size_t k = 0; k < r.f.size(); k += 5)
    MESSAGE(std::to_string(r.f[k] / 1e9) << " GHz: R = " << r.R[k] << ", Fresnel with mu_V " << r.P[k]);
  MESSAGE("worst |R - R_Fresnel| " << r.worst << " at " << r.f_worst / 1e9 << " GHz");
  CHECK(r.P.back() < 0.02);  // near-matched just below the pole (the closed form: 0.0105)
  // measured 0.0033 (the earlier gather: 0.39 at 61.5 GHz)
  CHECK(r.worst < 0.01);
}

// The same against the cell (long; the docs' table):
//   ./build/terayee_tests -tc="study: hexaferrite half-space*" --no-skip
TEST_CASE("study: hexaferrite half-space reflectance below the pole of mu_V against cell size" * doctest::skip()) {
  for (double cell : {40e-6, 20e-6, 10e-6, 5e-6}) {
    const Result r = reflectance(cell);
    MESSAGE(std::to_string(cell * 1e6) << " um: worst |R - R_Fresnel| over 58-61.5 GHz " << r.worst << " at "
                                       << r.f_worst / 1e9 << " GHz; at 61.5 GHz R = " << r.R.back() << ", Fresnel "
                                       << r.P.back());
  }
}

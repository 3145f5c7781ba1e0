/// \file test_llg_cell.cpp
/// \brief The bare integrator: one cell, a prescribed uniform field, no Maxwell coupling.
/// Both paths of the cell step (cell_step.h) must ring at the linear-response resonances
/// (linear_response.h, itself checked against the closed forms) at the production time
/// step (MnF2 at 20 cells per wavelength in the crystal, S = 0.5: dt = 4.1e-14 s,
/// gamma mu0 H_E dt = 0.39, shared/references.md): the exact small-signal step to the line
/// estimate's precision, the midpoint rule within 1e-4 and converging at its order (its
/// error is -(w dt)^2/12: the Cayley map's phase 2 atan(w dt/2), d'Aquino, Serpico & Miano
/// 2005). The step must keep |m_s| = 1 to round-off (1e-12 over 1e5 steps), recover
/// chi(omega) from the response to a small drive, and hand over between its paths without
/// losing accuracy.
#include <doctest/doctest.h>

#include "materials/magnetic/cell_step.h"
#include "materials/magnetic/linear_response.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

constexpr double kDt = 4.1e-14;

using test::mnf2;

// The step as the solver builds it for a prescribed field (no own reaction); midpoint_substeps
// > 0 forces the plain midpoint rule (tilt 0, no exponential path) with that many sub-steps,
// -1 the exponential midpoint of llg_exponential.h (tilt 0).
CellStep bare_step(const MagnetModel& M, const MagneticState& g, double dt, int midpoint_substeps = 0) {
  CellStep p = CellStep::from(M, g, dt, resonances(M, g).back(), {0, 0, 0});
  if (midpoint_substeps > 0) p.midpoint.substeps = midpoint_substeps, p.tilt2 = 0, p.chart2 = -1;
  if (midpoint_substeps < 0) p.tilt2 = 0;
  return p;
}

// free ringing after a small tilt (rad) of sublattice 1: net mu0*M along `component` per step
std::vector<double> ring(const MagnetModel& M, double dt, long steps, int midpoint_substeps, int component = 0,
                         double tilt = 1e-5) {
  const auto gs = find_ground_states(M);
  const CellStep p = bare_step(M, gs.ground, dt, midpoint_substeps);
  double m[2][3];
  for (int s = 0; s < M.n; ++s)
    for (int c = 0; c < 3; ++c) m[s][c] = gs.ground.m[s][c];
  const Vec3 axis = gs.ground.m[0].cross(Vec3(0.3, 0.5, 0.8)).normalized();
  const Vec3 t = Eigen::AngleAxisd(tilt, axis) * gs.ground.m[0];
  for (int c = 0; c < 3; ++c) m[0][c] = t[c];
  const double zero[3] = {0, 0, 0};
  std::vector<double> out;
  double dM[3];
  for (long k = 0; k < steps; ++k) {
    step_cell(p, zero, zero, m, dM);
    out.push_back(M.mu[0] * m[0][component] + (M.n == 2 ? M.mu[1] * m[1][component] : 0.0));
  }
  return out;
}

double peak_near(std::vector<double> x, double dt, double f0, double span) {
  const double mean = [&] { double s = 0; for (double v : x) s += v; return s / x.size(); }();
  for (size_t n = 0; n < x.size(); ++n) x[n] = (x[n] - mean) * (0.5 - 0.5 * std::cos(2 * constants::pi * n / (x.size() - 1)));
  double lo = f0 * (1 - span), hi = f0 * (1 + span), best = lo, bv = 0;
  for (int k = 0; k <= 200; ++k) {
    const double f = lo + (hi - lo) * k / 200;
    const double v = std::abs(test::dft(x, dt, f));
    if (v > bv) bv = v, best = f;
  }
  const double w = (hi - lo) / 200;
  lo = best - w, hi = best + w;
  const double g = 0.5 * (std::sqrt(5.0) - 1);
  for (int it = 0; it < 60; ++it) {
    const double a = hi - g * (hi - lo), b = lo + g * (hi - lo);
    if (std::abs(test::dft(x, dt, a)) > std::abs(test::dft(x, dt, b))) hi = b; else lo = a;
  }
  return 0.5 * (lo + hi);
}

}  // namespace

TEST_CASE("bare integrator rings at the linear-response lines within 1e-4 at the production step") {
  // both paths of the step: the exact small-signal step (no time-discretization error:
  // what remains is the line estimate's) and the midpoint rule with its automatic sub-steps
  struct Case {
    const char* name;
    std::array<double, 3> bias;
  };
  for (const Case& c : {Case{"zero bias", {0, 0, 0}}, Case{"1 T along the easy axis", {0, 0, 1}},
                        Case{"1 T transverse", {1, 0, 0}}}) {
    const MagnetModel M(mnf2(), c.bias);
    const auto gs = find_ground_states(M);
    const auto lines = resonances(M, gs.ground);
    const int auto_substeps = bare_step(M, gs.ground, kDt).midpoint.substeps;
    for (int path = 0; path < 3; ++path) {
      std::vector<std::vector<double>> x;
      for (int comp : {0, 1, 2}) x.push_back(ring(M, kDt, 1 << 17, path == 0 ? 0 : path == 1 ? auto_substeps : -1, comp));
      for (double f : lines) {
        // the component in which this line is strongest
        int best = 0;
        double strongest = 0;
        for (int comp = 0; comp < 3; ++comp) {
          const double a = std::abs(test::dft(x[comp], kDt, f));
          if (a > strongest) strongest = a, best = comp;
        }
        const double measured = peak_near(x[best], kDt, f, 0.001);
        const std::string integrator = path == 0 ? "small-signal step" : path == 1 ? "midpoint rule" : "exponential midpoint";
        MESSAGE(std::string(c.name) << ", " << integrator << ": line " << f / 1e9
                                    << " GHz, integrator " << measured / 1e9 << " GHz (component " << best
                                    << "), error " << measured / f - 1);
        // the exponential midpoint is exact for the linearised equations, as the small-signal step
        CHECK(std::abs(measured / f - 1) < (path == 1 ? 1e-4 : 1e-6));
      }
    }
  }
}

TEST_CASE("bare integrator: the midpoint rule converges as dt^2 with the predicted error") {
  const MagnetModel M(mnf2(), {0, 0, 0});
  const double fr = resonances(M, find_ground_states(M).ground)[0];
  const double wr = 2 * constants::pi * fr;
  auto error = [&](int substeps) {
    const long steps = static_cast<long>(3e-9 / kDt);
    return test::crossing_frequency(ring(M, kDt, steps, substeps), kDt) / fr - 1;
  };
  const double e1 = error(1), e2 = error(2), e3 = error(3);
  MESSAGE("midpoint, 1/2/3 sub-steps: errors " << e1 << ", " << e2 << ", " << e3 << " (ratio " << e1 / e2
                                               << "); -(w dt)^2/12 = " << -std::pow(wr * kDt, 2) / 12);
  CHECK(e1 / e2 == doctest::Approx(4.0).epsilon(0.02));
  CHECK(e1 == doctest::Approx(-std::pow(wr * kDt, 2) / 12).epsilon(0.02).scale(0));
  CHECK(e1 / e3 == doctest::Approx(9.0).epsilon(0.02));
  const LlgCoefficients p = LlgCoefficients::from(M, kDt, fr);
  // phase error (w_r dt / n)^2 / 12 below 6e-5 needs n = 3 here
  MESSAGE("automatic choice at the production step: " << p.substeps << " sub-steps");
  CHECK(p.substeps == 3);
  // the small-signal step has no such error
  const double e0 = test::crossing_frequency(ring(M, kDt, static_cast<long>(3e-9 / kDt), 0), kDt) / fr - 1;
  MESSAGE("small-signal step: error " << e0);
  CHECK(std::abs(e0) < 0.01 * std::abs(e3));
}

TEST_CASE("bare integrator keeps |m| = 1 to 1e-12 over 1e5 steps of a large damped drive") {
  const MagnetModel M(mnf2(0.01), {0, 0, 0.5});
  const auto gs = find_ground_states(M);
  const CellStep p = bare_step(M, gs.ground, kDt);
  double m[2][3];
  for (int s = 0; s < 2; ++s)
    for (int c = 0; c < 3; ++c) m[s][c] = gs.ground.m[s][c];
  const double w = 2 * constants::pi * 255e9, b0 = 2.0;  // a 2 T rotating field near the lower line
  double worst = 0, tilt = 0, dM[3];
  for (long k = 0; k < 100000; ++k) {
    const double t0 = k * kDt, t1 = t0 + kDt;
    const double bo[3] = {b0 * std::cos(w * t0), b0 * std::sin(w * t0), 0};
    const double bn[3] = {b0 * std::cos(w * t1), b0 * std::sin(w * t1), 0};
    step_cell(p, bo, bn, m, dM);
    for (int s = 0; s < 2; ++s) worst = std::max(worst, std::abs(std::sqrt(m[s][0] * m[s][0] + m[s][1] * m[s][1] + m[s][2] * m[s][2]) - 1));
    tilt = std::max(tilt, std::acos(std::clamp(m[0][2], -1.0, 1.0)));
  }
  MESSAGE("max | |m| - 1 | = " << worst << ", largest tilt " << tilt * 180 / constants::pi << " deg");
  CHECK(worst < 1e-12);
  CHECK(tilt > 0.1);  // the drive really moved the sublattices
}

TEST_CASE("bare integrator recovers chi(omega), diagonal and off-diagonal, within 1%") {
  const MagnetModel M(mnf2(0.01), {0, 0, 1.0});  // gyrotropic: chi_xy != 0
  const auto gs = find_ground_states(M);
  for (double f : {120e9, 200e9, 330e9, 500e9}) {
    const double w = 2 * constants::pi * f, b0 = 1e-5;
    double m[2][3];
    for (int s = 0; s < 2; ++s)
      for (int c = 0; c < 3; ++c) m[s][c] = gs.ground.m[s][c];
    const Vec3 M0 = M.net(gs.ground.m);
    // settle (damped: the transient dies within a few hundred periods), then one DFT over whole periods
    const long per = static_cast<long>(std::lround(1.0 / (f * kDt)));
    const double dt = 1.0 / (f * per);  // a whole number of steps per period
    const CellStep q = bare_step(M, gs.ground, dt);
    std::complex<double> X = 0, Y = 0;
    const long settle = 400 * per, window = 200 * per;
    double dM[3];
    for (long k = 0; k < settle + window; ++k) {
      const double t0 = k * dt, t1 = t0 + dt;
      const double ramp0 = std::min(1.0, t0 / (50.0 / f)), ramp1 = std::min(1.0, t1 / (50.0 / f));
      const double bo[3] = {b0 * ramp0 * std::cos(w * t0), 0, 0}, bn[3] = {b0 * ramp1 * std::cos(w * t1), 0, 0};
      step_cell(q, bo, bn, m, dM);
      if (k < settle) continue;
      const double mx = M.mu[0] * m[0][0] + M.mu[1] * m[1][0] - M0.x();
      const double my = M.mu[0] * m[0][1] + M.mu[1] * m[1][1] - M0.y();
      const std::complex<double> e(std::cos(w * t1), std::sin(w * t1));
      X += mx * e;
      Y += my * e;
    }
    X *= 2.0 / window / b0;
    Y *= 2.0 / window / b0;
    const Mat3c chi = susceptibility(M, gs.ground, w);
    MESSAGE(std::to_string(f / 1e9) << " GHz: chi_xx " << X << " vs " << chi(0, 0) << ", chi_yx " << Y << " vs " << chi(1, 0));
    CHECK(std::abs(X - chi(0, 0)) < 0.01 * std::abs(chi(0, 0)));
    CHECK(std::abs(Y - chi(1, 0)) < 0.01 * std::abs(chi(1, 0)));
  }
}

TEST_CASE("large-angle precession: |m| exact, the line softens as the easy-axis anisotropy predicts") {
  // With the Neel vector tilted by theta0 from the easy axis and no net moment, the
  // exchange approximation of the two-sublattice equations is a pendulum in 2 theta:
  // (2 theta)'' = -w_r^2 sin(2 theta) (e.g. Kittel & Keffer's AFMR in the exchange limit;
  // the sine-Gordon form of antiferromagnetic dynamics), whose frequency falls with the
  // amplitude as (pi/2) / K(sin theta0), K the complete elliptic integral of the first kind.
  const MagnetModel M(mnf2(), {0, 0, 0});
  const auto gs = find_ground_states(M);
  const double f0 = resonances(M, gs.ground)[0];
  const CellStep p = bare_step(M, gs.ground, kDt);
  // 5 degrees lies below the hand-over to the plain midpoint rule (7 degrees, cell_step.h):
  // the exponential midpoint (llg_exponential.h); 10, 20 and 40 beyond it
  for (double deg : {5.0, 10.0, 20.0, 40.0}) {
    const double th = deg * constants::pi / 180;
    double m[2][3] = {{std::sin(th), 0, std::cos(th)}, {-std::sin(th), 0, -std::cos(th)}};
    double dM[3], worst = 0;
    const double zero[3] = {0, 0, 0};
    std::vector<double> lx;
    for (long k = 0; k < 200000; ++k) {
      step_cell(p, zero, zero, m, dM);
      lx.push_back(0.5 * (m[0][0] - m[1][0]));
      for (int s = 0; s < 2; ++s)
        worst = std::max(worst, std::abs(std::sqrt(m[s][0] * m[s][0] + m[s][1] * m[s][1] + m[s][2] * m[s][2]) - 1));
    }
    const double f = test::crossing_frequency(lx, kDt);
    const double predicted = constants::pi / 2 / std::comp_ellint_1(std::sin(th));
    MESSAGE(deg << " deg: line at " << f / f0 << " of the small-signal one, pendulum " << predicted
                << "; max ||m|-1| " << worst);
    CHECK(f < f0);
    CHECK(std::abs((f / f0 - 1) / (predicted - 1) - 1) < 0.1);
    CHECK(worst < 1e-12);
  }
}

TEST_CASE("bare integrator stays stable and accurate when gamma mu0 H_E dt is of order one") {
  // dt = 1e-13 s: gamma mu0 H_E dt = 0.97 for MnF2 (design.md: exchange fields are tens of tesla)
  const MagnetModel M(mnf2(), {0, 0, 0});
  const double fr = resonances(M, find_ground_states(M).ground)[0];
  const double dt = 1e-13;
  CHECK(M.gamma[0] * 55.0 * dt == doctest::Approx(0.967).epsilon(0.01));
  const LlgCoefficients p = LlgCoefficients::from(M, dt, fr);
  MESSAGE("midpoint rule: " << p.substeps << " sub-steps of " << p.iterations << " passes");
  for (int path = 0; path < 2; ++path) {
    const auto x = ring(M, dt, 100000, path == 0 ? 0 : p.substeps);
    double amp_first = 0, amp_last = 0;
    for (size_t k = 0; k < 2000; ++k)
      amp_first = std::max(amp_first, std::abs(x[k])), amp_last = std::max(amp_last, std::abs(x[x.size() - 1 - k]));
    const double err = test::crossing_frequency(x, dt) / fr - 1;
    MESSAGE("gamma mu0 H_E dt = 0.97, " << (path == 0 ? "small-signal step" : "midpoint rule") << ": line error "
                                        << err << ", amplitude after 1e5 steps / at start " << amp_last / amp_first);
    CHECK(std::abs(err) < 1e-4);
    CHECK(amp_last / amp_first == doctest::Approx(1.0).epsilon(0.01));
  }
}

TEST_CASE("small-signal step and midpoint rule agree below the hand-over tilt") {
  // What the small-signal step leaves out grows with the tilt: a ringing cell's line moves
  // as the square of the amplitude (the leading nonlinear term of a precessing moment; cf.
  // the pendulum case above). Measured with a fine midpoint rule (12 sub-steps, phase error
  // -(w dt/12)^2/12 = -2.6e-6, the same at every amplitude), the shift at the hand-over tilt
  // must sit far below the midpoint rule's own error at the production step (6e-5), and grow
  // as tilt^2; the small-signal step must sit above the fine midpoint by just that error.
  const MagnetModel M(mnf2(), {0, 0, 0});
  const auto gs = find_ground_states(M);
  const long steps = static_cast<long>(3e-9 / kDt);
  auto line = [&](double tilt, int substeps) {
    return test::crossing_frequency(ring(M, kDt, steps, substeps, 0, tilt), kDt);
  };
  const double f_small = line(1e-5, 0);  // the small-signal step (exact for the linearised equations)
  const double f0 = line(1e-6, 12);
  const double d1 = line(CellStep::kTilt, 12) / f0 - 1, d2 = line(1e-3, 12) / f0 - 1, d3 = line(3e-3, 12) / f0 - 1;
  MESSAGE("line shift of the full equations: " << d1 << " at the hand-over tilt " << CellStep::kTilt << ", " << d2
                                               << " at 1e-3, " << d3 << " at 3e-3 (ratio " << d3 / d2
                                               << "); small-signal step vs fine midpoint " << f_small / f0 - 1);
  CHECK(std::abs(d1) < 1e-6);
  CHECK(d3 / d2 == doctest::Approx(9.0).epsilon(0.1));
  const double wr = 2 * constants::pi * resonances(M, gs.ground)[0];
  CHECK(f_small / f0 - 1 == doctest::Approx(std::pow(wr * kDt / 12, 2) / 12).epsilon(0.05).scale(0));
}

/// \file test_waveform.cpp
/// \brief Source waveforms against closed forms: the single-cycle pulse (the time derivative of
/// a Gaussian, whose transform is i w times the Gaussian's: peak at f_c, amplitude half-maximum
/// at 0.3191 f_c and 1.9216 f_c), and the file waveform's cubic spline (fourth-order accurate,
/// de Boor, A Practical Guide to Splines, ch. IV, for a function with zero second derivative
/// at the ends as the natural spline assumes) with its leave-every-other-out error estimate.
#include <doctest/doctest.h>

#include <cmath>
#include <filesystem>
#include <fstream>

#include "io/scene/constants.h"
#include "io/scene/scene_reader.h"
#include "solver/sources/waveform.h"

using namespace ty;
using constants::pi;

TEST_CASE("waveform: a single-cycle pulse peaks in frequency at its centre, with the derivative-of-Gaussian width") {
  const double fc = 1e12;
  Waveform w;
  w.kind = Waveform::Kind::single_cycle;
  w.delay = 6.0 / (2 * pi * fc);
  const Signal g(w, fc);
  const double tau = 1 / (2 * pi * fc);
  CHECK(g(w.delay - tau).real() == doctest::Approx(1.0));  // its peak
  CHECK(g(w.delay).real() == doctest::Approx(0.0));        // its centre
  CHECK(std::abs(g(0).real()) < 2e-7);
  auto amplitude = [&](double f) {  // |G(f)| by the rectangle rule, 1 fs steps over 3 ps
    std::complex<double> s = 0;
    for (int k = 0; k < 3000; ++k) s += g(k * 1e-15).real() * std::polar(1.0, 2 * pi * f * k * 1e-15);
    return std::abs(s) * 1e-15;
  };
  const double peak = amplitude(fc);
  CHECK(amplitude(0.98 * fc) < peak);
  CHECK(amplitude(1.02 * fc) < peak);
  CHECK(amplitude(0.3191 * fc) / peak == doctest::Approx(0.5).epsilon(1e-3));
  CHECK(amplitude(1.9216 * fc) / peak == doctest::Approx(0.5).epsilon(1e-3));
  // The analytic transform: |G| = tau sqrt(2 pi) e^{1/2} (w tau) exp(-w^2 tau^2 / 2).
  CHECK(peak == doctest::Approx(tau * std::sqrt(2 * pi)).epsilon(1e-6).scale(0));
}

TEST_CASE("waveform: a file's table through the cubic spline, its error fourth order and estimated") {
  // A single cycle at 1 THz sampled every h: the spline's error falls ~16x when h halves.
  Waveform exact;
  exact.kind = Waveform::Kind::single_cycle;
  exact.delay = 2e-12;
  const Signal g(exact, 1e12);
  auto table = [&](double h) {
    Waveform w;
    w.kind = Waveform::Kind::file;
    for (double t = 0; t <= 4e-12 + 1e-18; t += h) w.table_time.push_back(t), w.table_value.push_back(g(t).real());
    return w;
  };
  auto error = [&](const Waveform& w) {
    const Signal s(w, 0);
    double e = 0;
    for (int k = 0; k < 4000; ++k) e = std::max(e, std::abs(s(k * 1e-15).real() - g(k * 1e-15).real()));
    return e;
  };
  const Waveform coarse = table(40e-15), fine = table(20e-15);
  const double e1 = error(coarse), e2 = error(fine);
  MESSAGE("spline error at 40 fs: " << e1 << ", at 20 fs: " << e2 << ", estimates " << spline_error_estimate(coarse)
                                    << " and " << spline_error_estimate(fine));
  CHECK(e1 / e2 == doctest::Approx(16).epsilon(0.25));
  for (const Waveform* w : {&coarse, &fine}) {
    const double est = spline_error_estimate(*w), err = error(*w);
    CHECK(est > 0.5 * err);
    CHECK(est < 2.0 * err);
  }
  // The spline passes through its samples and is zero outside the table.
  const Signal s(coarse, 0);
  CHECK(s(coarse.table_time[7]).real() == doctest::Approx(coarse.table_value[7]).scale(0));
  CHECK(s(-1e-15).real() == 0.0);
  CHECK(s(5e-12).real() == 0.0);
}

TEST_CASE("waveform: a scene reads a file waveform's table in its time unit, beside the scene") {
  const auto dir = std::filesystem::temp_directory_path() / "terayee-test-waveform";
  std::filesystem::create_directories(dir);
  std::ofstream(dir / "pulse.csv") << "# t (ps), E\n0, 0\n0.5, 1\n1.0, -0.5\n1.5,0\n";
  std::ofstream(dir / "scene.yaml")
      << "title: t\ngrid: {extent: [1 mm, 1 mm], cell: 10 um}\ntime: {stop: 3 ps}\nsources:\n"
         "  - point: {at: [0, 0], component: Ez, amplitude: 1 A, waveform: {kind: file, file: pulse.csv, time-unit: "
         "ps}}\n";
  const Scene sc = read_scene((dir / "scene.yaml").string());
  REQUIRE(sc.sources.size() == 1);
  const Waveform& w = sc.sources[0].waveform;
  CHECK(w.table_time == std::vector<double>{0, 0.5e-12, 1.0e-12, 1.5e-12});
  CHECK(w.table_value == std::vector<double>{0, 1, -0.5, 0});
  CHECK(sc.sources[0].frequency > 0);  // the table's band sets the carrier of launch delays
}

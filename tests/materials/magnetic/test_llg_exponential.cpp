/// \file test_llg_exponential.cpp
/// \brief The exponential midpoint's fixed-point passes (llg_exponential.h) stop on the
/// a-posteriori error of the last pass, estimated from the contraction the last two passes
/// measured (the stopping rule of simplified Newton iterations: Hairer & Wanner, Solving ODEs
/// II, 2nd ed., sec. IV.8, eq. 8.10-8.11). Checked against the same lanes iterated to
/// round-off: every lane within the tolerance (1e-10 of its change over the step), and the
/// pass it saves over stopping on a small change alone.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>

#include "materials/magnetic/cell_step.h"
#include "materials/magnetic/linear_response.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

// MnF2 at the production step of 20 um cells (test_llg_cell.cpp): gamma mu0 H_E dt = 0.39
constexpr double kDt = 4.1e-14;
constexpr int W = 8;

struct Lanes {
  double m0[6][W], ml[6][W], b0[3][W], b1[3][W], mn[6][W], dM[3][W], q[W], ok[W];
};

/// Eight cells of MnF2, each sublattice tilted by `tilt` about its own axis, in a field of
/// `field` T that turns from lane to lane; ml from the small-signal step, as cell_step.h has it.
Lanes tilted_lanes(const CellStep& p, const MagneticState& g, double tilt, double field) {
  Lanes a{};
  for (int l = 0; l < W; ++l) {
    const double phi = 0.7 * l;
    for (int s = 0; s < 2; ++s) {
      const Vec3 axis = g.m[s].cross(Vec3(std::cos(phi + s), std::sin(phi + s), 0.3)).normalized();
      const Vec3 m = Eigen::AngleAxisd(tilt * (1 + 0.1 * l), axis) * g.m[s];
      for (int c = 0; c < 3; ++c) a.m0[3 * s + c][l] = m[c];
    }
    for (int c = 0; c < 3; ++c) {
      a.b0[c][l] = field * std::cos(phi + 2 * c);
      a.b1[c][l] = field * std::cos(phi + 2 * c + 0.2);
    }
  }
  const double* m[6];
  double* mn[6];
  const double *b0[3], *b1[3];
  double* d[3];
  double x2[W];
  for (int c = 0; c < 6; ++c) m[c] = a.m0[c], mn[c] = a.ml[c];
  for (int c = 0; c < 3; ++c) b0[c] = a.b0[c], b1[c] = a.b1[c], d[c] = a.dM[c];
  linear_cells<2>(p.linear, W, m, b0, b1, mn, d, x2);
  return a;
}

}  // namespace

TEST_CASE("exponential midpoint: the passes stop within 1e-10 of the step's change, in fewer passes") {
  const MagnetModel M(test::mnf2(1e-4), {0, 0, 0});
  const MagneticState g = find_ground_states(M).ground;
  const CellStep p = CellStep::from(M, g, kDt, resonances(M, g).back(), {0, 0, 0});
  for (double tilt : {1.5e-4, 1e-3, 1e-2, 0.05}) {
    Lanes a = tilted_lanes(p, g, tilt, 0.05), ref = a;
    int passes = 0, ref_passes = 0;
    exponential_lanes(p.linear, p.midpoint, p.r, a.m0, a.ml, a.b0, a.b1, a.mn, a.dM, a.q, a.ok, 1e-10, &passes);
    // iterated to round-off: the error allowed only kFloor (1e-15) of llg_exponential.h
    exponential_lanes(p.linear, p.midpoint, p.r, ref.m0, ref.ml, ref.b0, ref.b1, ref.mn, ref.dM, ref.q, ref.ok, 0.0,
                      &ref_passes);
    double worst = 0;
    for (int l = 0; l < W; ++l) {
      double error = 0, change = 0;
      for (int c = 0; c < 6; ++c) {
        error = std::max(error, std::abs(a.mn[c][l] - ref.mn[c][l]));
        change = std::max(change, std::abs(ref.mn[c][l] - a.m0[c][l]));
      }
      CHECK(a.ok[l] == 1.0);
      CHECK(ref.ok[l] == 1.0);
      worst = std::max(worst, error / change);
    }
    MESSAGE("tilt " << tilt << " rad: " << passes << " passes (" << ref_passes << " to round-off), largest error "
                    << worst << " of the step's change");
    // the tolerance asked (llg_exponential.h); a rule that trusted a pass with rho twice too
    // small, or dropped the 1/(1 - rho), would stop early at the larger tilts
    CHECK(worst <= 1e-10);
    // a pass fewer than stopping on the change itself (change <= 1e-10 of the step's, the
    // rule before: 3 passes up to 1e-2 rad and 4 at 0.05, measured on these lanes, its error
    // 3e-15 to 1e-14 of the step's change, four orders below what the tolerance asks)
    CHECK(passes <= (tilt <= 1e-2 ? 2 : 3));
    CHECK(passes < ref_passes);
  }
}

TEST_CASE("exponential midpoint: one and two sublattices, zero to four axes, against a fine midpoint rule") {
  // The passes are compiled per sublattice and axis count (exponential_kernel<W, N, NA>), each
  // with its own field terms (exchange, anisotropy, Dzyaloshinskii-Moriya, the cell's own
  // reaction and self field). One step of each, every sublattice tilted by 0.02 rad in a wave
  // field, against the implicit midpoint rule of the full equations (llg_cell.h; for the LLG
  // equation: d'Aquino, Serpico & Miano, J. Comput. Phys. 209, 730 (2005)) at 64 sub-steps
  // (phase error (w h / 64)^2 / 12 < 1e-7 of the change). The rule's own error at this tilt
  // is ~1e-5 of the step's change (1.9e-10 at 1e-3 rad, 2.9e-6 at 0.1, llg_exponential.h,
  // growing as the tilt squared); a field term dropped or of the wrong sign in the passes is
  // an error of the order of the tilt times that term's share of the field (>= 1e-3 here).
  // Crystals: MnF2 (tests/helpers.h) and invented ones, marked below.
  struct Crystal {
    const char* name;
    Magnet m;
    std::array<double, 3> bias;
  };
  std::vector<Crystal> crystals;
  {
    Magnet m = test::mnf2(1e-3);
    crystals.push_back({"MnF2, oblique bias (2 sublattices, 1 axis)", m, {0.3, 0.2, 0.5}});
  }
  {
    Magnet m;  // invented: a soft ferrite, no anisotropy
    m.sublattices = {{0.18, 2.0, 2e-3}};
    crystals.push_back({"invented isotropic ferrite (1 sublattice, 0 axes)", m, {0.1, 0.0, 0.4}});
  }
  {
    Magnet m;  // invented: a biaxial ferromagnet with an easy and a hard axis
    m.sublattices = {{0.5, 2.1, 1e-3}};
    m.anisotropy = {{{0, 0, 1}, 0.6}, {{1, 0, 0}, -0.4}};
    crystals.push_back({"invented biaxial ferromagnet (1 sublattice, 2 axes)", m, {0.2, 0.1, 0.3}});
  }
  {
    Magnet m;  // invented: a canted antiferromagnet with a Dzyaloshinskii field and three axes
    m.sublattices = {{0.9, 2.0, 1e-3}, {0.9, 2.0, 1e-3}};
    m.lambda = 40.0 / 0.9;
    m.anisotropy = {{{0, 0, 1}, 0.5}, {{1, 0, 0}, -0.2}, {{0, 0.6, 0.8}, 0.1}};
    m.dzyaloshinskii = {0, 2.0, 0};
    m.order = {0, 0, 1};
    crystals.push_back({"invented canted antiferromagnet (2 sublattices, 3 axes, DM)", m, {0.1, 0, 0.2}});
  }
  {
    Magnet m;  // invented: a ferrimagnet with unequal sublattices and four axes
    m.sublattices = {{0.6, 2.0, 2e-3}, {0.4, 2.0, 1e-3}};
    m.lambda = 20.0 / 0.6;
    m.anisotropy = {{{0, 0, 1}, 0.3}, {{1, 0, 0}, 0.1}, {{0, 1, 0}, -0.05}, {{0.6, 0, 0.8}, 0.08}};
    m.order = {0, 0, 1};
    crystals.push_back({"invented ferrimagnet (2 sublattices, 4 axes)", m, {0, 0.1, 0.3}});
  }
  for (const Crystal& c : crystals) {
    const MagnetModel M(c.m, c.bias);
    const MagneticState g = find_ground_states(M).ground;
    const std::array<double, 3> r{0.3, 0.2, 0.1}, self{0.1, 0.0, 0.2};
    const CellStep p = CellStep::from(M, g, kDt, resonances(M, g).back(), r, self);
    CellStep ref = p;
    ref.midpoint.substeps = 64, ref.tilt2 = 0, ref.chart2 = -1;
    const double tilt = 0.02;
    double m[2][3], m_ref[2][3], start[2][3];
    for (int s = 0; s < M.n; ++s) {
      const Vec3 axis = g.m[s].cross(Vec3(0.3 + s, 0.8, 0.5)).normalized();
      const Vec3 v = Eigen::AngleAxisd(tilt, axis) * g.m[s];
      for (int k = 0; k < 3; ++k) m[s][k] = m_ref[s][k] = start[s][k] = v[k];
    }
    const double b0[3] = {2e-3, -1e-3, 1.5e-3}, b1[3] = {1e-3, 2e-3, -1e-3};
    double dM[3], dM_ref[3];
    step_cell(p, b0, b1, m, dM);
    step_cell(ref, b0, b1, m_ref, dM_ref);
    double error = 0, change = 0;
    for (int s = 0; s < M.n; ++s)
      for (int k = 0; k < 3; ++k) {
        error = std::max(error, std::abs(m[s][k] - m_ref[s][k]));
        change = std::max(change, std::abs(m_ref[s][k] - start[s][k]));
      }
    MESSAGE(std::string(c.name) << ": change " << change << ", exponential against the fine midpoint rule " << error / change
                   << " of it");
    CHECK(error / change < 1e-4);
  }
}

TEST_CASE("exponential midpoint: its root, ten terms of the binomial series, is sqrt(1 - q) to round-off") {
  // sqrt(1 - q) = sum_n binom(1/2, n) (-q)^n (Newton's binomial series, convergent for
  // |q| < 1; any calculus text); ten terms leave c_10 q^10 < 6e-18 for q <= 0.03, the range a kept lane reaches
  // (its tilt within the chart limit, q <= 0.0144; llg_exponential.h). std::sqrt is correctly
  // rounded (IEEE 754), so the two may differ by the series' own rounding only.
  double worst = 0;
  for (int i = 0; i <= 30000; ++i) {
    const double q = 0.03 * i / 30000;
    worst = std::max(worst, std::abs(root_one_minus(q) - std::sqrt(1.0 - q)));
  }
  MESSAGE("largest difference from std::sqrt(1 - q), 0 <= q <= 0.03: " << worst);
  // one unit in the last place just below 1 is 1.1e-16; with the last term dropped the
  // series is off by 2.7e-16 at q = 0.03 (c_9 q^9 = 2.1e-16), so this would fail
  CHECK(worst <= 1.2e-16);
}

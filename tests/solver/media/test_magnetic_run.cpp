/// \file test_magnetic_run.cpp
/// \brief The run's one pass (solver/media/magnetic_run.h) against the step written out
/// phase by phase: the field at the step's ends from the gather of magnetic_cells.h plus
/// G P of the deviations (half the cell's own, a quarter of each neighbour's), then
/// linear_cells (llg_linear.h) on those fields. Runs of every length up to 19 cells, starting
/// at every offset in a 64-byte line (the first cell and the last select their neighbours
/// inside the vector loop), one and two
/// sublattices, MnF2 (shared/references.md) tilted at random about its ground state; and the
/// pass that keeps the large-tilt paths' inputs gives the lighter pass's bits exactly.
#include <doctest/doctest.h>

#include <cmath>
#include <cstring>
#include <random>
#include <vector>

#include "io/scene/constants.h"
#include "materials/magnetic/linear_response.h"
#include "solver/grid/aligned.h"
#include "solver/media/magnetic_run.h"
#include "tests/helpers.h"

using namespace ty;

namespace {

struct Case {
  LinearStep p;
  std::array<double, 5> net;
};

Case mnf2_case(int sublattices) {
  Magnet magnet = test::mnf2(1e-3);
  if (sublattices == 1) magnet.sublattices.pop_back(), magnet.lambda = 0;
  const MagnetModel M(magnet, {0, 0, 0.3});
  const MagneticState g = find_ground_states(M).ground;
  Case c{LinearStep::from(M, g, 4.1e-14, {0, 0, 1}, {1, 1, 0}), {}};
  const Vec3 net = M.net(g.m);
  c.net = {magnet.sublattices[0].saturation, sublattices == 2 ? magnet.sublattices[1].saturation : 0.0, net[0], net[1], net[2]};
  return c;
}

}  // namespace

TEST_CASE("magnetic run: the one pass gives the phase-by-phase step, any length and alignment") {
  std::mt19937 rng(7);
  std::uniform_real_distribution<double> u(-1, 1);
  for (int sub : {1, 2}) {
    const Case k = mnf2_case(sub);
    for (long start = 0; start < 8; ++start)
      for (long len = 1; len <= 19; ++len) {
        const long n = start + len + 1;
        // the state near the ground state, tilted up to 1e-3 rad; fields of a few mT
        AlignedArray<double> m[6], mn[6], dM[3];
        std::vector<double> old(3 * n), vert(n), hx(n + 1), hy(n), hy_up(n), hz(n);
        for (int c = 0; c < 6; ++c) m[c] = AlignedArray<double>(n), mn[c] = AlignedArray<double>(n);
        for (int c = 0; c < 3; ++c) dM[c] = AlignedArray<double>(n);
        for (long q = 0; q < n; ++q)
          for (int s = 0; s < sub; ++s) {
            const Vec3 g = Vec3(k.p.g[s][0], k.p.g[s][1], k.p.g[s][2]);
            const Vec3 t = (g + 1e-3 * Vec3(u(rng), u(rng), u(rng))).normalized();
            for (int c = 0; c < 3; ++c) m[3 * s + c][q] = t[c];
          }
        for (auto* v : {&old, &vert, &hy, &hy_up, &hz, &hx})
          for (double& x : *v) x = 1e3 * u(rng);  // V/m as eta0 H: ~1e-5 T at the cell
        const double left = 1e-6 * u(rng), right = 1e-6 * u(rng);
        RunInput<double> in{{}, {old.data() + start, old.data() + n + start, old.data() + 2 * n + start},
                            vert.data() + start, hx.data() + start, hy.data() + start, hy_up.data() + start,
                            hz.data() + start, left, right, k.net};
        std::vector<double> x2(n), b[6];
        for (auto& v : b) v.assign(n, 0.0);
        RunOutput out{{}, {}, x2.data(), {b[0].data(), b[1].data(), b[2].data()}, {b[3].data(), b[4].data(), b[5].data()}};
        for (int c = 0; c < 6; ++c) in.m[c] = m[c].data() + start, out.m[c] = mn[c].data() + start;
        for (int c = 0; c < 3; ++c) out.dM[c] = dM[c].data() + start;
        const double worst = sub == 2 ? linear_run<2, true>(k.p, in, len, out) : linear_run<1, true>(k.p, in, len, out);
        // the lighter pass (no fields or tilts kept) gives the same bits: the solver picks one
        // by what a run did last step (MagneticCells::run_tilted), which a resumed run forgets
        {
          AlignedArray<double> ln[6], ld[3];
          RunOutput light = out;
          for (int c = 0; c < 6; ++c) ln[c] = AlignedArray<double>(n), light.m[c] = ln[c].data() + start;
          for (int c = 0; c < 3; ++c) ld[c] = AlignedArray<double>(n), light.dM[c] = ld[c].data() + start;
          const double w2 =
              sub == 2 ? linear_run<2, false>(k.p, in, len, light) : linear_run<1, false>(k.p, in, len, light);
          CHECK(std::memcmp(&w2, &worst, sizeof(double)) == 0);
          for (int c = 0; c < 6; ++c) CHECK(std::memcmp(light.m[c], out.m[c], len * sizeof(double)) == 0);
          for (int c = 0; c < 3; ++c) CHECK(std::memcmp(light.dM[c], out.dM[c], len * sizeof(double)) == 0);
        }
        // the phases written out
        auto dev = [&](int c, long q) { return k.net[0] * in.m[c][q] + k.net[1] * in.m[3 + c][q] - k.net[2 + c]; };
        std::vector<double> f0[3], f1[3], want_m[6], want_d[3], want_x2(len);
        for (int c = 0; c < 3; ++c) f0[c].resize(len), f1[c].resize(len), want_d[c].resize(len);
        for (int c = 0; c < 6; ++c) want_m[c].resize(len);
        for (long q = 0; q < len; ++q) {
          const double l = q > 0 ? dev(0, q - 1) : left, r = q + 1 < len ? dev(0, q + 1) : right;
          const double vx = 0.5 * dev(0, q) + 0.25 * (l + r), vy = 0.5 * dev(1, q) + 0.25 * in.vert[q];
          const double c = constants::c0;  // mu0 H = (eta0 H) / c
          f0[0][q] = in.old[0][q] + vx, f0[1][q] = in.old[1][q] + vy, f0[2][q] = in.old[2][q];
          f1[0][q] = 0.5 * (in.hx[q] + in.hx[q + 1]) / c + vx;
          f1[1][q] = 0.5 * (in.hy[q] + in.hy_up[q]) / c + vy;
          f1[2][q] = in.hz[q] / c;
        }
        const double* mi[6];
        double *mo[6], *dp[3];
        const double *b0[3], *b1[3];
        for (int c = 0; c < 6; ++c) mi[c] = in.m[c], mo[c] = want_m[c].data();
        for (int c = 0; c < 3; ++c) dp[c] = want_d[c].data(), b0[c] = f0[c].data(), b1[c] = f1[c].data();
        if (sub == 2) linear_cells<2>(k.p, len, mi, b0, b1, mo, dp, want_x2.data());
        else linear_cells<1>(k.p, len, mi, b0, b1, mo, dp, want_x2.data());
        // the same to the last bits but for the fused multiply-adds the compiler may choose
        double top = 0;
        for (long q = 0; q < len; ++q) {
          for (int c = 0; c < 3; ++c) {
            CHECK(out.b0[c][q] == doctest::Approx(f0[c][q]).epsilon(1e-13));
            CHECK(out.b1[c][q] == doctest::Approx(f1[c][q]).epsilon(1e-13));
            CHECK(out.dM[c][q] == doctest::Approx(want_d[c][q]).epsilon(1e-11));  // a difference of O(1) terms: 1e-16 / 1e-4 of the tilt
          }
          for (int c = 0; c < 6; ++c) CHECK(out.m[c][q] == doctest::Approx(want_m[c][q]).epsilon(1e-14));
          CHECK(out.x2[q] == doctest::Approx(want_x2[q]).epsilon(1e-11));
          top = std::max(top, want_x2[q]);
        }
        CHECK(worst == doctest::Approx(top).epsilon(1e-11));
        CHECK(top > 1e-8);  // the tilts are real (up to 1e-3 rad)
      }
  }
}

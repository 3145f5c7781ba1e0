/// \file test_sweep_plan.cpp
/// \brief Sweep axes and points, and Richardson extrapolation of a refinement sweep.
#include <doctest/doctest.h>

#include <cmath>

#include "io/analysis/sweep/richardson.h"
#include "io/analysis/sweep/sweep_plan.h"
#include "io/scene/diagnostics.h"

using namespace ty;

TEST_CASE("sweep axes: lists, ranges with a count, and their errors") {
  const auto a = parse_axis("bias.2=-1 T, 0 T,1 T");
  CHECK(a.key == "bias.2");
  CHECK(a.values == std::vector<std::string>{"-1 T", "0 T", "1 T"});
  const auto r = parse_axis("bias.2=-2T:2T:5");
  CHECK(r.values == std::vector<std::string>{"-2 T", "-1 T", "0 T", "1 T", "2 T"});
  CHECK_THROWS_AS(parse_axis("bias.2=-2T:2GHz:5"), BadInput);  // ends in different units
  CHECK_THROWS_AS(parse_axis("bias.2=0T:1T:1"), BadInput);     // a count below 2
  CHECK_THROWS_AS(parse_axis("novalues"), BadInput);
  CHECK_THROWS_AS(parse_axis("k=@/nonexistent/file"), BadInput);
}

TEST_CASE("sweep points: a grid of every combination, the last axis fastest, and zipped axes in step") {
  const std::vector<SweepAxis> ax{{"a", {"1", "2"}}, {"b", {"x", "y", "z"}}};
  const auto g = expand(ax, false);
  REQUIRE(g.size() == 6);
  CHECK(g[1].overrides() == std::vector<std::string>{"a=1", "b=y"});
  CHECK(g[5].overrides() == std::vector<std::string>{"a=2", "b=z"});
  CHECK(g[0].name != g[1].name);
  CHECK_THROWS_AS(expand(ax, true), BadInput);  // 2 and 3 values cannot go in step
  const auto z = expand({{"a", {"1", "2"}}, {"b", {"x", "y"}}}, true);
  REQUIRE(z.size() == 2);
  CHECK(z[1].overrides() == std::vector<std::string>{"a=2", "b=y"});
  CHECK_THROWS_AS(expand({{"a", {"1"}}, {"a", {"2"}}}, false), BadInput);  // a key varied twice
  CHECK(refine_axis("grid.cell", "20 um", 3).values == std::vector<std::string>{"20 um", "10 um", "5 um"});
}

TEST_CASE("Richardson extrapolation recovers f0 and p of f = f0 + C h^p (Roache 1998, ch. 5)") {
  for (double p : {1.0, 1.4, 2.0}) {
    std::vector<double> f;
    for (double h : {1.0, 0.5, 0.25}) f.push_back(3.0 + 0.7 * std::pow(h, p));
    const auto e = richardson(f);
    REQUIRE(e);
    CHECK(e->order_observed);
    CHECK(e->order == doctest::Approx(p).epsilon(1e-9));
    CHECK(e->value == doctest::Approx(3.0).epsilon(1e-12));
    // the GCI bounds the finest grid's true error (Fs = 1.25 > 1 with the observed order)
    CHECK(e->error >= std::abs(f.back() - 3.0));
  }
  const auto two = richardson({2.0, 1.25});  // two grids: the assumed second order, Fs = 3
  REQUIRE(two);
  CHECK(!two->order_observed);
  CHECK(two->value == doctest::Approx(1.0));
  CHECK(!richardson({1.0}));
  const auto osc = richardson({1.0, 2.0, 1.5});  // differences change sign: no observed order
  REQUIRE(osc);
  CHECK(!osc->monotone);
}

TEST_CASE("Richardson extrapolation over cells in any ratio recovers f0 and p (Celik et al., J. Fluids Eng. 2008)") {
  const std::vector<double> h{25, 20, 12.5};  // the slab-lens study's cells: ratios 1.25 and 1.6
  for (double p : {1.0, 1.5, 2.0, 3.0}) {
    std::vector<double> f;
    for (double x : h) f.push_back(1.04 - 7e-5 * std::pow(x, p));
    const auto e = richardson_cells(h, f);
    REQUIRE(e);
    CHECK(e->order_observed);
    CHECK(e->order == doctest::Approx(p).epsilon(1e-9));
    CHECK(e->value == doctest::Approx(1.04).epsilon(1e-12));
    CHECK(e->error >= std::abs(f.back() - 1.04));
  }
  // a constant ratio gives the closed form of richardson()
  const std::vector<double> g{3.7, 3.175, 3.04375};
  const auto by_r = richardson(g), by_h = richardson_cells({1.0, 0.5, 0.25}, g);
  REQUIRE(by_r);
  REQUIRE(by_h);
  CHECK(by_h->order == doctest::Approx(by_r->order).epsilon(1e-9));
  CHECK(by_h->value == doctest::Approx(by_r->value).epsilon(1e-12));
  CHECK(!richardson_cells({1.0, 0.5}, {1.0, 2.0}));           // two grids
  CHECK(!richardson_cells({0.5, 1.0, 0.25}, {1.0, 2.0, 3.0}));  // cells not falling
  CHECK(!richardson_cells(h, {1.0, 2.0, 1.5})->monotone);
}

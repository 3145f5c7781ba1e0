/// \file test_auto_stop_resume.cpp
/// \brief A self-stopping run (`stop: auto`) saved to a checkpoint between two of its
/// checks and resumed decides at the same step, with the same bits, as one that ran
/// through: the rule's state (peak energy, last signatures) travels in the checkpoint.
/// (Common practice for restartable solvers: a restart must not change the answer.)
#include <doctest/doctest.h>

#include <cstring>
#include <filesystem>

#include "io/run/checkpoint.h"
#include "solver/simulation.h"
#include "tests/helpers.h"

namespace fs = std::filesystem;
using namespace ty;

namespace {

Scene pulsed_auto() {
  Scene s = test::box_scene(60, 40, 10e-6, Boundary::absorbing, Boundary::absorbing, 0.9, 200e-12);
  s.time.auto_stop.on = true;
  s.sources.push_back(test::point_source(Component::Ez, {200e-6, 200e-6}, 1.0e12, 0.4e-12, 1.5e-12, 1.0));
  Output o;
  o.kind = Output::Kind::power_spectrum;
  o.name = "line";
  o.from = {450e-6, 50e-6};
  o.to = {450e-6, 350e-6};
  o.band_from = 0.5e12;
  o.band_to = 1.5e12;
  o.count = 11;
  s.outputs.push_back(o);
  return s;
}

long finish(Simulation<double>& sim) {
  while (sim.steps_done() < sim.total_steps()) {
    sim.advance();
    if (sim.settled()) break;
  }
  return sim.steps_done();
}

}  // namespace

TEST_CASE("stop: auto resumed from a checkpoint stops at the same step with the same bits") {
  const Scene scene = pulsed_auto();
  Simulation<double> through(scene, 2);
  const long end = finish(through);
  REQUIRE(through.stop_rule().done());
  const long check = through.stop_rule().plan().check;
  REQUIRE(end > 3 * check);  // the save below falls between checks, after several of them

  const std::string path = (fs::temp_directory_path() / "terayee-test-auto-stop.h5").string();
  const std::string yaml = "title: auto stop\n";
  Simulation<double> first(scene, 1);
  const long save_at = 2 * check + check / 2;
  while (first.steps_done() < save_at) {
    first.advance();
    REQUIRE_FALSE(first.settled());
  }
  save_checkpoint(path, first, yaml);
  Simulation<double> resumed(scene, 1);
  load_checkpoint(path, resumed, yaml);
  fs::remove(path);
  CHECK(finish(resumed) == end);
  CHECK(resumed.stop_rule().done());
  CHECK(resumed.stop_rule().checks() == through.stop_rule().checks());
  const auto& a = through.power_spectra()[0].acc;
  const auto& b = resumed.power_spectra()[0].acc;
  REQUIRE(a.size() == b.size());
  CHECK(std::memcmp(a.data(), b.data(), a.size() * sizeof(a[0])) == 0);
  CHECK(resumed.stop_rule().largest_change() == through.stop_rule().largest_change());
  CHECK(resumed.stop_rule().energy_fraction() == through.stop_rule().energy_fraction());
}

/// \file test_thread_count.cpp
/// \brief The default thread count: never more than the cores this process may use, one
/// thread for a grid too small to keep two busy between synchronisations.
#include <doctest/doctest.h>
#include <sched.h>

#include "solver/simulation.h"
#include "solver/threads/thread_count.h"
#include "tests/helpers.h"

using namespace ty;

TEST_CASE("usable cores: at least one, at most the affinity mask (sched_getaffinity, POSIX/Linux)") {
  cpu_set_t set;
  CPU_ZERO(&set);
  REQUIRE(sched_getaffinity(0, sizeof(set), &set) == 0);
  const int cores = usable_cores();
  CHECK(cores >= 1);
  CHECK(cores <= CPU_COUNT(&set));
}

TEST_CASE("threads fitted to the work: one for a small grid, all cores for a large one") {
  CHECK(threads_for_work(248.0 * 8, 8) == 1);  // a quasi-1D scene
  CHECK(threads_for_work(0, 4) == 1);
  CHECK(threads_for_work(2 * kCellsPerThread, 8) == 2);
  CHECK(threads_for_work(4096.0 * 4096, 2) == 2);
  CHECK(threads_for_work(4096.0 * 4096, 1) == 1);
}

TEST_CASE("a small scene left to choose runs on one thread, and an explicit count is kept") {
  Scene s = test::box_scene(64, 8, 10e-6, Boundary::periodic, Boundary::periodic, 0.9, 1e-12);
  s.time.threads = 0;  // auto
  CHECK(Simulation<double>(s).threads() == 1);
  CHECK(Simulation<double>(s, 2).threads() == 2);
  s.time.threads = 3;
  CHECK(Simulation<double>(s).threads() == 3);
}

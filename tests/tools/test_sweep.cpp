/// \file test_sweep.cpp
/// \brief `terayee sweep` end to end on a short Airy-slab scene: three points, one shared
/// reference run, the results table, resume by skipping finished points, and the Slurm
/// job-array script's content (sbatch's documented #SBATCH --array/--cpus-per-task form).
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include "tests/helpers.h"

namespace fs = std::filesystem;
using ty::test::shell;

namespace {
std::string slurp(const fs::path& p) { return ty::test::read_text(p.string()); }
}  // namespace

TEST_CASE("sweep: three points, one reference, one table, and a second call runs nothing") {
  const fs::path dir = fs::temp_directory_path() / "terayee-test-sweep";
  fs::remove_all(dir);
  const std::string base = std::string(TERAYEE_BINARY) + " sweep " + TERAYEE_SOURCE_DIR +
                           "/tests/data/slab-airy.yaml -o " + dir.string() +
                           " --vary 'media.slab.permittivity=2:4:3' --set 'time.stop=20 ps'"
                           " --measure 'spectrum --reference auto' --jobs 2";
  REQUIRE(shell("( " + base + " 2> " + dir.string() + ".log )") == 0);
  const auto csv = slurp(dir / "results.csv");
  CHECK(csv.find("0000_media.slab.permittivity=2,done,2,") != std::string::npos);
  CHECK(csv.find("0002_media.slab.permittivity=4,done,4,") != std::string::npos);
  // the slab is the sample: every point shares one reference run (the permittivity of a
  // medium that no remaining body holds changes nothing)
  int refs = 0;
  for (const auto& e : fs::directory_iterator(dir / "references")) refs += e.is_directory();
  CHECK(refs == 1);
  CHECK(fs::exists(dir / "points" / "0001_media.slab.permittivity=3" / "spectrum.json"));
  REQUIRE(shell("( " + base + " 2> " + dir.string() + ".log )") == 0);
  CHECK(slurp(dir.string() + ".log").find("(0 to run)") != std::string::npos);
  fs::remove(dir.string() + ".log");
  // a point that failed before its first checkpoint leaves a non-empty folder: the next call
  // runs it again (--overwrite) instead of being refused by `run`'s folder rule
  const fs::path p1 = dir / "points" / "0001_media.slab.permittivity=3";
  fs::remove(p1 / "summary.json");
  fs::remove(p1 / "checkpoint.h5");
  REQUIRE(shell(base) == 0);
  CHECK(fs::exists(p1 / "summary.json"));
  // another sweep into the same folder is refused (exit 2), nothing is overwritten
  CHECK(shell(std::string(TERAYEE_BINARY) + " sweep " + TERAYEE_SOURCE_DIR + "/tests/data/slab-airy.yaml -o " +
              dir.string() + " --vary 'media.slab.permittivity=5,6' > /dev/null 2>&1") == 2);
  fs::remove_all(dir);
}

TEST_CASE("sweep --print-job-script: one Slurm array task per point with the cores asked for") {
  const fs::path dir = fs::temp_directory_path() / "terayee-test-sweep-slurm";
  fs::remove_all(dir);
  REQUIRE(shell(std::string(TERAYEE_BINARY) + " sweep " + TERAYEE_SOURCE_DIR + "/tests/data/slab-airy.yaml -o " +
                dir.string() + " --vary 'sources.0.plane.frequency=0.5THz:0.7THz:5' --measure 'spectrum --reference auto' --threads 8"
                               " --time-limit 02:00:00 --print-job-script"
                               " > /dev/null 2>&1") == 0);
  const auto job = slurp(dir / "job.sh");
  CHECK(job.rfind("#!/bin/bash\n", 0) == 0);
  CHECK(job.find("#SBATCH --array=0-4\n") != std::string::npos);
  CHECK(job.find("#SBATCH --cpus-per-task=8\n") != std::string::npos);
  CHECK(job.find("#SBATCH --time=02:00:00\n") != std::string::npos);
  CHECK(job.find("--point \"$SLURM_ARRAY_TASK_ID\"") != std::string::npos);
  CHECK(job.find("--vary 'sources.0.plane.frequency=0.5THz:0.7THz:5'") != std::string::npos);
  // a task refuses a sweep folder whose sweep.json differs from its own: the measurements
  // are part of it (found by tools/slurm-check.sh on a real Slurm)
  CHECK(job.find("--measure 'spectrum --reference auto'") != std::string::npos);
  CHECK(fs::is_empty(dir / "points"));  // nothing ran
  fs::remove_all(dir);
}

TEST_CASE("sweep --point and --collect: the array tasks' flow by hand, then one table with every point") {
  // what each Slurm array task runs (job.sh: --point $SLURM_ARRAY_TASK_ID), then --collect,
  // which makes the reference run and the measurements (docs/sweeps.md)
  const fs::path dir = fs::temp_directory_path() / "terayee-test-sweep-points";
  fs::remove_all(dir);
  const std::string base = std::string(TERAYEE_BINARY) + " sweep " + TERAYEE_SOURCE_DIR +
                           "/tests/data/slab-airy.yaml -o " + dir.string() +
                           " --vary 'media.slab.permittivity=2:4:3' --set 'time.stop=20 ps'"
                           " --measure 'spectrum --reference auto' --threads 1";
  for (int k = 0; k < 3; ++k) REQUIRE(shell(base + " --point " + std::to_string(k) + " > /dev/null 2>&1") == 0);
  CHECK(!fs::exists(dir / "results.csv"));  // the tasks make no table and no reference
  CHECK(!fs::exists(dir / "references" / "ref-000"));
  REQUIRE(shell(std::string(TERAYEE_BINARY) + " sweep --collect " + dir.string() + " > /dev/null 2>&1") == 0);
  const auto csv = slurp(dir / "results.csv");
  for (const char* row : {"0000_media.slab.permittivity=2,done,", "0001_media.slab.permittivity=3,done,",
                          "0002_media.slab.permittivity=4,done,"})
    CHECK(csv.find(row) != std::string::npos);
  CHECK(fs::exists(dir / "points" / "0002_media.slab.permittivity=4" / "spectrum.json"));
  fs::remove_all(dir);
}

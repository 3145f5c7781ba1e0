/// \file test_run_folder_damage.cpp
/// \brief A run folder read back from disk is input (the run-folder fuzzer's findings,
/// tests/fuzz/fuzz_run_folder.cpp): a stopped run whose partial results lost a snapshot
/// series is refused on `--resume` as bad input (exit 2, naming the dataset), not run on
/// until a frame write fails as if the disk were full (exit 1), and its checkpoint is kept
/// (docs/runs.md: nothing is deleted except on success); a power-spectrum line whose fields
/// are missing or misshapen is bad input, not an HDF5 failure or a read past its end.
#include <doctest/doctest.h>
#include <sys/wait.h>
#include <unistd.h>

#include <filesystem>
#include <string>

#include "io/analysis/power_spectrum_line.h"
#include "io/run/hdf5_file.h"
#include "io/scene/diagnostics.h"
#include "tests/tools/capture.h"

namespace fs = std::filesystem;

TEST_CASE("run --resume: partial results missing a snapshot series are bad input (exit 2), the checkpoint kept") {
  const fs::path dir = fs::temp_directory_path() / ("terayee-damage-" + std::to_string(getpid()));
  fs::remove_all(dir);
  const std::string run = std::string(TERAYEE_BINARY) + " run '" + TERAYEE_SOURCE_DIR + "/tests/fuzz/run/seed.yaml' -o '" +
                          dir.string() + "' --quiet";
  REQUIRE(std::system((run + " --stop-at-step 40 > /dev/null 2>&1").c_str()) == 0);
  REQUIRE(fs::exists(dir / "checkpoint.h5"));
  {
    ty::h5::File f = ty::h5::File::open_rw((dir / "fields.h5.partial").string());
    f.remove("/snapshots/Ez");
  }
  const std::string out = ty::test::capture(run + " --resume 2>&1; echo \"exit=$?\"");
  INFO(out);
  CHECK(out.find("exit=2") != std::string::npos);
  CHECK(out.find("/snapshots/Ez") != std::string::npos);
  CHECK(out.find("disk") == std::string::npos);
  CHECK(fs::exists(dir / "checkpoint.h5"));
  fs::remove_all(dir);
}

TEST_CASE("power-spectrum lines read back: a missing or misshapen fields dataset is bad input, not an HDF5 failure") {
  const fs::path dir = fs::temp_directory_path() / ("terayee-damage-line-" + std::to_string(getpid()));
  fs::remove_all(dir);
  const std::string run = std::string(TERAYEE_BINARY) + " run '" + TERAYEE_SOURCE_DIR + "/tests/fuzz/run/seed.yaml' -o '" +
                          dir.string() + "' --quiet > /dev/null 2>&1";
  REQUIRE(std::system(run.c_str()) == 0);
  const std::string file = (dir / "fields.h5").string();
  CHECK(ty::read_power_spectrum_line(dir.string(), "line").freq.size() == 5);  // the seed's count
  {
    ty::h5::File f = ty::h5::File::open_rw(file);
    f.remove("/power-spectra/line/fields/imag");
  }
  CHECK_THROWS_AS(ty::read_power_spectrum_line(dir.string(), "line"), ty::BadInput);
  {  // imag back with one frequency too few: line_power would read past its end
    ty::h5::File f = ty::h5::File::open_rw(file);
    const std::vector<hsize_t> shape = f.shape("/power-spectra/line/fields/real");
    const std::vector<double> zeros((shape[0] - 1) * shape[1] * shape[2], 0.0);
    f.write("/power-spectra/line/fields/imag", {shape[0] - 1, shape[1], shape[2]}, zeros.data(), "");
  }
  CHECK_THROWS_AS(ty::read_power_spectrum_line(dir.string(), "line"), ty::BadInput);
  fs::remove_all(dir);
}

/// \file test_run_blocked.cpp
/// \brief `terayee run` with temporal blocking (the default, `--block-depth auto`) writes the
/// same bits as one pass per step (`--block-depth 1`), end to end through the run folder: a
/// beam scene whose only recorder is a spectral map, so its blocks really span many steps,
/// the log saying so; and a magnetic plate with probes and power-spectrum lines, whose
/// recorders now run inside the blocks. (Common practice for reordered stencil sweeps, Wellein et al. 2009:
/// a temporal-blocking schedule changes the order of the updates, never their values.)
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "io/run/hdf5_file.h"
#include "tests/helpers.h"

namespace fs = std::filesystem;
using namespace ty;

namespace {

/// The scene run twice: blocked (auto depth, 2 threads) into the first folder and one pass per
/// step (1 thread) into the second; the blocked run's log.
std::string run_both(const std::string& scene, const fs::path& a, const fs::path& b) {
  fs::remove_all(a);
  fs::remove_all(b);
  REQUIRE(test::shell(std::string(TERAYEE_BINARY) + " run '" + scene + "' -o '" + a.string() + "' --quiet --threads 2") == 0);
  REQUIRE(test::shell(std::string(TERAYEE_BINARY) + " run '" + scene + "' -o '" + b.string() +
                      "' --quiet --threads 1 --block-depth 1") == 0);
  std::stringstream log;
  log << std::ifstream(a / "log.txt").rdbuf();
  return log.str();
}

}  // namespace

TEST_CASE("run: blocked (auto) and one pass per step write the same bits, and the log names the depth") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/cw-beam.yaml";
  const fs::path a = fs::temp_directory_path() / "terayee-test-blocked", b = fs::temp_directory_path() / "terayee-test-one-pass";
  const std::string log = run_both(scene, a, b);
  INFO(log);
  CHECK(log.find("time blocking: 16 steps per pass") != std::string::npos);  // it did block
  const auto fa = h5::File::open((a / "fields.h5").string()), fb = h5::File::open((b / "fields.h5").string());
  for (const char* d : {"/spectral-maps/steady/Ez/real", "/spectral-maps/steady/Ez/imag", "/spectral-maps/steady/Sx/real",
                        "/spectral-maps/steady/Sy/imag"}) {
    INFO(d);
    const auto x = fa.read(d), y = fb.read(d);
    REQUIRE(x.size() == y.size());
    REQUIRE(x.size() > 1000);
    double peak = 0;
    for (double v : x) peak = std::max(peak, std::abs(v));
    CHECK(peak > 0);  // a map with a beam in it, not zeros compared with zeros
    CHECK(std::memcmp(x.data(), y.data(), x.size() * sizeof(double)) == 0);
  }
  fs::remove_all(a);
  fs::remove_all(b);
}

TEST_CASE("run: a magnetic scene with probes and power-spectrum lines, blocked (auto) and one pass, same bits") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/mnf2-open.yaml";
  const fs::path a = fs::temp_directory_path() / "terayee-test-blocked-mag", b = fs::temp_directory_path() / "terayee-test-one-pass-mag";
  const std::string log = run_both(scene, a, b);
  INFO(log);
  CHECK(log.find("steps per pass over the rows (auto); probes and power spectra record inside the blocks") !=
        std::string::npos);  // it did block, recorders and all
  const auto fa = h5::File::open((a / "fields.h5").string()), fb = h5::File::open((b / "fields.h5").string());
  for (const char* d : {"/probes/inside/Ez", "/probes/inside/Hx", "/probes/inside/Mx", "/probes/inside/Ly",
                        "/probes/detector/Ez", "/probes/detector/Sx", "/power-spectra/across/power",
                        "/power-spectra/along/power"}) {
    INFO(d);
    const auto x = fa.read(d), y = fb.read(d);
    REQUIRE(x.size() == y.size());
    REQUIRE(x.size() > 10);
    double peak = 0;
    for (double v : x) peak = std::max(peak, std::abs(v));
    CHECK(peak > 0);  // a signal, not zeros compared with zeros
    CHECK(std::memcmp(x.data(), y.data(), x.size() * sizeof(double)) == 0);
  }
  fs::remove_all(a);
  fs::remove_all(b);
}

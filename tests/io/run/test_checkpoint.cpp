/// \file test_checkpoint.cpp
/// \brief A checkpoint read back is input. Corrupted in several ways (a clock of -1e8, a
/// half step, frames that do not match the clock, a dataset of the wrong length, a NaN,
/// a missing dataset, a scene that is not text), it is refused with BadInput naming the
/// dataset, and the simulation is left untouched. A scene larger than the 64 KB an HDF5
/// attribute holds in a default-format file (HDF5 User's Guide, "Attributes") is saved
/// and checked like any other.
#include <doctest/doctest.h>

#include <cmath>
#include <cstring>
#include <filesystem>
#include <limits>

#include "io/run/checkpoint.h"
#include "io/run/hdf5_file.h"
#include "io/scene/diagnostics.h"
#include "solver/simulation.h"
#include "tests/helpers.h"

namespace fs = std::filesystem;
using namespace ty;

namespace {

Scene small_scene() {
  Scene s = test::box_scene(24, 20, 10e-6, Boundary::absorbing, Boundary::electric_wall, 0.9, 0.5e-12);
  s.sources.push_back(test::point_source(Component::Ez, {120e-6, 100e-6}, 1.0e12, 0.3e-12, 0.2e-12, 1.0));
  return s;
}

void replace(const std::string& path, const std::string& dataset, const std::vector<double>& values) {
  h5::File f = h5::File::open_rw(path);
  H5Ldelete(f.id(), dataset.c_str(), H5P_DEFAULT);
  if (!values.empty()) f.write(dataset, {values.size()}, values.data(), "");
}

std::string load_error(const std::string& path, const Scene& scene, const std::string& yaml) {
  Simulation<double> sim(scene, 1);
  try {
    load_checkpoint(path, sim, yaml);
  } catch (const BadInput& e) {
    CHECK(sim.steps_done() == 0);  // nothing was loaded
    return e.what();
  }
  return "";
}

}  // namespace

TEST_CASE("a corrupted checkpoint is refused with the dataset named, never trusted") {
  const Scene scene = small_scene();
  const std::string path = (fs::temp_directory_path() / "terayee-test-checkpoint.h5").string();
  const std::string yaml = "title: " + std::string(100000, 'a') + "\n";  // 100 KB resolved scene
  Simulation<double> sim(scene, 1);
  for (int n = 0; n < 20; ++n) sim.advance();
  save_checkpoint(path, sim, yaml);
  CHECK_FALSE(fs::exists(path + ".tmp"));

  Simulation<double> back(scene, 1);
  load_checkpoint(path, back, yaml);
  CHECK(back.steps_done() == 20);
  CHECK(load_error(path, scene, yaml + " ").find("another scene") != std::string::npos);

  const std::string copy = path + ".corrupt.h5";
  const auto corrupt = [&](const std::string& dataset, const std::vector<double>& v) {
    fs::copy_file(path, copy, fs::copy_options::overwrite_existing);
    replace(copy, dataset, v);
    return load_error(copy, scene, yaml);
  };
  const double nan = std::numeric_limits<double>::quiet_NaN();
  CHECK(corrupt("/clock/steps", {-1e8}).find("/clock/steps: -1e+08 is not a step") != std::string::npos);
  CHECK(corrupt("/clock/steps", {10.5}).find("/clock/steps") != std::string::npos);
  CHECK(corrupt("/clock/steps", {1e12}).find("/clock/steps") != std::string::npos);
  CHECK(corrupt("/clock/frames", {3}).find("/clock/frames") != std::string::npos);  // no snapshots in this scene
  CHECK(corrupt("/fields/Ez", {1, 2, 3}).find("/fields/Ez: has shape [3]") != std::string::npos);
  CHECK(corrupt("/fields/Hx", {}).find("/fields/Hx: missing") != std::string::npos);
  {
    std::vector<double> ez = h5::File::open(path).read("/fields/Ez");
    ez[7] = nan;
    CHECK(corrupt("/fields/Ez", ez).find("/fields/Ez: value 7 is nan") != std::string::npos);
  }
  CHECK(corrupt("/scene", {1, 2}).find("/scene: is not text") != std::string::npos);
  fs::remove(copy);
  fs::remove(path);
}

/// \file test_run_folder.cpp
/// \brief End to end: `terayee run` on the bundled scene writes the run folder of
/// scene-format.md (HDF5 with units on every dataset, XDMF, summary, log, resolved
/// scene); the resolved scene reads back to the same scene; a stopped run leaves no
/// results behind.
#include <doctest/doctest.h>
#include <sys/wait.h>

#include <array>
#include <csignal>
#include <cstring>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "io/run/hdf5_file.h"
#include "io/scene/scene_reader.h"
#include "io/scene/scene_writer.h"

#include "tests/helpers.h"

namespace fs = std::filesystem;
using namespace ty;

namespace {

using ty::test::shell;

std::string slurp(const fs::path& p) { return ty::test::read_text(p.string()); }

}  // namespace

TEST_CASE("a run folder holds self-describing HDF5, XDMF, summary, log and the resolved scene") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/window-beam.yaml";
  const fs::path dir = fs::temp_directory_path() / "terayee-test-run";
  fs::remove_all(dir);
  REQUIRE(shell(std::string(TERAYEE_BINARY) + " run '" + scene + "' -o '" + dir.string() +
                "' --threads 2 --set time.stop=6ps --set outputs.0.snapshots.every=2ps") == 0);
  for (auto f : {"scene.yaml", "fields.h5", "fields.xmf", "summary.json", "log.txt"}) CHECK(fs::exists(dir / f));
  CHECK_FALSE(fs::exists(dir / "fields.h5.partial"));

  const auto summary = nlohmann::json::parse(slurp(dir / "summary.json"));
  CHECK(summary["completed"] == true);
  CHECK(summary["cell-updates-per-s"].get<double>() > 0);
  const long steps = summary["steps"];
  const double dt = summary["time-step-s"];
  CHECK(steps * dt == doctest::Approx(6e-12).epsilon(dt / 6e-12 + 1e-9).scale(0));

  const auto h = h5::File::open((dir / "fields.h5").string());
  std::vector<hsize_t> shape;
  const auto times = h.read("/snapshots/time", &shape);
  REQUIRE(times.size() == 3);  // 2, 4, 6 ps
  CHECK(times[0] == doctest::Approx(2e-12).epsilon(dt / 2e-12).scale(0));
  for (const char* f : {"Ez", "Hx", "Hy"}) {
    const std::string name = f;
    const auto x = h.read("/grid/" + name + "/x"), y = h.read("/grid/" + name + "/y");
    h.read("/snapshots/" + name, &shape);
    REQUIRE(shape.size() == 3);
    CHECK(shape[0] == 3);
    CHECK(shape[1] == y.size());
    CHECK(shape[2] == x.size());
    CHECK(h.read_attribute("/snapshots/" + name, "units") == (name[0] == 'E' ? "V/m" : "A/m"));
    CHECK(h.read_attribute("/grid/" + name + "/x", "units") == "m");
    // stride 2 over a 6 mm extent centred on the origin
    CHECK(x.front() >= -3e-3 - 1e-12);
    CHECK(x.back() <= 3e-3 + 1e-12);
    CHECK(x[1] - x[0] == doctest::Approx(40e-6));
  }
  // Hx sits half a cell above Ez (its own staggered position)
  CHECK(h.read("/grid/Hx/y")[0] - h.read("/grid/Ez/y")[0] == doctest::Approx(10e-6).scale(0));
  const auto ez = h.read("/snapshots/Ez");
  double peak = 0;
  for (double v : ez) peak = std::max(peak, std::abs(v));
  CHECK(peak > 100);   // the 1 kV/m beam is in the grid
  CHECK(peak < 3000);  // and nothing blew up
  const auto medium = h.read("/grid/medium", &shape);
  CHECK(shape == std::vector<hsize_t>{200, 300});
  CHECK(std::count(medium.begin(), medium.end(), 0.0) > 1000);  // the window
  CHECK(h.read("/probes/behind-window/Ez").size() == static_cast<size_t>(steps));
  CHECK(h.read_attribute("/probes/behind-window/Sx", "units") == "W/m^2");
  CHECK(h.read_attribute("/probes/behind-window/time", "units") == "s");

  const std::string xmf = slurp(dir / "fields.xmf");
  CHECK(xmf.find("fields.h5:/frames/0/Ez") != std::string::npos);
  CHECK(xmf.find("CollectionType=\"Temporal\"") != std::string::npos);
  CHECK(xmf.find("2DRectMesh") != std::string::npos);

  // the resolved scene is a valid scene and reads back to the same values
  const Scene a = read_scene(scene, {"time.stop=6ps"});
  const Scene b = read_scene((dir / "scene.yaml").string());
  CHECK(b.grid.dx == doctest::Approx(a.grid.dx));
  CHECK(b.time.stop == doctest::Approx(a.time.stop).scale(0));
  CHECK(b.sources.at(0).waist == doctest::Approx(a.sources.at(0).waist));
  CHECK(b.sources.at(0).waveform.ramp == doctest::Approx(a.sources.at(0).waveform.ramp).scale(0));
  CHECK(b.bodies.at(0).shape.rotate == doctest::Approx(a.bodies.at(0).shape.rotate));
  CHECK(b.bodies.at(0).shape.centre.x == doctest::Approx(a.bodies.at(0).shape.centre.x));
  CHECK(b.outputs.size() == a.outputs.size());
  fs::remove_all(dir);
}

TEST_CASE("a run stopped by a signal leaves no results, only a checkpoint to resume from") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/window-beam.yaml";
  const fs::path dir = fs::temp_directory_path() / "terayee-test-stopped";
  fs::remove_all(dir);
  // SIGINT once the run has begun stepping (its log names the grid; a fixed delay lost the race
  // on a loaded machine or in the sanitizer build, whose start-up took longer than it)
  const std::string log = (dir / "log.txt").string();
  const int rc = shell("sh -c '" + std::string(TERAYEE_BINARY) + " run \"" + scene + "\" -o \"" + dir.string() +
                       "\" --set time.stop=20ns & p=$!; i=0; while [ $i -lt 1200 ] && ! grep -q \"^grid \" \"" + log +
                       "\" 2>/dev/null; do sleep 0.05; i=$((i+1)); done; sleep 0.5; kill -INT $p; wait $p'");
  CHECK(rc == 128 + SIGINT);  // stopped by a signal: the shell's 128 + n, after the checkpoint
  CHECK_FALSE(fs::exists(dir / "fields.h5"));
  CHECK_FALSE(fs::exists(dir / "summary.json"));
  CHECK(fs::exists(dir / "checkpoint.h5"));
  // a resume with another scene is refused
  CHECK(shell(std::string(TERAYEE_BINARY) + " run '" + scene + "' -o '" + dir.string() +
              "' --set time.stop=21ns --resume") == 2);
  fs::remove_all(dir);
}

TEST_CASE("a stopped and resumed run gives the same bits as one that ran straight through") {
  // the MnF2 scene: fields, absorber, magnetic state and recorders all go through the checkpoint
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/mnf2-mirror.yaml";
  const std::string sets = " --threads 2 --set time.stop=60ps --set outputs.2.snapshots.every=20ps";
  const fs::path a = fs::temp_directory_path() / "terayee-test-straight", b = fs::temp_directory_path() / "terayee-test-resumed";
  fs::remove_all(a);
  fs::remove_all(b);
  REQUIRE(shell(std::string(TERAYEE_BINARY) + " run '" + scene + "' -o '" + a.string() + "'" + sets) == 0);
  CHECK(shell(std::string(TERAYEE_BINARY) + " run '" + scene + "' -o '" + b.string() + "'" + sets + " --stop-at-step 977") == 0);  // a stop asked for
  CHECK_FALSE(fs::exists(b / "fields.h5"));
  REQUIRE(shell(std::string(TERAYEE_BINARY) + " run '" + scene + "' -o '" + b.string() + "'" + sets + " --resume") == 0);
  CHECK_FALSE(fs::exists(b / "checkpoint.h5"));
  const auto fa = h5::File::open((a / "fields.h5").string()), fb = h5::File::open((b / "fields.h5").string());
  for (const char* d : {"/probes/in-front/Ez", "/probes/in-front/Sx", "/probes/inside/Lx", "/probes/inside/My",
                        "/snapshots/Ez", "/snapshots/Lx", "/snapshots/Mx", "/snapshots/time"}) {
    INFO(d);
    const auto x = fa.read(d), y = fb.read(d);
    REQUIRE(x.size() == y.size());
    CHECK(std::memcmp(x.data(), y.data(), x.size() * sizeof(double)) == 0);
  }
  fs::remove_all(a);
  fs::remove_all(b);
}

TEST_CASE("--set overrides any scene value and is checked like the file") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/window-beam.yaml";
  const Scene s = read_scene(scene, {"sources.0.beam.angle=10 deg", "grid.cell=25 um"});
  CHECK(s.sources.at(0).angle == doctest::Approx(10 * 3.14159265358979 / 180));
  CHECK(s.grid.dx == doctest::Approx(25e-6));
  CHECK_THROWS_AS(read_scene(scene, {"time.stop=5"}), BadInput);
  CHECK_THROWS_AS(read_scene(scene, {"sources.7.beam.angle=1 deg"}), BadInput);
  CHECK_THROWS_AS(read_scene(scene, {"nonsense"}), BadInput);
}

TEST_CASE("magnetic outputs: the Neel vector and magnetization in probes and snapshots") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/mnf2-mirror.yaml";
  const fs::path dir = fs::temp_directory_path() / "terayee-test-magnet-run";
  fs::remove_all(dir);
  REQUIRE(shell(std::string(TERAYEE_BINARY) + " run '" + scene + "' -o '" + dir.string() +
                "' --threads 2 --set time.stop=80ps --set outputs.2.snapshots.every=40ps") == 0);
  const auto h = h5::File::open((dir / "fields.h5").string());
  const auto lx = h.read("/probes/inside/Lx"), mx = h.read("/probes/inside/Mx");
  CHECK(h.read_attribute("/probes/inside/Lx", "units") == "1");
  CHECK(h.read_attribute("/probes/inside/Mx", "units") == "T");
  REQUIRE(!lx.empty());
  CHECK(std::abs(lx.front()) < 1e-12);  // the ground state: L along z
  double peak = 0;
  for (double v : lx) peak = std::max(peak, std::abs(v));
  CHECK(peak > 1e-9);   // the pulse tilts the sublattices (a 1 kV/m wave: ~1e-7 rad in MnF2)
  CHECK(peak < 1e-3);
  std::vector<hsize_t> shape;
  const auto snap = h.read("/snapshots/Lx", &shape);
  REQUIRE(shape.size() == 3);
  CHECK(shape[0] == 2);
  CHECK(h.read("/grid/Lx/x").size() == shape[2]);
  // outside the crystal the magnetic fields are zero; inside they move
  double outside = 0, inside = 0;
  const auto x = h.read("/grid/Lx/x");
  for (size_t k = 0; k < snap.size(); ++k) {
    const double xv = x[k % shape[2]];
    (xv < 0.9e-3 ? outside : inside) = std::max(xv < 0.9e-3 ? outside : inside, std::abs(snap[k]));
  }
  CHECK(outside == 0.0);
  CHECK(inside > 0.0);
  fs::remove_all(dir);
}

TEST_CASE("the resolved scene keeps every magnet parameter (a run's scene.yaml reads back to the same crystal)") {
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/mnf2-mirror.yaml";
  // add a Dzyaloshinskii field and a second anisotropy term, so every key is exercised
  const Scene a = read_scene(scene, {"media.mnf2.magnet.dzyaloshinskii=[0, 0.1 T, 0]",
                                     "media.mnf2.magnet.anisotropy.0.axis=[0.6, 0, 0.8]"});
  const Scene b = read_scene_text(resolved_scene_yaml(a), "resolved.yaml");
  REQUIRE(b.media.at(0).magnet.has_value());
  const Magnet &ma = *a.media.at(0).magnet, &mb = *b.media.at(0).magnet;
  REQUIRE(mb.sublattices.size() == 2);
  for (int k = 0; k < 2; ++k) {
    CHECK(mb.sublattices[k].saturation == ma.sublattices[k].saturation);
    CHECK(mb.sublattices[k].g == ma.sublattices[k].g);
    CHECK(mb.sublattices[k].damping == ma.sublattices[k].damping);
  }
  CHECK(mb.lambda == ma.lambda);
  REQUIRE(mb.anisotropy.size() == ma.anisotropy.size());
  CHECK(mb.anisotropy[0].field == ma.anisotropy[0].field);
  for (int c = 0; c < 3; ++c) {
    CHECK(mb.anisotropy[0].axis[c] == doctest::Approx(ma.anisotropy[0].axis[c]).epsilon(1e-15));
    CHECK(mb.dzyaloshinskii[c] == ma.dzyaloshinskii[c]);
    CHECK(mb.order[c] == doctest::Approx(ma.order[c]).epsilon(1e-15));
  }
  CHECK(mb.dzyaloshinskii[1] == doctest::Approx(0.1));
}

TEST_CASE("the resolved scene keeps power-spectrum lines, spectral maps and line probes (a run's scene.yaml reads back to the same outputs)") {
  for (const char* file : {"/tests/data/mnf2-slab.yaml", "/scenarios/slab-lens/slab-lens.yaml",
                           "/scenarios/tds-mnf2-slab/tds-mnf2-slab.yaml"}) {
    const Scene a = read_scene(std::string(TERAYEE_SOURCE_DIR) + file);
    const Scene b = read_scene_text(resolved_scene_yaml(a), "resolved.yaml");
    REQUIRE(b.outputs.size() == a.outputs.size());
    for (size_t k = 0; k < a.outputs.size(); ++k) {
      const Output &x = a.outputs[k], &y = b.outputs[k];
      CHECK(y.kind == x.kind);
      CHECK(y.name == x.name);
      CHECK(y.fields == x.fields);
      CHECK(y.over_line == x.over_line);  // a finite detector stayed a line (it was written as a point once)
      CHECK(y.at.x == doctest::Approx(x.at.x).epsilon(1e-12));
      CHECK(y.at.y == doctest::Approx(x.at.y).epsilon(1e-12));
      CHECK(y.from.x == doctest::Approx(x.from.x).epsilon(1e-12));
      CHECK(y.from.y == doctest::Approx(x.from.y).epsilon(1e-12));
      CHECK(y.to.y == doctest::Approx(x.to.y).epsilon(1e-12));
      CHECK(y.band_from == x.band_from);
      CHECK(y.band_to == x.band_to);
      CHECK(y.count == x.count);
      CHECK(y.frequencies == x.frequencies);
      CHECK(y.region.given == x.region.given);
      CHECK(y.region.centre.y == doctest::Approx(x.region.centre.y).epsilon(1e-12));
      CHECK(y.region.size.x == doctest::Approx(x.region.size.x).epsilon(1e-12));
    }
  }
}

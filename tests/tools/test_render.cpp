/// \file test_render.cpp
/// \brief `terayee render`: frames decoded back from PNG (size, the colour of known positive and
/// negative values, body outlines, the time label), the movie as ffprobe sees it, and plots of
/// known curves with the data beside them (the colour maps: tests/io/pictures).
#include <cairo.h>
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <cstdio>
#include <unistd.h>

#include <filesystem>
#include <fstream>
#include <memory>
#include <sstream>

#include "io/pictures/colour_map.h"
#include "io/run/hdf5_file.h"
#include "io/pictures/plot.h"
#include "tests/helpers.h"
#include "tests/tools/capture.h"

namespace fs = std::filesystem;
using namespace ty;
using ty::test::read_json;
using ty::test::shell;

namespace {

const std::string kBinary = TERAYEE_BINARY;

struct Png {
  cairo_surface_t* s = nullptr;
  explicit Png(const std::string& path) : s(cairo_image_surface_create_from_png(path.c_str())) {}
  ~Png() { cairo_surface_destroy(s); }
  bool ok() const { return cairo_surface_status(s) == CAIRO_STATUS_SUCCESS; }
  int width() const { return cairo_image_surface_get_width(s); }
  int height() const { return cairo_image_surface_get_height(s); }
  Rgb at(int x, int y) const {
    const auto* row = cairo_image_surface_get_data(s) + static_cast<size_t>(y) * cairo_image_surface_get_stride(s);
    const uint32_t p = reinterpret_cast<const uint32_t*>(row)[x];
    return {((p >> 16) & 255) / 255.0, ((p >> 8) & 255) / 255.0, (p & 255) / 255.0};
  }
};

double luminance(Rgb c) { return 0.2126 * c.r + 0.7152 * c.g + 0.0722 * c.b; }

using ty::test::capture;

/// A small run of the bundled window scene whose Ez frames are then replaced by a known
/// field: +500 V/m left of x = -1 mm, -500 V/m right of x = 1.6 mm, 0 between (where the
/// tilted window is), the same in all four frames (5 to 20 ps). Its folder is the process's
/// own: ctest -j2 runs the cases that use it side by side, each in its own process.
fs::path known_run() {
  const fs::path dir = fs::temp_directory_path() / ("terayee-test-render-" + std::to_string(::getpid()));
  fs::remove_all(dir);
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/window-beam.yaml";
  REQUIRE(shell(kBinary + " run '" + scene + "' -o '" + dir.string() +
                "' --quiet --threads 2 --set time.stop=20ps --set outputs.0.snapshots.every=5ps") == 0);
  h5::File h = h5::File::open_rw((dir / "fields.h5").string());
  const auto x = h.read("/grid/Ez/x"), y = h.read("/grid/Ez/y");
  std::vector<double> v(x.size() * y.size());
  for (size_t j = 0; j < y.size(); ++j)
    for (size_t i = 0; i < x.size(); ++i) v[j * x.size() + i] = x[i] < -1e-3 ? 500.0 : x[i] > 1.6e-3 ? -500.0 : 0.0;
  for (hsize_t k = 0; k < 4; ++k) h.write_frame("/snapshots/Ez", k, y.size(), x.size(), v.data());
  return dir;
}

/// Pixel of a user-coordinate point, from the layout file written beside the frames.
std::pair<int, int> pixel_of(const nlohmann::json& L, double x, double y) {
  const auto& p = L["panel"];
  const auto& v = L["view-m"];
  const double fx = (x - v["x0"].get<double>()) / (v["x1"].get<double>() - v["x0"].get<double>());
  const double fy = (v["y1"].get<double>() - y) / (v["y1"].get<double>() - v["y0"].get<double>());
  return {static_cast<int>(p["x"].get<int>() + fx * p["width"].get<int>()),
          static_cast<int>(p["y"].get<int>() + fy * p["height"].get<int>())};
}

}  // namespace

TEST_CASE("render: a frame decoded from PNG has the field's colours, the bodies' outlines and its time") {
  const fs::path run = known_run();
  const fs::path out = run / "pictures";
  REQUIRE(shell(kBinary + " render '" + run.string() + "' --field Ez --limits -1000 1000 --size 600") == 0);
  const auto L = read_json((out / "Ez-layout.json").string());
  const std::string f1 = (out / "Ez-0001.png").string(), f2 = (out / "Ez-0002.png").string();
  Png a(f1), b(f2);
  REQUIRE(a.ok());
  REQUIRE(b.ok());
  CHECK(a.width() == L["size"][0].get<int>());
  CHECK(a.height() == L["size"][1].get<int>());
  CHECK(L["panel"]["width"].get<int>() == 600);  // the extent is 6 x 4 mm: the longer side gets --size
  CHECK(a.width() % 2 == 0);
  CHECK(a.height() % 2 == 0);

  // +500 of [-1000, 1000] sits at 3/4 of the diverging map, -500 at 1/4; the orange end is
  // positive, the teal end negative (a diverging map puts the signs on its two hues)
  const ColourMap& map = ColourMap::diverging();
  const auto [px, py] = pixel_of(L, -2.0e-3, 1.0e-3);
  const auto [nx, ny] = pixel_of(L, 2.4e-3, 1.0e-3);
  const Rgb pos = a.at(px, py), neg = a.at(nx, ny);
  CHECK(map.invert(pos) == doctest::Approx(0.75).epsilon(0.03));
  CHECK(map.invert(neg) == doctest::Approx(0.25).epsilon(0.03));
  CHECK(pos.r > pos.b + 0.2);
  CHECK(neg.b > neg.r + 0.2);

  // the window's outline: a dark line through the middle of its long right side
  // (centre (0.6, 0) mm, 0.5 x 3.2 mm, turned 20 deg), but not in the middle of the body
  const double c = std::cos(20 * constants::pi / 180), s = std::sin(20 * constants::pi / 180);
  auto darkest_near = [&](double x, double y) {
    const auto [i, j] = pixel_of(L, x, y);
    double least = 1;
    for (int dj = -2; dj <= 2; ++dj)
      for (int di = -2; di <= 2; ++di) least = std::min(least, luminance(a.at(i + di, j + dj)));
    return least;
  };
  CHECK(darkest_near(0.6e-3 + 0.25e-3 * c, 0.25e-3 * s) < 0.2);
  CHECK(darkest_near(0.6e-3 - 0.25e-3 * c, -0.25e-3 * s) < 0.2);
  CHECK(darkest_near(0.6e-3 - 0.8e-3 * s, 0.8e-3 * c) > 0.6);

  // the time label (above the panel's right end) changes from frame to frame; the field does not
  const int x0 = L["panel"]["x"].get<int>(), w = L["panel"]["width"].get<int>(), top = L["panel"]["y"].get<int>();
  int label_diff = 0, panel_diff = 0;
  for (int j = 20; j < top - 4; ++j)
    for (int i = x0 + w - 160; i < x0 + w; ++i) label_diff += luminance(a.at(i, j)) != luminance(b.at(i, j));
  for (int j = top + 5; j < top + 200; ++j)
    for (int i = x0 + 5; i < x0 + 200; ++i) panel_diff += luminance(a.at(i, j)) != luminance(b.at(i, j));
  CHECK(label_diff > 20);
  CHECK(panel_diff == 0);

  // robust limits: without --limits the 99.5th percentile of |Ez| over the frames is 500
  REQUIRE(shell(kBinary + " render '" + run.string() + "' --field Ez --time 10ps --out '" + (run / "still").string() + "'") == 0);
  const auto L2 = read_json((run / "still" / "Ez-layout.json").string());
  CHECK(L2["limits"][1].get<double>() == doctest::Approx(500));
  CHECK(L2["limits"][0].get<double>() == doctest::Approx(-500));
  int stills = 0;  // named by the frame's own time, within half a step of 10 ps
  for (const auto& e : fs::directory_iterator(run / "still"))
    stills += e.path().filename().string().rfind("Ez-t9.9", 0) == 0 || e.path().filename().string().rfind("Ez-t10", 0) == 0;
  CHECK(stills == 1);

  // a field the run did not record: exit 2, naming what it did record
  const std::string err = (run / "missing-field.txt").string();
  CHECK(std::system((kBinary + " render '" + run.string() + "' --field Mz > '" + err + "' 2>&1").c_str()) != 0);
  std::ifstream in(err);
  const std::string said((std::istreambuf_iterator<char>(in)), std::istreambuf_iterator<char>());
  CHECK(said.find("no snapshots of 'Mz'") != std::string::npos);
  CHECK(said.find("it recorded Ez") != std::string::npos);
  fs::remove_all(run);
}

TEST_CASE("render: the movie is H.264 in yuv420p with every frame, at the frame's size") {
  const fs::path run = known_run();
  const std::string movie = (run / "movie.mp4").string();
  REQUIRE(shell(kBinary + " render '" + run.string() + "' --field Ez --movie '" + movie + "' --fps 10 --size 500") == 0);
  REQUIRE(fs::exists(movie));
  CHECK_FALSE(fs::exists(movie + ".tmp"));
  const auto j = nlohmann::json::parse(capture("ffprobe -v error -select_streams v:0 -count_frames -show_entries "
                                               "stream=codec_name,pix_fmt,width,height,nb_read_frames -of json '" +
                                               movie + "'"));
  const auto& st = j["streams"][0];
  CHECK(st["codec_name"] == "h264");
  CHECK(st["pix_fmt"] == "yuv420p");
  CHECK(st["nb_read_frames"] == "4");
  // the frame the painter makes for a 500 px panel of the 6 x 4 mm extent, as the stills show it
  REQUIRE(shell(kBinary + " render '" + run.string() + "' --field Ez --time 5ps --size 500 --out '" +
                (run / "one").string() + "'") == 0);
  const auto L = read_json((run / "one" / "Ez-layout.json").string());
  CHECK(st["width"].get<int>() == L["size"][0].get<int>());
  CHECK(st["height"].get<int>() == L["size"][1].get<int>());
  // bad input: a movie that is not .mp4 is refused with status 2 and leaves nothing
  CHECK(shell(kBinary + " render '" + run.string() + "' --movie '" + (run / "m.avi").string() + "'") == 2);
  CHECK_FALSE(fs::exists(run / "m.avi"));
  // a still at a time the run did not record (its snapshots end at 20 ps), an old map name
  CHECK(shell(kBinary + " render '" + run.string() + "' --time 1ns --out '" + (run / "late").string() + "'") == 2);
  CHECK_FALSE(fs::exists(run / "late"));
  CHECK(shell(kBinary + " render '" + run.string() + "' --colours tide --out '" + (run / "old").string() + "'") == 2);
  fs::remove_all(run);
}

TEST_CASE("plots: a known curve decodes at the requested size and its data file holds the curve") {
  const fs::path dir = fs::temp_directory_path() / "terayee-test-plot";
  fs::remove_all(dir);
  fs::create_directories(dir);
  Plot plot;
  plot.width = 640, plot.height = 480;
  PlotPanel p;
  p.xlabel = "x", p.ylabel = "sin x";
  PlotSeries s;
  s.label = "sin x";
  for (int k = 0; k <= 200; ++k) s.x.push_back(k * 0.05), s.y.push_back(std::sin(k * 0.05));
  p.series = {s};
  p.shaded = {{2.0, 3.0}};
  p.shaded_label = "a band";
  plot.panels = {p};
  const std::string png = (dir / "sine.png").string();
  write_plot(plot, png);
  Png img(png);
  REQUIRE(img.ok());
  CHECK(img.width() == 640);
  CHECK(img.height() == 480);
  std::ifstream csv(plot_data_path(png));
  std::string line;
  std::getline(csv, line);
  CHECK(line == "panel,series,x,y");
  int rows = 0;
  double worst = 0;
  while (std::getline(csv, line)) {
    std::stringstream ss(line);
    std::string panel, label, xs, ys;
    std::getline(ss, panel, ','), std::getline(ss, label, ','), std::getline(ss, xs, ','), std::getline(ss, ys, ',');
    worst = std::max(worst, std::abs(std::stod(ys) - std::sin(std::stod(xs))));
    ++rows;
  }
  CHECK(rows == 201);
  CHECK(worst < 1e-9);
  // PDF and SVG come from the same drawing
  write_plot(plot, (dir / "sine.pdf").string());
  write_plot(plot, (dir / "sine.svg").string());
  CHECK(fs::file_size(dir / "sine.pdf") > 1000);
  CHECK(fs::file_size(dir / "sine.svg") > 1000);
}

TEST_CASE("plots: medium --plot draws the table it prints, and render --plot probes draws the recorded traces") {
  const fs::path dir = fs::temp_directory_path() / "terayee-test-medium-plot";
  fs::remove_all(dir);
  fs::create_directories(dir);
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/scenarios/mnf2-mirror.yaml";
  const std::string png = (dir / "mnf2.png").string(), js = (dir / "mnf2.json").string();
  REQUIRE(shell(kBinary + " medium '" + scene + "' --medium mnf2 --from 240GHz --to 280GHz --count 41 --angle 30deg " +
                "--plot '" + png + "' --json '" + js + "'") == 0);
  Png img(png);
  REQUIRE(img.ok());
  CHECK(img.width() == 900);
  CHECK(img.height() == 800);
  // the plotted |r|^2 at +angle is |r+|^2 of the table
  const auto rows = read_json(js)["rows"];
  std::ifstream csv(plot_data_path(png));
  std::string line;
  size_t k = 0;
  double worst = 0;
  while (std::getline(csv, line)) {
    if (line.find("|r|² at +angle") == std::string::npos) continue;
    const double y = std::stod(line.substr(line.rfind(',') + 1));
    const double r = rows[k++]["r-plus"][0].get<double>();
    worst = std::max(worst, std::abs(y - r * r));
  }
  CHECK(k == 41);
  CHECK(worst < 1e-7);

  const fs::path run = known_run();
  REQUIRE(shell(kBinary + " render '" + run.string() + "' --plot probes") == 0);
  Png probe((run / "pictures" / "probe-behind-window.png").string());
  REQUIRE(probe.ok());
  // the data beside the plot are the recorded trace
  const auto h = h5::File::open((run / "fields.h5").string());
  const auto ez = h.read("/probes/behind-window/Ez");
  std::ifstream pc(plot_data_path((run / "pictures" / "probe-behind-window.png").string()));
  size_t n = 0;
  double diff = 0;
  while (std::getline(pc, line))
    if (line.rfind("0,Ez,", 0) == 0) diff = std::max(diff, std::abs(std::stod(line.substr(line.rfind(',') + 1)) - ez[n++]));
  double big = 0;
  for (double v : ez) big = std::max(big, std::abs(v));
  CHECK(n == ez.size());
  CHECK(big > 0);
  CHECK(diff <= 1e-8 * big);
  fs::remove_all(run);
}

TEST_CASE("render: a still of a spectral map shows a steady plane wave's known |E|^2 and <S>") {
  // E0 = 1 kV/m in vacuum: |Ez|^2 = 1e6 (V/m)^2 and <S> = E0^2 / (2 eta0) = 1327.2 W/m^2 everywhere
  // ahead of the launch line (plane-wave facts of the trade; tests/data/cw-plane.yaml)
  const fs::path run = fs::temp_directory_path() / "terayee-test-render-map";
  fs::remove_all(run);
  const std::string scene = std::string(TERAYEE_SOURCE_DIR) + "/tests/data/cw-plane.yaml";
  REQUIRE(shell(kBinary + " run '" + scene + "' -o '" + run.string() + "' --quiet --threads 2") == 0);
  const ColourMap& seq = ColourMap::sequential();
  auto centre_t = [&](const std::string& picture, const ColourMap& map) {
    const auto L = read_json(fs::path(picture).replace_extension("").string() + "-layout.json");
    Png img(picture);
    REQUIRE(img.ok());
    const int y = L["panel"]["y"].get<int>() + L["panel"]["height"].get<int>() / 2;
    std::vector<double> t;
    for (int x = L["panel"]["x"].get<int>() + 4; x < L["panel"]["x"].get<int>() + L["panel"]["width"].get<int>() - 4; ++x)
      t.push_back(map.invert(img.at(x, y)));
    return t;
  };
  REQUIRE(shell(kBinary + " render '" + run.string() + "' --map steady --frequency 1THz --field Ez --limits 0 2e6") == 0);
  for (double t : centre_t((run / "pictures" / "steady-intensity-Ez-1000GHz.png").string(), seq))
    CHECK(t == doctest::Approx(0.5).epsilon(0.03));
  REQUIRE(shell(kBinary + " render '" + run.string() + "' --map steady --frequency 1THz --field S --limits 0 2654.4") == 0);
  for (double t : centre_t((run / "pictures" / "steady-real-S-1000GHz.png").string(), seq))
    CHECK(t == doctest::Approx(0.5).epsilon(0.03));
  // the steady wave's real part swings through the whole diverging map along the row
  REQUIRE(shell(kBinary + " render '" + run.string() + "' --map steady --frequency 1THz --field Ez --quantity real "
                "--limits -1000 1000") == 0);
  const auto t = centre_t((run / "pictures" / "steady-real-Ez-1000GHz.png").string(), ColourMap::diverging());
  CHECK(*std::max_element(t.begin(), t.end()) > 0.95);
  CHECK(*std::min_element(t.begin(), t.end()) < 0.05);
  fs::remove_all(run);
}

/// \file test_linewidth.cpp
/// \brief Damping against temperature: the crystal library's linewidth tables (MnF2, FeF2)
/// reproduced by the model's own damped line at each point of the table, straight lines
/// between them, and a damping the scene gives winning over the table.
#include <doctest/doctest.h>
#include <fmt/format.h>

#include <string>

#include "io/scene/crystals/crystal_table.h"
#include "io/scene/scene_reader.h"
#include "io/scene/scene_writer.h"
#include "materials/crystals/temperature.h"
#include "materials/magnetic/linear_response.h"
#include "materials/magnetic/state_choice.h"

using namespace ty;

namespace {
Scene scene_with(const std::string& medium) {
  return read_scene_text(
      "title: t\ngrid: {extent: [1 mm, 1 mm], cell: 20 um}\ntime: {stop: 1 ps}\nmedia:\n  s: " + medium +
          "\nbodies:\n  - {medium: s, rectangle: {centre: [0, 0], size: [0.2 mm, 0.2 mm]}}\n"
          "sources:\n  - point: {at: [0, 0.3 mm], component: Ez, amplitude: 1 mA, frequency: 0.26 THz, waveform: "
          "{kind: pulse, fwhm: 5 ps}}\n",
      "t.yaml");
}
/// The full width at half maximum of the model's lowest damped line, Hz: the amplitude's decay
/// rate is the line's half-width in angular frequency (test_damped_modes.cpp), so 2 decay / 2 pi.
double model_width(const Magnet& g) {
  const MagnetModel M(g, {0, 0, 0});
  const auto modes = damped_modes(M, choose_state(g, {0, 0, 0}).state);
  REQUIRE(!modes.empty());
  return modes.front().decay / constants::pi;
}
}  // namespace

TEST_CASE("Linewidth: the model's line at each temperature of the library's tables has the table's width") {
  // The tables are those of crystal_table.cpp (MnF2: after Johnson & Nethercot, Phys. Rev. 114,
  // 705 (1959); FeF2: Ohlmann & Tinkham, Phys. Rev. 123, 425 (1961); both recalled, rough).
  // The model's line is its damped mode (linear_response.h), not the closed form that set the
  // damping, so a wrong conversion (a factor 2, B_E alone, gamma at 0 K) fails by far more
  // than the 1% allowed (the closed form drops terms of order B_A/B_E and alpha^2).
  for (const char* name : {"MnF2", "FeF2"}) {
    const Crystal& c = *find_crystal(name);
    REQUIRE(c.linewidth.size() >= 4);
    for (const auto& p : c.linewidth) {
      const Scene s = scene_with(fmt::format("{{crystal: {}, temperature: {} K}}", name, p.temperature));
      const double w = model_width(*s.media[0].magnet);
      INFO(name << " at " << p.temperature << " K: model " << w / 1e9 << " GHz, table " << p.fwhm / 1e9 << " GHz");
      CHECK(w == doctest::Approx(p.fwhm).epsilon(0.01));
    }
  }
}

TEST_CASE("Linewidth: between the table's points straight lines, its ends held beyond them") {
  Thermal th;
  th.linewidth = {{10, 1e9}, {20, 3e9}, {40, 7e9}};
  for (auto [t, want] : std::initializer_list<std::pair<double, double>>{
           {0, 1e9}, {10, 1e9}, {15, 2e9}, {20, 3e9}, {35, 6e9}, {40, 7e9}, {60, 7e9}}) {
    th.temperature = t;
    CHECK(thermal_linewidth(th) == doctest::Approx(want));
  }
}

TEST_CASE("Linewidth: a damping the scene gives wins, and without a temperature the table is not used") {
  const Scene mine =
      scene_with("{crystal: MnF2, temperature: 40 K, magnet: {sublattices: [{damping: 1e-3}, {damping: 1e-3}]}}");
  CHECK(mine.media[0].magnet->thermal.linewidth.empty());
  CHECK(MagnetModel(*mine.media[0].magnet, {0, 0, 0}).alpha[0] == doctest::Approx(1e-3));
  const Scene none = scene_with("{crystal: MnF2}");
  CHECK(none.media[0].magnet->thermal.linewidth.empty());
  CHECK(MagnetModel(*none.media[0].magnet, {0, 0, 0}).alpha[0] == 0);
  // with the table, warmer is broader, and the resolved scene reads back to the same damping
  const Scene cold = scene_with("{crystal: MnF2, temperature: 20 K}"),
              warm = scene_with("{crystal: MnF2, temperature: 50 K}");
  CHECK(model_width(*warm.media[0].magnet) > 5 * model_width(*cold.media[0].magnet));
  const Scene back = read_scene_text(resolved_scene_yaml(warm), "back.yaml");
  CHECK(MagnetModel(*back.media[0].magnet, {0, 0, 0}).alpha[0] ==
        doctest::Approx(MagnetModel(*warm.media[0].magnet, {0, 0, 0}).alpha[0]).epsilon(1e-9));
}

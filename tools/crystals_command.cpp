/// \file crystals_command.cpp
/// \brief `terayee crystals [NAME] [--temperature T]`: the crystal library, every value with
/// its source, and for one crystal the model's zero-field resonances beside the published ones.
#include <fmt/format.h>

#include <iostream>

#include "io/scene/crystals/crystal_magnet.h"
#include "io/scene/crystals/crystal_permittivity.h"
#include "io/scene/diagnostics.h"
#include "materials/crystals/temperature.h"
#include "materials/magnetic/linear_response.h"
#include "materials/magnetic/state_choice.h"
#include "tools/commands.h"

namespace ty {
namespace {

void line(const char* what, const Cited& c, const char* unit) {
  if (c.source.empty()) return;
  std::cout << fmt::format("  {:<22} {:g}{}  [{}]\n", what, c.value, unit, c.source);
}

void show(const Crystal& c, double t) {
  std::cout << fmt::format("{}: {}\n", c.name, c.kind);
  std::cout << fmt::format("  magnetic values hold at {:g} K\n", c.reference);
  line("mu0*Ms per sublattice", c.saturation, " T");
  line("g", c.g, "");
  if (c.sublattices == 2) line("mu0*H_E", c.exchange, " T");
  for (const auto& a : c.anisotropy) {
    const std::string what = fmt::format("mu0*H_A [{:.3g} {:.3g} {:.3g}]", a.axis[0], a.axis[1], a.axis[2]);
    line(what.c_str(), a.field, " T");
  }
  if (c.dzyaloshinskii.value != 0) {
    const std::string what = fmt::format("mu0*H_D [{:g} {:g} {:g}]", c.dm_axis[0], c.dm_axis[1], c.dm_axis[2]);
    line(what.c_str(), c.dzyaloshinskii, " T");
  }
  line("damping", c.damping, "");
  if (!c.linewidth.empty()) {
    std::cout << fmt::format("  zero-field line width against temperature (FWHM; with `temperature` and no damping "
                             "given it sets the damping)  [{}]\n",
                             c.linewidth_source);
    for (const auto& p : c.linewidth) {
      Magnet g = crystal_magnet(c);
      g.thermal.temperature = p.temperature;
      g.thermal.linewidth = {{p.temperature, p.fwhm}};
      std::cout << fmt::format("    {:6.1f} K: {:8.4g} GHz  (damping {:.3g})\n", p.temperature, p.fwhm / 1e9,
                               MagnetModel(g, {0, 0, 0}).alpha[0]);
    }
  }
  line("spin S", c.spin, "");
  line("ordering temperature", c.ordering, " K");
  line("anisotropy power", c.anisotropy_power, "");
  if (c.lowest > 0) std::cout << fmt::format("  not below {:g} K: {}\n", c.lowest, c.lowest_why);
  const char* axes[3] = {"permittivity a", "permittivity b", "permittivity c"};
  for (int k = 0; k < 3; ++k) line(axes[k], c.permittivity[k], "");
  std::cout << fmt::format("  phonons (Lorentz terms): {}\n", c.phonon_source);
  for (const auto& p : c.phonons)
    std::cout << fmt::format("    axis {}: f_TO {:g} THz, strength {:g}, damping {:g} THz\n", "abc"[p.axis],
                             p.term.f_to / 1e12, p.term.delta_eps, p.term.damping / 1e12);
  if (!c.phonons.empty()) {
    std::string bg;
    for (int k = 0; k < 3; ++k)
      bg += fmt::format("{}{} {:g}", k ? ", " : "", "abc"[k], crystal_axis_model(c, k).eps_inf);
    std::cout << fmt::format(
        "  a medium naming {} takes them: a dispersive permittivity, background {} (the static "
        "value less the phonons' strengths); 'permittivity' beside 'crystal' replaces it\n",
        c.name, bg);
  }
  if (!c.note.empty()) std::cout << fmt::format("  note: {}\n", c.note);
  Magnet g = crystal_magnet(c);
  if (t >= 0) g.thermal.temperature = t;
  if (t >= 0 && !c.linewidth.empty()) {  // as a scene with `temperature` and no damping takes it
    for (const auto& p : c.linewidth) g.thermal.linewidth.push_back({p.temperature, p.fwhm});
    std::cout << fmt::format("  at {:g} K the line is {:.4g} GHz wide: damping {:.3g}\n", t,
                             thermal_linewidth(g.thermal) / 1e9, MagnetModel(g, {0, 0, 0}).alpha[0]);
  }
  const MagnetModel M(g, {0, 0, 0});
  const auto f = resonances(M, choose_state(g, {0, 0, 0}).state);
  std::string model;
  for (double x : f) model += fmt::format("{}{:.4g} GHz", model.empty() ? "" : ", ", x / 1e9);
  std::cout << fmt::format("  zero-field resonances of the model at {:g} K: {}\n", g.thermal.temperature,
                           model.empty() ? "none" : model);
  for (const auto& r : c.resonances)
    std::cout << fmt::format("  published: {:.4g} GHz  [{}]\n", r.value / 1e9, r.source);
}

}  // namespace

int crystals_command(const std::string& name, double temperature) {
  if (name.empty()) {
    std::cout << "The crystal library (`terayee crystals NAME` for values and sources; in a scene: `crystal: NAME`):\n";
    for (const auto& c : crystal_table())
      std::cout << fmt::format("  {:<10} ordering {:g} K; {}\n", c.name, c.ordering.value, c.kind);
    return 0;
  }
  const Crystal* c = find_crystal(name);
  if (!c) throw BadInput(fmt::format("terayee crystals: error: no crystal '{}' in the library", name));
  if (temperature >= c->ordering.value || (temperature >= 0 && temperature < c->lowest))
    throw BadInput(fmt::format("terayee crystals: error: {} is described from {:g} K up to below {:g} K", c->name,
                               c->lowest, c->ordering.value));
  show(*c, temperature);
  return 0;
}

}  // namespace ty

/// \file media_crystal.cpp
/// \brief A medium's `crystal` (the library of io/scene/crystals/), its orientation (`cut`,
/// `rotation`), its `temperature`, a magnet's `thermal` data and its state choice (`state`,
/// `history`). Values given beside a crystal win over the library's (media.cpp).
#include <cmath>

#include "io/scene/crystals/crystal_magnet.h"
#include "io/scene/crystals/crystal_permittivity.h"
#include "io/scene/reader/reader.h"

namespace ty::reader {

std::optional<Magnet> SceneBuilder::read_crystal(const YAML::Node& v, const std::string& where, Medium& med) {
  const auto name = r_.text(v["crystal"], "crystal");
  if (!name) return std::nullopt;
  const Crystal* c = find_crystal(*name);
  if (!c) {
    std::string known;
    for (const auto& k : crystal_table()) known += (known.empty() ? "" : ", ") + std::string(k.name);
    r_.error(v["crystal"], fmt::format("{}: no crystal '{}' in the library (known: {}; `terayee crystals` lists "
                                       "their values)",
                                       where, *name, known));
    return std::nullopt;
  }
  med.crystal = std::string(c->name);
  Rot3 r = cut_rotation('c');
  if (v["cut"])
    if (auto a = r_.choice<char>(v["cut"], "cut", {{"a", 'a'}, {"b", 'b'}, {"c", 'c'}})) r = cut_rotation(*a);
  if (v["rotation"])
    if (auto e = r_.vec3(v["rotation"], "rotation", Kind::angle)) r = euler_rotation((*e)[0], (*e)[1], (*e)[2]) * r;
  const Magnet g = crystal_magnet(*c, r);
  if (v["permittivity"]) return g;  // the scene's permittivity wins (media.cpp)
  // the library's phonons, and an in-plane turn, make a tensor (crystal_permittivity.h);
  // a constant crystal whose turned tensor stays diagonal keeps the plain diagonal
  const std::array<double, 3> eps{c->permittivity[0].value, c->permittivity[1].value, c->permittivity[2].value};
  PermittivityTensor t;
  const bool held = crystal_permittivity(*c, r, t);
  if (held && (t.dispersive() || !t.diagonal_in_plane())) {
    const double cs = std::cos(t.rotate), sn = std::sin(t.rotate), u = t.axis[0].eps_inf, w = t.axis[1].eps_inf;
    med.tensor = t;
    med.permittivity = {u * cs * cs + w * sn * sn, u * sn * sn + w * cs * cs, t.axis[2].eps_inf};
  } else if (!held && !c->phonons.empty()) {
    r_.error(v["rotation"], fmt::format("{}: turned this way, no axis of {} lies along z (nor two alike with the "
                                        "third in the plane): its dispersive tensor would couple Ez with Ex, Ey, "
                                        "which the grid does not hold; give 'permittivity' beside the crystal",
                                        where, c->name));
  } else if (!rotate_diagonal(r, eps, med.permittivity)) {
    r_.error(v["rotation"], fmt::format("{}: turned this way, {}'s permittivity couples Ez with Ex, Ey, which the "
                                        "grid does not hold (turn it about z, after a cut); give 'permittivity' "
                                        "beside the crystal",
                                        where, c->name));
  }
  return g;
}

void SceneBuilder::read_temperature(const YAML::Node& v, const std::string& where, Medium& med) {
  const YAML::Node& t = v["temperature"];
  if (!t) return;
  const auto k = r_.quantity(t, "temperature", Kind::temperature);
  if (!k) return;
  if (!med.magnet || !med.magnet->thermal.active()) {
    if (!v["crystal"] || med.magnet)  // an unknown crystal has been reported already
      r_.error(t, fmt::format("{}: 'temperature' needs a 'crystal' or a magnet with a 'thermal' block (the laws "
                              "that scale its values)",
                              where));
    return;
  }
  Thermal& th = med.magnet->thermal;
  if (!(*k >= 0) || *k >= th.ordering) {
    r_.error(t, fmt::format("{}: the temperature must lie from 0 K up to, not including, the ordering temperature "
                            "{:g} K (above it the crystal is paramagnetic, which the model does not describe)",
                            where, th.ordering));
    return;
  }
  if (const Crystal* c = find_crystal(med.crystal); c && *k < c->lowest)
    r_.error(t, fmt::format("{}: {} is described from {:g} K up: {}", where, c->name, c->lowest, c->lowest_why));
  th.temperature = *k;
  // the library's linewidth table sets the damping at this temperature, unless the scene
  // gives the damping (or a table of its own)
  const Crystal* c = find_crystal(med.crystal);
  if (!c || c->linewidth.empty() || !th.linewidth.empty()) return;
  if (const auto& m = v["magnet"]; m && m.IsMap())
    if (const auto& subs = m["sublattices"]; subs && subs.IsSequence())
      for (const auto& sl : subs)
        if (sl.IsMap() && sl["damping"]) return;
  for (const auto& p : c->linewidth) th.linewidth.push_back({p.temperature, p.fwhm});
}

void SceneBuilder::read_thermal(const YAML::Node& t, const std::string& here, Thermal& th) {
  if (!r_.is_map(t, "thermal")) return;
  r_.allow(t, {"spin", "ordering", "reference", "anisotropy-power", "linewidth"}, here + ": thermal");
  for (auto k : {"spin", "ordering"})
    if (!t[k] && !th.active()) r_.error(t, fmt::format("{}: 'thermal' needs '{}'", here, k));
  if (t["spin"])
    if (auto v = r_.positive(t["spin"], "spin", Kind::dimensionless)) th.spin = *v;
  if (t["ordering"])
    if (auto v = r_.positive(t["ordering"], "ordering", Kind::temperature)) th.ordering = *v;
  if (t["reference"])
    if (auto v = r_.quantity(t["reference"], "reference", Kind::temperature)) {
      if (!(*v >= 0) || (th.ordering > 0 && *v >= th.ordering))
        r_.error(t["reference"], fmt::format("{}: 'reference' must lie from 0 K up to the ordering temperature", here));
      th.reference = *v;
    }
  if (t["anisotropy-power"])
    if (auto v = r_.positive(t["anisotropy-power"], "anisotropy-power", Kind::dimensionless)) th.anisotropy_power = *v;
  th.temperature = th.reference;
  if (t["linewidth"]) read_linewidth(t["linewidth"], here, th);
}

/// `thermal: {linewidth: [[T, width], ...]}`: the zero-field line's full width at half maximum
/// against temperature, rising in T; it sets the damping (materials/crystals/temperature.h).
void SceneBuilder::read_linewidth(const YAML::Node& w, const std::string& here, Thermal& th) {
  if (!r_.is_seq(w, "linewidth")) return;
  if (w.size() == 0) r_.error(w, fmt::format("{}: 'linewidth' lists [temperature, width] pairs; it is empty", here));
  th.linewidth.clear();
  for (const auto& p : w) {
    if (!p.IsSequence() || p.size() != 2) {
      r_.error(p, fmt::format("{}: each 'linewidth' entry is [temperature, width], e.g. [4.2 K, 0.3 GHz]", here));
      continue;
    }
    const auto T = r_.quantity(p[0], "linewidth temperature", Kind::temperature);
    const auto f = r_.quantity(p[1], "linewidth width", Kind::frequency);
    if (!T || !f) continue;
    if (!(*T >= 0) || !(*f > 0)) {
      r_.error(p, fmt::format("{}: a 'linewidth' entry needs a temperature from 0 K and a positive width", here));
      continue;
    }
    if (!th.linewidth.empty() && !(*T > th.linewidth.back()[0]))
      r_.error(p[0], fmt::format("{}: the 'linewidth' temperatures must rise ({:g} K follows {:g} K)", here, *T,
                                 th.linewidth.back()[0]));
    th.linewidth.push_back({*T, *f});
  }
}

/// A linewidth table sets the damping of a two-sublattice magnet with an easy axis; a
/// sublattice's `damping` beside it would be overruled, so it is an error.
void SceneBuilder::check_linewidth(const YAML::Node& m, const std::string& here, const Magnet& g) {
  const YAML::Node& w = m["thermal"]["linewidth"];
  bool easy = false;
  for (const auto& a : g.anisotropy) easy |= a.field > 0;
  if (g.sublattices.size() != 2 || !easy)
    r_.error(w, fmt::format("{}: 'linewidth' sets the damping from the line of a two-sublattice antiferromagnet "
                            "with an easy axis (a positive anisotropy field); this magnet is not one",
                            here));
  if (const auto& subs = m["sublattices"]; subs && subs.IsSequence())
    for (const auto& sl : subs)
      if (sl.IsMap() && sl["damping"])
        r_.error(sl["damping"], fmt::format("{}: give a sublattice's 'damping' or the thermal 'linewidth', not both "
                                            "(the linewidth sets the damping)",
                                            here));
}

/// A `state` value (the magnet block's or a body's): lowest, a number, or a kind.
std::optional<std::string> SceneBuilder::state_pick(const YAML::Node& s, const std::string& here) {
  auto t = r_.text(s, "state");
  if (!t) return std::nullopt;
  bool number = !t->empty() && t->find_first_not_of("0123456789") == std::string::npos;
  const bool known = *t == "lowest" || *t == "collinear" || *t == "spin-flop" || *t == "canted" || *t == "aligned";
  if (number && (t->size() > 3 || std::stoi(*t) < 1)) number = false;
  if (number || known) return t;
  r_.error(s, fmt::format("{}: 'state' must be lowest, a state's number as `terayee check` lists them (1, 2, "
                          "...), or a kind (collinear, spin-flop, canted, aligned); got '{}'",
                          here, *t));
  return std::nullopt;
}

void SceneBuilder::read_state(const YAML::Node& m, const std::string& here, Magnet& g) {
  if (const auto& s = m["state"]) {
    g.state.where = r_.mark(s);
    if (auto t = state_pick(s, here)) g.state.pick = *t;
  }
  if (const auto& h = m["history"]) {
    if (m["state"])
      r_.error(h, fmt::format("{}: give 'state' or 'history', not both (a history decides the state)", here));
    g.state.where = r_.mark(h);
    if (!r_.is_seq(h, "history")) return;
    if (h.size() == 0)
      r_.error(h, fmt::format("{}: 'history' lists the bias path, [[x, y, z], ...]; it is empty", here));
    g.state.history.clear();
    for (const auto& p : h)
      if (auto b = r_.vec3(p, "history", Kind::magnetic_field)) g.state.history.push_back(*b);
  }
}

}  // namespace ty::reader

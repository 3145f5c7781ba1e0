/// \file permittivity.cpp
/// \brief A medium's `permittivity` in its map form: one model (isotropic) with keys
/// `background`, `lorentz`, `drude`, or one model per principal axis `u`, `v`, `z` with the
/// in-plane angle `rotate` of u from x. A Lorentz term is `to` with `lo` or `strength`, and
/// `damping`; a Drude term is `plasma` and `collision`. The formula is in
/// io/scene/permittivity_model.h.
#include "io/scene/reader/reader.h"

namespace ty::reader {
namespace {

std::optional<LorentzTerm> read_lorentz(Reader& r, const YAML::Node& n, double eps_inf, const std::string& where) {
  if (!r.is_map(n, "a lorentz term")) return std::nullopt;
  r.allow(n, {"to", "lo", "strength", "damping"}, where + ": lorentz term");
  LorentzTerm t;
  if (!n["to"]) {
    r.error(n, fmt::format("{}: a lorentz term needs 'to' (its transverse-optical frequency)", where));
    return std::nullopt;
  }
  auto to = r.positive(n["to"], "to", Kind::frequency);
  if (!to) return std::nullopt;
  t.f_to = *to;
  if (n["lo"] && n["strength"]) {
    r.error(n["strength"], fmt::format("{}: give a lorentz term's 'lo' or its 'strength', not both", where));
    return std::nullopt;
  }
  if (n["lo"]) {
    auto lo = r.positive(n["lo"], "lo", Kind::frequency);
    if (!lo) return std::nullopt;
    if (!(*lo > t.f_to)) {
      r.error(n["lo"],
              fmt::format("{}: 'lo' ({:g} THz) must lie above 'to' ({:g} THz)", where, *lo / 1e12, t.f_to / 1e12));
      return std::nullopt;
    }
    t.delta_eps = strength_from_lo(eps_inf, t.f_to, *lo);
  } else if (n["strength"]) {
    auto s = r.positive(n["strength"], "strength", Kind::dimensionless);
    if (!s) return std::nullopt;
    t.delta_eps = *s;
  } else {
    r.error(n, fmt::format("{}: a lorentz term needs 'lo' (its longitudinal-optical frequency) or 'strength' "
                           "(its share of the static permittivity)",
                           where));
    return std::nullopt;
  }
  if (n["damping"]) {
    auto g = r.quantity(n["damping"], "damping", Kind::frequency);
    if (!g) return std::nullopt;
    if (*g < 0) r.error(n["damping"], fmt::format("{}: 'damping' must not be negative", where));
    t.damping = std::max(*g, 0.0);
  }
  return t;
}

std::optional<DrudeTerm> read_drude(Reader& r, const YAML::Node& n, const std::string& where) {
  if (!r.is_map(n, "a drude term")) return std::nullopt;
  r.allow(n, {"plasma", "collision"}, where + ": drude term");
  DrudeTerm t;
  if (!n["plasma"]) {
    r.error(n, fmt::format("{}: a drude term needs 'plasma' (its plasma frequency)", where));
    return std::nullopt;
  }
  auto p = r.positive(n["plasma"], "plasma", Kind::frequency);
  if (!p) return std::nullopt;
  t.plasma = *p;
  if (n["collision"]) {
    auto c = r.quantity(n["collision"], "collision", Kind::frequency);
    if (!c) return std::nullopt;
    if (*c < 0) r.error(n["collision"], fmt::format("{}: 'collision' must not be negative", where));
    t.collision = std::max(*c, 0.0);
  }
  return t;
}

/// One axis's model; false after an error (already recorded).
bool read_model(Reader& r, const YAML::Node& n, const std::string& where, PermittivityModel& m) {
  if (!r.is_map(n, where)) return false;
  r.allow(n, {"background", "lorentz", "drude"}, where);
  bool ok = true;
  if (n["background"]) {
    auto e = r.quantity(n["background"], "background", Kind::dimensionless);
    if (!e) return false;
    if (!(*e >= 1.0)) {
      r.error(n["background"], fmt::format("{}: 'background' must be at least 1 (below 1 the local speed of light "
                                           "would exceed the time step's limit), got {}",
                                           where, *e));
      return false;
    }
    m.eps_inf = *e;
  }
  if (const auto& l = n["lorentz"]; l && r.is_seq(l, "lorentz"))
    for (const auto& t : l) {
      if (auto v = read_lorentz(r, t, m.eps_inf, where))
        m.lorentz.push_back(*v);
      else
        ok = false;
    }
  if (const auto& d = n["drude"]; d && r.is_seq(d, "drude"))
    for (const auto& t : d) {
      if (auto v = read_drude(r, t, where))
        m.drude.push_back(*v);
      else
        ok = false;
    }
  return ok;
}

}  // namespace

std::optional<PermittivityTensor> read_permittivity_map(Reader& r, const YAML::Node& p, const std::string& where) {
  const std::string here = where + ": permittivity";
  const bool per_axis = p["u"] || p["v"] || p["z"] || p["rotate"];
  PermittivityTensor t;
  if (!per_axis) {
    if (!read_model(r, p, here, t.axis[0])) return std::nullopt;
    t.axis[1] = t.axis[2] = t.axis[0];
    return t;
  }
  r.allow(p, {"u", "v", "z", "rotate"},
          here + " (per axis: u, v, z and rotate; or one model: background, lorentz, drude)");
  bool ok = true;
  const char* names[3] = {"u", "v", "z"};
  for (int a = 0; a < 3; ++a) {
    if (!p[names[a]]) {
      r.error(p, fmt::format("{} per axis needs '{}' (give all of u, v and z)", here, names[a]));
      ok = false;
    } else {
      ok = read_model(r, p[names[a]], fmt::format("{}: {}", here, names[a]), t.axis[a]) && ok;
    }
  }
  if (p["rotate"]) {
    if (auto a = r.quantity(p["rotate"], "rotate", Kind::angle))
      t.rotate = *a;
    else
      ok = false;
  }
  if (!ok) return std::nullopt;
  return t;
}

}  // namespace ty::reader

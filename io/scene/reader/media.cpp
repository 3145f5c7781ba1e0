/// \file media.cpp
/// \brief The `media` section: permittivity (its map form in permittivity.cpp), conductivity,
/// perfect conductors and the `magnet` block (sublattices, exchange, anisotropy,
/// Dzyaloshinskii field, order, thermal data, state choice). A `crystal` (media_crystal.cpp)
/// fills the values that are not given.
#include <algorithm>
#include <cmath>

#include "io/scene/reader/reader.h"

namespace ty::reader {
namespace {

/// The scene-frame diagonal of the background tensor R diag(u, v, z) R^T.
std::array<double, 3> background_diagonal(const PermittivityTensor& t) {
  const double c = std::cos(t.rotate), s = std::sin(t.rotate);
  const double u = t.axis[0].eps_inf, v = t.axis[1].eps_inf;
  return {u * c * c + v * s * s, u * s * s + v * c * c, t.axis[2].eps_inf};
}

}  // namespace

void SceneBuilder::read_media(const YAML::Node& m) {
  if (!r_.is_map(m, "media")) return;
  for (const auto& kv : m) {
    Medium med;
    med.name = kv.first.as<std::string>("");
    med.where = r_.mark(kv.first);
    for (const auto& other : scene_.media)
      if (other.name == med.name) r_.error(kv.first, fmt::format("medium '{}' is defined twice", med.name));
    const YAML::Node& v = kv.second;
    const std::string where = fmt::format("medium '{}'", med.name);
    if (!r_.is_map(v, where)) continue;
    r_.allow(v, {"permittivity", "conductivity", "perfect-conductor", "magnet", "crystal", "cut", "rotation",
                 "temperature"},
             where);
    std::optional<Magnet> base;
    if (v["crystal"]) base = read_crystal(v, where, med);
    for (auto k : {"cut", "rotation"})
      if (v[k] && !v["crystal"]) r_.error(v[k], fmt::format("{}: '{}' orients a crystal; give 'crystal' too", where, k));
    if (v["magnet"])
      med.magnet = read_magnet(v["magnet"], where, base ? &*base : nullptr);
    else
      med.magnet = base;
    read_temperature(v, where, med);
    if (med.magnet && v["perfect-conductor"] && v["perfect-conductor"].Scalar() == "true")
      r_.error(v["perfect-conductor"], fmt::format("{}: a perfect conductor cannot also be a magnet", where));
    if (const auto& p = v["permittivity"]) {
      if (p.IsMap()) {
        med.tensor = read_permittivity_map(r_, p, where);
        if (med.tensor) med.permittivity = background_diagonal(*med.tensor);
      } else if (p.IsSequence()) {
        med.tensor.reset();  // a crystal's dispersive tensor gives way to the scene's value
        if (auto e = r_.vec3(p, "permittivity", Kind::dimensionless)) med.permittivity = *e;
      } else if (auto e = r_.quantity(p, "permittivity", Kind::dimensionless)) {
        med.tensor.reset();
        med.permittivity = {*e, *e, *e};
      }
      for (double e : med.permittivity)
        if (!(e >= 1.0)) {
          r_.error(p, fmt::format("{}: permittivity must be at least 1 (a value below 1 would make the local "
                                  "speed of light exceed the time step's limit), got {}",
                                  where, e));
          break;
        }
    }
    if (const auto& s = v["conductivity"]) {
      if (auto c = r_.quantity(s, "conductivity", Kind::conductivity)) {
        if (*c < 0) r_.error(s, fmt::format("{}: conductivity must not be negative", where));
        med.conductivity = *c;
      }
    }
    if (const auto& pc = v["perfect-conductor"]) {
      if (auto b = r_.boolean(pc, "perfect-conductor")) med.perfect_conductor = *b;
    }
    scene_.media.push_back(med);
  }
}

std::optional<std::array<double, 3>> SceneBuilder::unit_vector(const YAML::Node& n, std::string_view key) {
  auto v = r_.vec3(n, key, Kind::dimensionless);
  if (!v) return std::nullopt;
  const double norm = std::sqrt((*v)[0] * (*v)[0] + (*v)[1] * (*v)[1] + (*v)[2] * (*v)[2]);
  if (!(norm > 0)) {
    r_.error(n, fmt::format("'{}' must be a non-zero direction", key));
    return std::nullopt;
  }
  return std::array<double, 3>{(*v)[0] / norm, (*v)[1] / norm, (*v)[2] / norm};
}

std::optional<Magnet> SceneBuilder::read_magnet(const YAML::Node& m, const std::string& where, const Magnet* base) {
  const std::string here = where + ": magnet";
  if (!r_.is_map(m, "magnet")) return std::nullopt;
  r_.allow(m, {"sublattices", "exchange", "exchange-constant", "anisotropy", "dzyaloshinskii", "order", "thermal",
               "state", "history"},
           here);
  Magnet g = base ? *base : Magnet{};
  bool ok = true;
  const YAML::Node& subs = m["sublattices"];
  if (!subs && !base) {
    r_.error(m,
             fmt::format("{} needs 'sublattices' (one for a ferromagnet, two for an antiferro- or ferrimagnet)", here));
    return std::nullopt;
  }
  if (subs && !read_sublattices(subs, here, base, g)) {
    if (!subs.IsSequence() || subs.size() < 1 || subs.size() > 2) return std::nullopt;
    ok = false;
  }
  const bool two = g.sublattices.size() == 2;
  if (!two) {
    for (auto k : {"exchange", "exchange-constant", "dzyaloshinskii"})
      if (m[k]) r_.error(m[k], fmt::format("{}: '{}' needs two sublattices", here, k));
  } else if ((!base || m["exchange"] || m["exchange-constant"]) && !read_exchange(m, here, ok, g)) {
    ok = false;
  }
  if (const auto& a = m["anisotropy"]) {
    g.anisotropy.clear();
    ok = read_anisotropy(a, here, g) && ok;
  }
  if (two && m["dzyaloshinskii"])
    if (auto v = r_.vec3(m["dzyaloshinskii"], "dzyaloshinskii", Kind::magnetic_field)) g.dzyaloshinskii = *v;
  if (m["order"]) {
    if (auto v = unit_vector(m["order"], "order"))
      g.order = *v;
    else
      ok = false;
  }
  if (m["thermal"]) read_thermal(m["thermal"], here, g.thermal);
  if (m["thermal"] && m["thermal"].IsMap() && m["thermal"]["linewidth"]) check_linewidth(m, here, g);
  read_state(m, here, g);
  if (!ok) return std::nullopt;
  return g;
}

/// One or two sublattices; beside a crystal (`base`) the count must match and every key is
/// optional (the crystal's value is kept).
bool SceneBuilder::read_sublattices(const YAML::Node& subs, const std::string& here, const Magnet* base, Magnet& g) {
  if (!r_.is_seq(subs, "sublattices")) return false;
  if (subs.size() < 1 || subs.size() > 2) {
    r_.error(subs, fmt::format("{}: 'sublattices' must list one or two sublattices, got {}", here, subs.size()));
    return false;
  }
  if (base && subs.size() != base->sublattices.size()) {
    r_.error(subs, fmt::format("{}: the crystal has {} sublattice{}; list as many to override them, got {}", here,
                               base->sublattices.size(), base->sublattices.size() == 1 ? "" : "s", subs.size()));
    return false;
  }
  bool ok = true;
  g.sublattices.resize(subs.size());
  for (size_t k = 0; k < subs.size(); ++k) {
    const YAML::Node& sl = subs[k];
    Sublattice& s = g.sublattices[k];
    if (!r_.is_map(sl, "sublattice")) {
      ok = false;
      continue;
    }
    r_.allow(sl, {"saturation", "g", "damping"}, "a sublattice");
    if (!sl["saturation"] && !base) {
      r_.error(sl, "a sublattice needs 'saturation' (mu0*Ms, e.g. 0.75 T)");
      ok = false;
    } else if (sl["saturation"]) {
      if (auto v = r_.positive(sl["saturation"], "saturation", Kind::magnetic_field))
        s.saturation = *v;
      else
        ok = false;
    }
    if (sl["g"])
      if (auto v = r_.positive(sl["g"], "g", Kind::dimensionless)) s.g = *v;
    if (sl["damping"])
      if (auto v = r_.quantity(sl["damping"], "damping", Kind::dimensionless)) {
        if (*v < 0 || *v >= 1) r_.error(sl["damping"], "'damping' (Gilbert alpha) must lie in [0, 1)");
        s.damping = *v;
      }
  }
  return ok;
}

/// The exchange of two sublattices: `exchange` (mu0*H_E = lambda*mu0*Ms, equal moments) or
/// `exchange-constant` (lambda). Both given is one error, and the constant is kept so that
/// the rest of the scene is checked as if the medium were magnetic.
bool SceneBuilder::read_exchange(const YAML::Node& m, const std::string& here, bool sublattices_ok, Magnet& g) {
  if (m["exchange"] && m["exchange-constant"])
    r_.error(m["exchange-constant"], fmt::format("{}: give 'exchange' or 'exchange-constant', not both", here));
  if (m["exchange-constant"]) {
    if (auto v = r_.quantity(m["exchange-constant"], "exchange-constant", Kind::dimensionless)) g.lambda = *v;
    return true;
  }
  if (m["exchange"]) {
    if (auto v = r_.quantity(m["exchange"], "exchange", Kind::magnetic_field)) {
      if (sublattices_ok && g.sublattices[0].saturation != g.sublattices[1].saturation)
        r_.error(m["exchange"], fmt::format("{}: 'exchange' (mu0*H_E = lambda*mu0*Ms) is defined for equal moments; "
                                            "for unequal ones give 'exchange-constant' (lambda)",
                                            here));
      else if (sublattices_ok)
        g.lambda = *v / g.sublattices[0].saturation;
    }
    return true;
  }
  r_.error(m, fmt::format("{}: two sublattices need 'exchange' (mu0*H_E, T) or 'exchange-constant' (lambda)", here));
  return false;
}

/// Up to four uniaxial terms, each an `axis` (normalised) and a `field` (mu0*H_A).
bool SceneBuilder::read_anisotropy(const YAML::Node& a, const std::string& here, Magnet& g) {
  bool ok = true;
  if (r_.is_seq(a, "anisotropy"))
    for (const auto& t : a) {
      if (!r_.is_map(t, "anisotropy term")) continue;
      r_.allow(t, {"axis", "field"}, "an anisotropy term");
      UniaxialAnisotropy u;
      if (!t["axis"] || !t["field"]) {
        r_.error(t, "an anisotropy term needs 'axis' and 'field'");
        ok = false;
        continue;
      }
      if (auto v = unit_vector(t["axis"], "axis"))
        u.axis = *v;
      else
        ok = false;
      if (auto v = r_.quantity(t["field"], "field", Kind::magnetic_field))
        u.field = *v;
      else
        ok = false;
      g.anisotropy.push_back(u);
    }
  if (g.anisotropy.size() > 4) {
    r_.error(a, fmt::format("{}: at most four anisotropy terms are supported", here));
    ok = false;
  }
  return ok;
}

}  // namespace ty::reader

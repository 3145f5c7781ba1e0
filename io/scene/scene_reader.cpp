/// \file scene_reader.cpp
/// \brief The strict scene reader: keys, types, units and values of scene-format.md.
///
/// Reading runs in an order that lets relative units resolve: media and the sources'
/// frequencies first (they decide `cells-per-wavelength`), then the grid (the cell
/// size that `cells` refers to), then bodies, sources and outputs. Every error is
/// recorded with its file:line:col and reading goes on, so that one run of `check`
/// shows all of them.
#include "io/scene/scene_reader.h"

#include <fmt/format.h>
#include <yaml-cpp/yaml.h>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <set>
#include <sstream>

#include "io/scene/units.h"

namespace ty {
namespace {

using constants::c0;
using constants::pi;

class Reader {
 public:
  Reader(Diagnostics& d, std::string file) : d_(d), file_(std::move(file)) {}

  Mark mark(const YAML::Node& n) const {
    const auto m = n.Mark();
    if (m.line < 0) return {file_, 0, 0};
    return {file_, m.line + 1, m.column + 1};
  }
  void error(const YAML::Node& n, std::string msg) { d_.error(mark(n), std::move(msg)); }
  void error(const Mark& m, std::string msg) { d_.error(m, std::move(msg)); }

  /// True when `n` is a map; otherwise records an error naming `what`.
  bool is_map(const YAML::Node& n, std::string_view what) {
    if (n.IsMap()) return true;
    error(n, fmt::format("'{}' must be a map of keys", what));
    return false;
  }
  bool is_seq(const YAML::Node& n, std::string_view what) {
    if (n.IsSequence()) return true;
    error(n, fmt::format("'{}' must be a list", what));
    return false;
  }

  /// Unknown keys are errors (a misspelt key would otherwise be silently ignored).
  void allow(const YAML::Node& map, std::initializer_list<std::string_view> keys, std::string_view where) {
    if (!map.IsMap()) return;
    for (const auto& kv : map) {
      const std::string k = kv.first.as<std::string>("");
      if (std::find(keys.begin(), keys.end(), k) != keys.end()) continue;
      std::string list;
      for (auto a : keys) list += (list.empty() ? "" : ", ") + std::string(a);
      error(kv.first, fmt::format("unknown key '{}' in {} (allowed: {})", k, where, list));
    }
  }

  std::optional<std::string> text(const YAML::Node& n, std::string_view key) {
    if (!n.IsScalar()) {
      error(n, fmt::format("'{}' must be a single value", key));
      return std::nullopt;
    }
    return n.Scalar();
  }

  /// A quantity of kind `k`. `cell` resolves `cells` (0: not allowed here); `period`
  /// resolves `periods` (0: not allowed here).
  std::optional<double> quantity(const YAML::Node& n, std::string_view key, Kind k, double cell = 0,
                                 double period = 0) {
    auto t = text(n, key);
    if (!t) return std::nullopt;
    std::string why;
    auto q = parse_quantity(*t, k, why);
    if (!q) {
      error(n, fmt::format("'{}': {}", key, why));
      return std::nullopt;
    }
    if (q->relative == Quantity::Relative::cells) {
      if (cell <= 0) {
        error(n, fmt::format("'{}': the unit 'cells' cannot be used here", key));
        return std::nullopt;
      }
      return q->value * cell;
    }
    if (q->relative == Quantity::Relative::periods) {
      if (period <= 0) {
        error(n, fmt::format("'{}': 'periods' needs a source frequency, and one only (the sources here have "
                             "none or several); give a time in s, ns or ps",
                             key));
        return std::nullopt;
      }
      return q->value * period;
    }
    return q->value;
  }

  std::optional<double> positive(const YAML::Node& n, std::string_view key, Kind k, double cell = 0,
                                 double period = 0) {
    auto v = quantity(n, key, k, cell, period);
    if (v && !(*v > 0)) {
      error(n, fmt::format("'{}' must be positive, got {}", key, n.Scalar()));
      return std::nullopt;
    }
    return v;
  }

  std::optional<Vec2> vec2(const YAML::Node& n, std::string_view key, Kind k, double cell = 0) {
    if (!n.IsSequence() || n.size() != 2) {
      error(n, fmt::format("'{}' must be a list of two values [x, y]", key));
      return std::nullopt;
    }
    auto a = quantity(n[0], key, k, cell), b = quantity(n[1], key, k, cell);
    if (!a || !b) return std::nullopt;
    return Vec2{*a, *b};
  }

  std::optional<std::array<double, 3>> vec3(const YAML::Node& n, std::string_view key, Kind k) {
    if (!n.IsSequence() || n.size() != 3) {
      error(n, fmt::format("'{}' must be a list of three values [x, y, z]", key));
      return std::nullopt;
    }
    auto a = quantity(n[0], key, k), b = quantity(n[1], key, k), c = quantity(n[2], key, k);
    if (!a || !b || !c) return std::nullopt;
    return std::array<double, 3>{*a, *b, *c};
  }

  std::optional<int> integer(const YAML::Node& n, std::string_view key, int lo, int hi) {
    auto t = text(n, key);
    if (!t) return std::nullopt;
    try {
      size_t used = 0;
      const long v = std::stol(*t, &used);
      if (used != t->size()) throw std::invalid_argument("");
      if (v < lo || v > hi) {
        error(n, fmt::format("'{}' must be a whole number from {} to {}, got {}", key, lo, hi, v));
        return std::nullopt;
      }
      return static_cast<int>(v);
    } catch (const std::exception&) {
      error(n, fmt::format("'{}' must be a whole number, got '{}'", key, *t));
      return std::nullopt;
    }
  }

  std::optional<bool> boolean(const YAML::Node& n, std::string_view key) {
    auto t = text(n, key);
    if (!t) return std::nullopt;
    if (*t == "true") return true;
    if (*t == "false") return false;
    error(n, fmt::format("'{}' must be true or false, got '{}'", key, *t));
    return std::nullopt;
  }

  template <class E>
  std::optional<E> choice(const YAML::Node& n, std::string_view key,
                          std::initializer_list<std::pair<std::string_view, E>> options) {
    auto t = text(n, key);
    if (!t) return std::nullopt;
    std::string list;
    for (const auto& [name, value] : options) {
      if (name == *t) return value;
      list += (list.empty() ? "" : ", ") + std::string(name);
    }
    error(n, fmt::format("'{}' must be one of {}; got '{}'", key, list, *t));
    return std::nullopt;
  }

  void require(const YAML::Node& map, std::string_view key, std::string_view where) {
    if (!map[std::string(key)]) error(map, fmt::format("{} needs the key '{}'", where, key));
  }

 private:
  Diagnostics& d_;
  std::string file_;
};

void apply_override(YAML::Node root, const std::string& item) {
  const auto eq = item.find('=');
  if (eq == std::string::npos || eq == 0)
    throw BadInput(fmt::format("--set {}: expected key.path=value", item));
  const std::string path = item.substr(0, eq), value = item.substr(eq + 1);
  std::vector<std::string> keys;
  std::stringstream ss(path);
  for (std::string k; std::getline(ss, k, '.');) keys.push_back(k);
  // yaml-cpp nodes are handles: walk with fresh handles, never assign one node to another
  std::vector<YAML::Node> chain{root};
  for (size_t a = 0; a + 1 < keys.size(); ++a) {
    YAML::Node cur = chain.back();
    const std::string& k = keys[a];
    if (cur.IsSequence()) {
      size_t idx = 0;
      try {
        idx = std::stoul(k);
      } catch (...) {
        throw BadInput(fmt::format("--set {}: '{}' should be a list index", item, k));
      }
      if (idx >= cur.size()) throw BadInput(fmt::format("--set {}: there is no item {} in that list", item, idx));
      chain.push_back(cur[idx]);
    } else {
      chain.push_back(cur[k]);
    }
  }
  YAML::Node parent = chain.back();
  YAML::Node v;
  try {
    v = YAML::Load(value);
  } catch (const YAML::Exception& e) {
    throw BadInput(fmt::format("--set {}: the value is not valid YAML ({})", item, e.msg));
  }
  if (parent.IsSequence()) {
    size_t idx = 0;
    try {
      idx = std::stoul(keys.back());
    } catch (...) {
      throw BadInput(fmt::format("--set {}: '{}' should be a list index", item, keys.back()));
    }
    if (idx >= parent.size()) throw BadInput(fmt::format("--set {}: there is no item {} in that list", item, idx));
    parent[idx] = v;
  } else {
    parent[keys.back()] = v;
  }
}

class SceneBuilder {
 public:
  SceneBuilder(Diagnostics& d, const std::string& file) : r_(d, file) { scene_.file = file; }

  Scene build(const YAML::Node& root) {
    if (!root.IsMap()) {
      r_.error(root, "a scene file must be a map with the keys title, grid, time, media, bodies, sources, outputs");
      return scene_;
    }
    r_.allow(root, {"title", "grid", "time", "bias", "media", "bodies", "sources", "outputs"}, "the scene");
    for (auto k : {"grid", "time", "sources"}) r_.require(root, k, "the scene");
    if (root["title"]) {
      if (auto t = r_.text(root["title"], "title")) scene_.title = *t;
    }
    if (root["bias"]) {
      if (auto b = r_.vec3(root["bias"], "bias", Kind::magnetic_field)) scene_.bias = *b;
    }
    if (root["media"]) read_media(root["media"]);
    if (root["sources"] && r_.is_seq(root["sources"], "sources")) prescan_sources(root["sources"]);
    if (root["grid"] && r_.is_map(root["grid"], "grid")) read_grid(root["grid"]);
    if (root["time"] && r_.is_map(root["time"], "time")) read_time(root["time"]);
    if (root["bodies"] && r_.is_seq(root["bodies"], "bodies"))
      for (const auto& b : root["bodies"]) read_body(b);
    if (root["sources"] && root["sources"].IsSequence()) {
      if (root["sources"].size() == 0) r_.error(root["sources"], "'sources' is empty: a run needs at least one source");
      for (size_t k = 0; k < root["sources"].size(); ++k) read_source(root["sources"][k], k);
    }
    if (root["outputs"] && r_.is_seq(root["outputs"], "outputs"))
      for (const auto& o : root["outputs"]) read_output(o);
    return scene_;
  }

 private:
  Reader r_;
  Scene scene_;
  double f_top_ = 0;            // highest frequency of any source's band
  double common_period_ = 0;    // 1/f when every source shares one frequency
  std::vector<double> freq_;    // each source's frequency (0 = unknown)
  bool grid_ok_ = false;

  double cell() const { return grid_ok_ ? scene_.grid.dx : 0; }

  void read_media(const YAML::Node& m) {
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
      r_.allow(v, {"permittivity", "conductivity", "perfect-conductor", "magnet"}, where);
      if (v["magnet"]) med.magnet = read_magnet(v["magnet"], where);
      if (med.magnet && v["perfect-conductor"] && v["perfect-conductor"].Scalar() == "true")
        r_.error(v["perfect-conductor"], fmt::format("{}: a perfect conductor cannot also be a magnet", where));
      if (const auto& p = v["permittivity"]) {
        if (p.IsSequence()) {
          if (auto e = r_.vec3(p, "permittivity", Kind::dimensionless)) med.permittivity = *e;
        } else if (auto e = r_.quantity(p, "permittivity", Kind::dimensionless)) {
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

  std::optional<std::array<double, 3>> unit_vector(const YAML::Node& n, std::string_view key) {
    auto v = r_.vec3(n, key, Kind::dimensionless);
    if (!v) return std::nullopt;
    const double norm = std::sqrt((*v)[0] * (*v)[0] + (*v)[1] * (*v)[1] + (*v)[2] * (*v)[2]);
    if (!(norm > 0)) {
      r_.error(n, fmt::format("'{}' must be a non-zero direction", key));
      return std::nullopt;
    }
    return std::array<double, 3>{(*v)[0] / norm, (*v)[1] / norm, (*v)[2] / norm};
  }

  std::optional<Magnet> read_magnet(const YAML::Node& m, const std::string& where) {
    const std::string here = where + ": magnet";
    if (!r_.is_map(m, "magnet")) return std::nullopt;
    r_.allow(m, {"sublattices", "exchange", "exchange-constant", "anisotropy", "dzyaloshinskii", "order"}, here);
    Magnet g;
    bool ok = true;
    const YAML::Node& subs = m["sublattices"];
    if (!subs) {
      r_.error(m, fmt::format("{} needs 'sublattices' (one for a ferromagnet, two for an antiferro- or ferrimagnet)", here));
      return std::nullopt;
    }
    if (!r_.is_seq(subs, "sublattices")) return std::nullopt;
    if (subs.size() < 1 || subs.size() > 2) {
      r_.error(subs, fmt::format("{}: 'sublattices' must list one or two sublattices, got {}", here, subs.size()));
      return std::nullopt;
    }
    for (const auto& sl : subs) {
      Sublattice s;
      if (!r_.is_map(sl, "sublattice")) {
        ok = false;
        continue;
      }
      r_.allow(sl, {"saturation", "g", "damping"}, "a sublattice");
      if (!sl["saturation"]) {
        r_.error(sl, "a sublattice needs 'saturation' (mu0*Ms, e.g. 0.75 T)");
        ok = false;
      } else if (auto v = r_.positive(sl["saturation"], "saturation", Kind::magnetic_field)) {
        s.saturation = *v;
      } else {
        ok = false;
      }
      if (sl["g"])
        if (auto v = r_.positive(sl["g"], "g", Kind::dimensionless)) s.g = *v;
      if (sl["damping"])
        if (auto v = r_.quantity(sl["damping"], "damping", Kind::dimensionless)) {
          if (*v < 0 || *v >= 1) r_.error(sl["damping"], "'damping' (Gilbert alpha) must lie in [0, 1)");
          s.damping = *v;
        }
      g.sublattices.push_back(s);
    }
    const bool two = subs.size() == 2;
    if (!two) {
      for (auto k : {"exchange", "exchange-constant", "dzyaloshinskii"})
        if (m[k]) r_.error(m[k], fmt::format("{}: '{}' needs two sublattices", here, k));
    } else if (m["exchange"] && m["exchange-constant"]) {
      r_.error(m["exchange-constant"], fmt::format("{}: give 'exchange' or 'exchange-constant', not both", here));
      ok = false;
    } else if (m["exchange"]) {
      if (auto v = r_.quantity(m["exchange"], "exchange", Kind::magnetic_field)) {
        if (ok && g.sublattices[0].saturation != g.sublattices[1].saturation)
          r_.error(m["exchange"], fmt::format("{}: 'exchange' (mu0*H_E = lambda*mu0*Ms) is defined for equal moments; "
                                              "for unequal ones give 'exchange-constant' (lambda)",
                                              here));
        else if (ok)
          g.lambda = *v / g.sublattices[0].saturation;
      }
    } else if (m["exchange-constant"]) {
      if (auto v = r_.quantity(m["exchange-constant"], "exchange-constant", Kind::dimensionless)) g.lambda = *v;
    } else {
      r_.error(m, fmt::format("{}: two sublattices need 'exchange' (mu0*H_E, T) or 'exchange-constant' (lambda)", here));
      ok = false;
    }
    if (const auto& a = m["anisotropy"]) {
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
          if (auto v = unit_vector(t["axis"], "axis")) u.axis = *v; else ok = false;
          if (auto v = r_.quantity(t["field"], "field", Kind::magnetic_field)) u.field = *v; else ok = false;
          g.anisotropy.push_back(u);
        }
      if (g.anisotropy.size() > 4) {
        r_.error(a, fmt::format("{}: at most four anisotropy terms are supported", here));
        ok = false;
      }
    }
    if (two && m["dzyaloshinskii"])
      if (auto v = r_.vec3(m["dzyaloshinskii"], "dzyaloshinskii", Kind::magnetic_field)) g.dzyaloshinskii = *v;
    if (m["order"]) {
      if (auto v = unit_vector(m["order"], "order")) g.order = *v; else ok = false;
    }
    if (!ok) return std::nullopt;
    return g;
  }

  // Frequencies and waveforms first: they decide cells-per-wavelength and 'periods'.
  void prescan_sources(const YAML::Node& list) {
    Diagnostics quiet;  // errors are reported by read_source
    Reader q(quiet, "");
    std::set<double> freqs;
    for (const auto& item : list) {
      double f = 0;
      if (item.IsMap() && item.size() == 1) {
        const YAML::Node body = item.begin()->second;
        if (body.IsMap() && body["frequency"]) {
          if (auto v = q.quantity(body["frequency"], "frequency", Kind::frequency)) f = *v;
        }
        Source s;
        s.frequency = f;
        if (body.IsMap() && body["waveform"] && body["waveform"].IsMap()) {
          const auto& w = body["waveform"];
          const std::string kind = w["kind"] ? w["kind"].as<std::string>("") : "";
          if (kind == "pulse" && w["fwhm"]) {
            s.waveform.kind = Waveform::Kind::pulse;
            if (auto v = q.quantity(w["fwhm"], "fwhm", Kind::time)) s.waveform.fwhm = *v;
            if (!(s.waveform.fwhm > 0)) s.waveform.kind = Waveform::Kind::cw;
          } else if (kind == "chirp") {
            s.waveform.kind = Waveform::Kind::chirp;
            if (w["from"])
              if (auto v = q.quantity(w["from"], "from", Kind::frequency)) s.waveform.from = *v;
            if (w["to"])
              if (auto v = q.quantity(w["to"], "to", Kind::frequency)) s.waveform.to = *v;
            if (f == 0) s.frequency = f = 0.5 * (s.waveform.from + s.waveform.to);
          }
        }
        if (f > 0) f_top_ = std::max(f_top_, source_band(s).hi);
      }
      freq_.push_back(f);
      if (f > 0) freqs.insert(f);
    }
    if (freqs.size() == 1) common_period_ = 1.0 / *freqs.begin();
  }

  void read_grid(const YAML::Node& g) {
    r_.allow(g, {"extent", "cell", "cells-per-wavelength", "boundaries", "absorber", "origin"}, "grid");
    GridSpec& G = scene_.grid;
    r_.require(g, "extent", "grid");
    bool ok = true;
    if (g["extent"]) {
      if (auto e = r_.vec2(g["extent"], "extent", Kind::length)) {
        G.extent = *e;
        if (!(e->x > 0 && e->y > 0)) {
          r_.error(g["extent"], "'extent' must have two positive sizes");
          ok = false;
        }
      } else {
        ok = false;
      }
    }
    if (g["cell"] && g["cells-per-wavelength"]) {
      r_.error(g["cells-per-wavelength"], "grid: give either 'cell' or 'cells-per-wavelength', not both");
      ok = false;
    } else if (const auto& c = g["cell"]) {
      bool read = false;
      if (c.IsSequence()) {
        if (auto v = r_.vec2(c, "cell", Kind::length)) {
          G.dx = v->x;
          G.dy = v->y;
          read = true;
        }
      } else if (auto v = r_.quantity(c, "cell", Kind::length)) {
        G.dx = G.dy = *v;
        read = true;
      }
      if (!read) {
        ok = false;
      } else if (!(G.dx > 0 && G.dy > 0)) {
        r_.error(c, "'cell' must be a positive length");
        ok = false;
      }
    } else if (const auto& n = g["cells-per-wavelength"]) {
      if (auto v = r_.quantity(n, "cells-per-wavelength", Kind::dimensionless)) {
        if (!(*v >= 2)) {
          r_.error(n, "'cells-per-wavelength' must be at least 2");
          ok = false;
        } else if (f_top_ <= 0) {
          r_.error(n, "'cells-per-wavelength' needs a source with a frequency");
          ok = false;
        } else {
          double n_max = 1.0;
          for (const auto& m : scene_.media)
            if (!m.perfect_conductor)
              for (double e : m.permittivity) n_max = std::max(n_max, std::sqrt(e));
          G.dx = G.dy = c0 / (f_top_ * n_max) / *v;
        }
      } else {
        ok = false;
      }
    } else {
      r_.error(g, "grid needs 'cell' or 'cells-per-wavelength'");
      ok = false;
    }
    if (const auto& b = g["boundaries"]) {
      if (r_.is_map(b, "boundaries")) {
        r_.allow(b, {"x", "y"}, "boundaries");
        const std::initializer_list<std::pair<std::string_view, Boundary>> opts = {
            {"absorbing", Boundary::absorbing},
            {"periodic", Boundary::periodic},
            {"electric-wall", Boundary::electric_wall},
            {"magnetic-wall", Boundary::magnetic_wall}};
        if (b["x"])
          if (auto v = r_.choice<Boundary>(b["x"], "boundaries.x", opts)) G.bx = *v;
        if (b["y"])
          if (auto v = r_.choice<Boundary>(b["y"], "boundaries.y", opts)) G.by = *v;
      }
    }
    if (const auto& a = g["absorber"]) {
      if (r_.is_map(a, "absorber")) {
        r_.allow(a, {"cells", "grading", "strength", "kappa", "alpha"}, "absorber");
        Absorber& A = G.absorber;
        if (a["cells"])
          if (auto v = r_.integer(a["cells"], "absorber.cells", 1, 200)) A.cells = *v;
        if (a["grading"])
          if (auto v = r_.quantity(a["grading"], "absorber.grading", Kind::dimensionless)) {
            if (*v < 1 || *v > 6) r_.error(a["grading"], "'absorber.grading' must lie between 1 and 6");
            A.grading = *v;
          }
        if (a["strength"])
          if (auto v = r_.quantity(a["strength"], "absorber.strength", Kind::dimensionless)) {
            if (!(*v > 0)) r_.error(a["strength"], "'absorber.strength' must be positive");
            A.strength = *v;
          }
        if (a["kappa"])
          if (auto v = r_.quantity(a["kappa"], "absorber.kappa", Kind::dimensionless)) {
            if (!(*v >= 1)) r_.error(a["kappa"], "'absorber.kappa' must be at least 1");
            A.kappa_max = *v;
          }
        if (a["alpha"])
          if (auto v = r_.quantity(a["alpha"], "absorber.alpha", Kind::conductivity)) {
            if (*v < 0) r_.error(a["alpha"], "'absorber.alpha' must not be negative");
            A.alpha_max = *v;
          }
      }
    }
    if (const auto& o = g["origin"]) {
      if (auto v = r_.choice<bool>(o, "origin", {{"centre", false}, {"corner", true}})) G.origin_corner = *v;
    }
    if (!ok) return;
    // whole numbers of cells: the extent is rounded and the user told
    const double nx = std::max(1.0, std::round(G.extent.x / G.dx)), ny = std::max(1.0, std::round(G.extent.y / G.dy));
    if (nx * ny > 4e9) {
      r_.error(g, fmt::format("grid: {} x {} cells is more than this version can hold", nx, ny));
      return;
    }
    if (std::abs(nx * G.dx - G.extent.x) > 1e-6 * G.dx || std::abs(ny * G.dy - G.extent.y) > 1e-6 * G.dy)
      scene_.warnings.push_back(fmt::format("grid: extent rounded to whole cells: {} x {} cells = {:.6g} m x {:.6g} m",
                                            nx, ny, nx * G.dx, ny * G.dy));
    G.extent = {nx * G.dx, ny * G.dy};
    if (!G.origin_corner) scene_.origin_shift = {0.5 * G.extent.x, 0.5 * G.extent.y};
    grid_ok_ = true;
  }

  void read_time(const YAML::Node& t) {
    if (t["courant"]) r_.error(t["courant"], "'time.courant' is now called 'time.step-fraction' (same meaning)");
    r_.allow(t, {"stop", "step-fraction", "courant", "precision", "threads"}, "time");
    r_.require(t, "stop", "time");
    if (t["stop"])
      if (auto v = r_.positive(t["stop"], "time.stop", Kind::time, 0, common_period_)) scene_.time.stop = *v;
    if (t["step-fraction"])
      if (auto v = r_.quantity(t["step-fraction"], "time.step-fraction", Kind::dimensionless)) {
        if (!(*v > 0 && *v < 1))
          r_.error(t["step-fraction"], fmt::format("'time.step-fraction' must lie in (0, 1), got {}", *v));
        scene_.time.step_fraction = *v;
      }
    if (t["precision"])
      if (auto v = r_.choice<Precision>(t["precision"], "time.precision",
                             {{"double", Precision::double_}, {"single", Precision::single}}))
        scene_.time.precision = *v;
    if (t["threads"]) {
      if (t["threads"].IsScalar() && t["threads"].Scalar() == "auto")
        scene_.time.threads = 0;
      else if (auto v = r_.integer(t["threads"], "time.threads", 1, 4096))
        scene_.time.threads = *v;
    }
  }

  Vec2 to_internal(Vec2 p) const { return {p.x + scene_.origin_shift.x, p.y + scene_.origin_shift.y}; }

  bool inside_extent(Vec2 p) const {
    const double tol = 1e-9 * scene_.grid.dx;
    return p.x >= -tol && p.y >= -tol && p.x <= scene_.grid.extent.x + tol && p.y <= scene_.grid.extent.y + tol;
  }

  void read_body(const YAML::Node& b) {
    if (!r_.is_map(b, "bodies item")) return;
    r_.allow(b, {"medium", "rectangle", "circle", "polygon", "sample"}, "a body");
    Body body;
    body.where = r_.mark(b);
    bool ok = true;
    if (!b["medium"]) {
      r_.error(b, "a body needs the key 'medium'");
      ok = false;
    } else if (auto name = r_.text(b["medium"], "medium")) {
      auto it = std::find_if(scene_.media.begin(), scene_.media.end(), [&](const Medium& m) { return m.name == *name; });
      if (it == scene_.media.end()) {
        r_.error(b["medium"], fmt::format("body medium '{}' is not defined under 'media'", *name));
        ok = false;
      } else {
        body.medium = static_cast<int>(it - scene_.media.begin());
      }
    }
    int shapes = 0;
    for (auto k : {"rectangle", "circle", "polygon"}) shapes += b[k] ? 1 : 0;
    if (shapes != 1) {
      r_.error(b, "a body needs exactly one shape: rectangle, circle or polygon");
      return;
    }
    if (b["sample"])
      if (auto v = r_.boolean(b["sample"], "sample")) body.sample = *v;
    const double dx = cell();
    Shape& s = body.shape;
    if (const auto& r = b["rectangle"]) {
      s.kind = Shape::Kind::rectangle;
      if (!r_.is_map(r, "rectangle")) return;
      r_.allow(r, {"centre", "size", "rotate"}, "rectangle");
      r_.require(r, "centre", "rectangle");
      r_.require(r, "size", "rectangle");
      if (r["centre"]) {
        if (auto v = r_.vec2(r["centre"], "centre", Kind::length, dx)) s.centre = to_internal(*v); else ok = false;
      }
      if (r["size"]) {
        if (auto v = r_.vec2(r["size"], "size", Kind::length, dx)) {
          s.size = *v;
          if (!(v->x > 0 && v->y > 0)) {
            r_.error(r["size"], "rectangle 'size' must be positive");
            ok = false;
          }
        } else {
          ok = false;
        }
      }
      if (r["rotate"])
        if (auto v = r_.quantity(r["rotate"], "rotate", Kind::angle)) s.rotate = *v;
      ok = ok && r["centre"] && r["size"];
    } else if (const auto& c = b["circle"]) {
      s.kind = Shape::Kind::circle;
      if (!r_.is_map(c, "circle")) return;
      r_.allow(c, {"centre", "radius"}, "circle");
      r_.require(c, "centre", "circle");
      r_.require(c, "radius", "circle");
      if (c["centre"]) {
        if (auto v = r_.vec2(c["centre"], "centre", Kind::length, dx)) s.centre = to_internal(*v); else ok = false;
      }
      if (c["radius"]) {
        if (auto v = r_.positive(c["radius"], "radius", Kind::length, dx)) s.radius = *v; else ok = false;
      }
      ok = ok && c["centre"] && c["radius"];
    } else if (const auto& p = b["polygon"]) {
      s.kind = Shape::Kind::polygon;
      if (!r_.is_seq(p, "polygon")) return;
      if (p.size() < 3) {
        r_.error(p, "a polygon needs at least three vertices");
        ok = false;
      }
      for (const auto& v : p) {
        if (auto q = r_.vec2(v, "polygon vertex", Kind::length, dx)) s.vertices.push_back(to_internal(*q)); else ok = false;
      }
    }
    if (ok && grid_ok_) {
      Vec2 lo, hi;
      s.bounds(lo, hi);
      if (hi.x <= 0 || hi.y <= 0 || lo.x >= scene_.grid.extent.x || lo.y >= scene_.grid.extent.y)
        r_.error(b, "the body lies wholly outside the grid's extent");
    }
    if (ok) scene_.bodies.push_back(body);
  }

  Waveform read_waveform(const YAML::Node& w, double f) {
    Waveform wf;
    if (!r_.is_map(w, "waveform")) return wf;
    r_.require(w, "kind", "waveform");
    if (!w["kind"]) return wf;
    auto kind = r_.choice<Waveform::Kind>(w["kind"], "waveform.kind",
                          {{"cw", Waveform::Kind::cw}, {"pulse", Waveform::Kind::pulse}, {"chirp", Waveform::Kind::chirp}});
    if (!kind) return wf;
    wf.kind = *kind;
    const double period = f > 0 ? 1.0 / f : 0;
    switch (wf.kind) {
      case Waveform::Kind::cw:
        r_.allow(w, {"kind", "ramp"}, "a cw waveform");
        wf.ramp = 10 * period;
        if (w["ramp"])
          if (auto v = r_.quantity(w["ramp"], "ramp", Kind::time, 0, period)) {
            if (*v < 0) r_.error(w["ramp"], "'ramp' must not be negative");
            wf.ramp = *v;
          }
        break;
      case Waveform::Kind::pulse:
        r_.allow(w, {"kind", "fwhm", "delay"}, "a pulse waveform");
        r_.require(w, "fwhm", "a pulse waveform");
        if (w["fwhm"])
          if (auto v = r_.positive(w["fwhm"], "fwhm", Kind::time, 0, period)) wf.fwhm = *v;
        wf.delay = 2.0 * wf.fwhm;
        if (w["delay"])
          if (auto v = r_.quantity(w["delay"], "delay", Kind::time, 0, period)) wf.delay = *v;
        break;
      case Waveform::Kind::chirp:
        r_.allow(w, {"kind", "from", "to", "length"}, "a chirp waveform");
        for (auto k : {"from", "to", "length"}) r_.require(w, k, "a chirp waveform");
        if (w["from"])
          if (auto v = r_.positive(w["from"], "from", Kind::frequency)) wf.from = *v;
        if (w["to"])
          if (auto v = r_.positive(w["to"], "to", Kind::frequency)) wf.to = *v;
        if (w["length"])
          if (auto v = r_.positive(w["length"], "length", Kind::time)) wf.length = *v;
        break;
    }
    return wf;
  }

  void read_source(const YAML::Node& item, size_t index) {
    if (!item.IsMap() || item.size() != 1) {
      r_.error(item, "each source is one of 'point', 'beam' or 'plane' with its keys below it");
      return;
    }
    const std::string kind = item.begin()->first.as<std::string>("");
    const YAML::Node s = item.begin()->second;  // a copy: the iterator is a temporary
    Source src;
    src.where = r_.mark(item.begin()->first);
    if (kind == "point") src.kind = Source::Kind::point;
    else if (kind == "beam") src.kind = Source::Kind::beam;
    else if (kind == "plane") src.kind = Source::Kind::plane;
    else {
      r_.error(item.begin()->first, fmt::format("unknown source kind '{}' (point, beam or plane)", kind));
      return;
    }
    if (!r_.is_map(s, kind)) return;
    const double dx = cell();
    bool ok = true;
    auto need = [&](const char* k) {
      if (!s[k]) {
        r_.error(s, fmt::format("a {} source needs the key '{}'", kind, k));
        ok = false;
        return false;
      }
      return true;
    };
    const std::initializer_list<std::pair<std::string_view, Component>> all_components = {
        {"Ex", Component::Ex}, {"Ey", Component::Ey}, {"Ez", Component::Ez},
        {"Hx", Component::Hx}, {"Hy", Component::Hy}, {"Hz", Component::Hz}};
    const std::initializer_list<std::pair<std::string_view, Component>> polarizations = {{"Ez", Component::Ez},
                                                                                         {"Hz", Component::Hz}};
    if (src.kind == Source::Kind::point) {
      r_.allow(s, {"at", "component", "amplitude", "spread", "frequency", "waveform"}, "a point source");
      if (need("component"))
        if (auto c = r_.choice<Component>(s["component"], "component", all_components)) src.component = *c;
    } else {
      if (src.kind == Source::Kind::beam)
        r_.allow(s, {"polarization", "frequency", "waist", "focus", "angle", "launch", "amplitude", "waveform"},
                 "a beam source");
      else
        r_.allow(s, {"polarization", "direction", "launch", "frequency", "amplitude", "waveform"}, "a plane source");
      if (need("polarization"))
        if (auto c = r_.choice<Component>(s["polarization"], "polarization", polarizations)) src.component = *c;
    }
    src.frequency = index < freq_.size() ? freq_[index] : 0;
    if (s["frequency"]) {
      if (auto f = r_.positive(s["frequency"], "frequency", Kind::frequency)) src.frequency = *f; else ok = false;
    }
    if (need("waveform")) src.waveform = read_waveform(s["waveform"], src.frequency);
    if (src.waveform.kind != Waveform::Kind::chirp && !s["frequency"]) {
      r_.error(s, fmt::format("a {} source needs the key 'frequency'", kind));
      ok = false;
    }
    if (need("amplitude")) {
      const Kind k = src.kind != Source::Kind::point ? Kind::electric_field
                     : is_electric(src.component) ? Kind::current : Kind::voltage;
      if (auto a = r_.quantity(s["amplitude"], "amplitude", k)) src.amplitude = *a; else ok = false;
    }
    if (src.kind == Source::Kind::point) {
      if (need("at")) {
        if (auto p = r_.vec2(s["at"], "at", Kind::length, dx)) {
          src.at = to_internal(*p);
          if (grid_ok_ && !inside_extent(src.at)) {
            r_.error(s["at"], "the point source lies outside the grid's extent (inside or beyond the absorber)");
            ok = false;
          }
        } else {
          ok = false;
        }
      }
      src.spread = 0;
      if (s["spread"])
        if (auto v = r_.quantity(s["spread"], "spread", Kind::length, dx)) {
          if (*v < 0) r_.error(s["spread"], "'spread' must not be negative");
          src.spread = *v;
        }
    } else {
      if (need("launch")) read_launch(s["launch"], src, ok);
      if (src.kind == Source::Kind::beam) {
        if (need("waist")) {
          if (auto v = r_.positive(s["waist"], "waist", Kind::length, dx)) src.waist = *v; else ok = false;
        }
        if (need("focus")) {
          if (auto p = r_.vec2(s["focus"], "focus", Kind::length, dx)) src.focus = to_internal(*p); else ok = false;
        }
        if (s["angle"])
          if (auto v = r_.quantity(s["angle"], "angle", Kind::angle)) src.angle = *v;
      } else if (need("direction")) {
        if (auto d = r_.choice<double>(s["direction"], "direction",
                                       {{"+x", 0.0}, {"-x", pi}, {"+y", 0.5 * pi}, {"-y", -0.5 * pi}})) {
          src.angle = *d;
          const char axis = (*d == 0.0 || *d == pi) ? 'x' : 'y';
          if (s["launch"] && s["launch"].IsMap() && src.line_axis != axis) {
            r_.error(s["direction"], fmt::format("a plane wave travelling {} needs a launch line {{{}: ...}}",
                                                 s["direction"].Scalar(), axis));
            ok = false;
          }
        }
      }
      if (ok && s["launch"]) {
        const double c = std::cos(src.angle), sn = std::sin(src.angle);
        if ((src.line_axis == 'x' ? std::abs(c) : std::abs(sn)) < 0.17) {
          r_.error(s["angle"] ? s["angle"] : s["launch"],
                   "the beam travels almost along its launch line (within 80 degrees of the line's normal is needed)");
          ok = false;
        }
      }
    }
    if (ok) scene_.sources.push_back(src);
  }

  void read_launch(const YAML::Node& l, Source& src, bool& ok) {
    if (!r_.is_map(l, "launch") || l.size() != 1 || !(l["x"] || l["y"])) {
      r_.error(l, "'launch' must be {x: ...} or {y: ...}");
      ok = false;
      return;
    }
    src.line_axis = l["x"] ? 'x' : 'y';
    const YAML::Node v = l[std::string(1, src.line_axis)];
    auto q = r_.quantity(v, "launch", Kind::length, cell());
    if (!q) {
      ok = false;
      return;
    }
    const double shift = src.line_axis == 'x' ? scene_.origin_shift.x : scene_.origin_shift.y;
    src.line_at = *q + shift;
    const double top = src.line_axis == 'x' ? scene_.grid.extent.x : scene_.grid.extent.y;
    if (grid_ok_ && (src.line_at < 0 || src.line_at > top)) {
      r_.error(v, "the launch line lies outside the grid's extent (inside or beyond the absorber)");
      ok = false;
    }
  }

  /// The `name` of a probe, power spectrum or spectral map: required, plain, unique among its kind.
  bool read_output_name(const YAML::Node& o, Output& out, const char* what) {
    if (!o["name"]) {
      r_.error(o, fmt::format("a {} needs the key 'name'", what));
      return false;
    }
    auto n = r_.text(o["name"], "name");
    if (!n) return false;
    out.name = *n;
    if (n->empty() || n->find_first_of("/ .") != std::string::npos) {
      r_.error(o["name"], fmt::format("{} name '{}' must be non-empty without '/', '.' or spaces", what, *n));
      return false;
    }
    for (const auto& other : scene_.outputs)
      if (other.kind == out.kind && other.name == out.name) {
        r_.error(o["name"], fmt::format("{} name '{}' is used twice", what, out.name));
        return false;
      }
    return true;
  }

  /// An optional `region: {centre, size}`; false when given but broken.
  bool read_region(const YAML::Node& o, Output& out) {
    const YAML::Node& rg = o["region"];
    if (!rg) return true;
    if (!r_.is_map(rg, "region")) return false;
    r_.allow(rg, {"centre", "size"}, "region");
    auto c = rg["centre"] ? r_.vec2(rg["centre"], "centre", Kind::length, cell()) : std::nullopt;
    auto z = rg["size"] ? r_.vec2(rg["size"], "size", Kind::length, cell()) : std::nullopt;
    if (!c || !z || !(z->x > 0 && z->y > 0)) {
      r_.error(rg, "'region' needs a centre and a positive size");
      return false;
    }
    out.region = {true, to_internal(*c), *z};
    return true;
  }

  void read_power_spectrum(const YAML::Node& o, Output& out) {
    out.kind = Output::Kind::power_spectrum;
    if (!r_.is_map(o, "power-spectrum")) return;
    r_.allow(o, {"name", "line", "band"}, "a power-spectrum output");
    bool ok = read_output_name(o, out, "power-spectrum output");
    const GridSpec& G = scene_.grid;
    if (!o["line"]) {
      r_.error(o, "a power-spectrum output needs the key 'line': {x: ...}, {y: ...} or {from: [...], to: [...]}");
      ok = false;
    } else if (r_.is_map(o["line"], "line")) {
      const YAML::Node& l = o["line"];
      r_.allow(l, {"x", "y", "from", "to"}, "a power-spectrum line");
      if (l["x"] && l.size() == 1) {
        if (auto v = r_.quantity(l["x"], "line.x", Kind::length, cell())) {
          const double x = *v + scene_.origin_shift.x;
          out.from = {x, G.extent.y}, out.to = {x, 0};  // positive towards +x
          if (grid_ok_ && (x < 0 || x > G.extent.x)) r_.error(l["x"], "the power-spectrum line lies outside the grid's extent"), ok = false;
        } else ok = false;
      } else if (l["y"] && l.size() == 1) {
        if (auto v = r_.quantity(l["y"], "line.y", Kind::length, cell())) {
          const double y = *v + scene_.origin_shift.y;
          out.from = {0, y}, out.to = {G.extent.x, y};  // positive towards +y
          if (grid_ok_ && (y < 0 || y > G.extent.y)) r_.error(l["y"], "the power-spectrum line lies outside the grid's extent"), ok = false;
        } else ok = false;
      } else if (l["from"] && l["to"] && l.size() == 2) {
        auto a = r_.vec2(l["from"], "from", Kind::length, cell()), b = r_.vec2(l["to"], "to", Kind::length, cell());
        if (a && b) {
          out.from = to_internal(*a), out.to = to_internal(*b);
          if (grid_ok_ && (!inside_extent(out.from) || !inside_extent(out.to)))
            r_.error(l, "the power-spectrum line must lie inside the grid's extent"), ok = false;
          if (std::hypot(out.to.x - out.from.x, out.to.y - out.from.y) <= 0) r_.error(l, "the power-spectrum line has no length"), ok = false;
        } else ok = false;
      } else {
        r_.error(l, "'line' must be {x: ...}, {y: ...} or {from: [...], to: [...]}");
        ok = false;
      }
    }
    if (!o["band"]) {
      r_.error(o, "a power-spectrum output needs the key 'band': {from: ..., to: ..., count: ...}");
      ok = false;
    } else if (r_.is_map(o["band"], "band")) {
      const YAML::Node& b = o["band"];
      r_.allow(b, {"from", "to", "count"}, "a band");
      for (auto k : {"from", "to", "count"}) r_.require(b, k, "a band");
      if (b["from"]) { if (auto v = r_.positive(b["from"], "band.from", Kind::frequency)) out.band_from = *v; else ok = false; }
      if (b["to"]) { if (auto v = r_.positive(b["to"], "band.to", Kind::frequency)) out.band_to = *v; else ok = false; }
      if (b["count"]) { if (auto v = r_.integer(b["count"], "band.count", 1, 100000)) out.count = *v; else ok = false; }
      if (ok && out.count > 1 && !(out.band_to > out.band_from)) {
        r_.error(b, "'band.to' must lie above 'band.from'");
        ok = false;
      }
      ok = ok && b["from"] && b["to"] && b["count"];
    } else {
      ok = false;
    }
    if (ok) scene_.outputs.push_back(out);
  }

  void read_spectral_map(const YAML::Node& o, Output& out) {
    out.kind = Output::Kind::spectral_map;
    if (!r_.is_map(o, "spectral-map")) return;
    r_.allow(o, {"name", "frequencies", "fields", "stride", "region"}, "a spectral-map output");
    bool ok = true;
    for (auto k : {"frequencies", "fields"})
      if (!o[k]) r_.error(o, fmt::format("a spectral-map output needs the key '{}'", k)), ok = false;
    ok = read_output_name(o, out, "spectral-map output") && ok;
    if (o["frequencies"] && r_.is_seq(o["frequencies"], "frequencies")) {
      for (const auto& f : o["frequencies"])
        if (auto v = r_.positive(f, "frequencies", Kind::frequency)) out.frequencies.push_back(*v); else ok = false;
      if (out.frequencies.empty()) r_.error(o["frequencies"], "'frequencies' is empty"), ok = false;
    }
    if (o["fields"] && r_.is_seq(o["fields"], "fields")) {
      static const std::set<std::string> allowed = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz", "Sx", "Sy", "S"};
      for (const auto& f : o["fields"]) {
        const std::string name = f.IsScalar() ? f.Scalar() : "";
        if (!allowed.count(name))
          r_.error(f, fmt::format("field '{}' cannot go in a spectral map (Ex Ey Ez Hx Hy Hz Sx Sy S)", name)), ok = false;
        else if (std::find(out.fields.begin(), out.fields.end(), name) != out.fields.end())
          r_.error(f, fmt::format("field '{}' is listed twice", name));
        else
          out.fields.push_back(name);
      }
    }
    if (o["stride"])
      if (auto v = r_.integer(o["stride"], "stride", 1, 1 << 20)) out.stride = *v;
    ok = read_region(o, out) && ok;
    if (ok) scene_.outputs.push_back(out);
  }

  void read_output(const YAML::Node& item) {
    if (!item.IsMap() || item.size() != 1) {
      r_.error(item, "each output is one of 'snapshots', 'probe', 'power-spectrum' or 'spectral-map' with its keys below it");
      return;
    }
    const std::string kind = item.begin()->first.as<std::string>("");
    Output out;
    out.where = r_.mark(item.begin()->first);
    const YAML::Node o = item.begin()->second;  // a copy: the iterator is a temporary
    if (kind == "snapshots") out.kind = Output::Kind::snapshots;
    else if (kind == "probe") out.kind = Output::Kind::probe;
    else if (kind == "power-spectrum") {
      read_power_spectrum(o, out);
      return;
    } else if (kind == "spectral-map") {
      read_spectral_map(o, out);
      return;
    } else if (kind == "flux") {
      r_.error(item.begin()->first, "the output 'flux' is now called 'power-spectrum' (same keys)");
      return;
    } else {
      r_.error(item.begin()->first,
               fmt::format("unknown output '{}' (snapshots, probe, power-spectrum or spectral-map)", kind));
      return;
    }
    if (!r_.is_map(o, kind)) return;
    bool ok = true;
    if (out.kind == Output::Kind::snapshots) {
      r_.allow(o, {"fields", "every", "stride", "region"}, "snapshots");
      out.name = "snapshots";
      if (!o["every"]) {
        r_.error(o, "snapshots need the key 'every'");
        ok = false;
      } else if (auto v = r_.positive(o["every"], "every", Kind::time, 0, common_period_)) {
        out.every = *v;
      } else {
        ok = false;
      }
      if (o["stride"])
        if (auto v = r_.integer(o["stride"], "stride", 1, 1 << 20)) out.stride = *v;
      ok = read_region(o, out) && ok;
      for (const auto& other : scene_.outputs)
        if (other.kind == Output::Kind::snapshots) {
          r_.error(item.begin()->first, "only one 'snapshots' output is allowed");
          ok = false;
        }
    } else {
      r_.allow(o, {"name", "at", "fields"}, "a probe");
      ok = read_output_name(o, out, "probe") && ok;
      if (!o["at"]) {
        r_.error(o, "a probe needs the key 'at'");
        ok = false;
      } else if (auto p = r_.vec2(o["at"], "at", Kind::length, cell())) {
        out.at = to_internal(*p);
        if (grid_ok_ && !inside_extent(out.at)) {
          r_.error(o["at"], "the probe lies outside the grid's extent");
          ok = false;
        }
      } else {
        ok = false;
      }
    }
    if (!o["fields"]) {
      r_.error(o, fmt::format("{} needs the key 'fields'", kind));
      ok = false;
    } else if (r_.is_seq(o["fields"], "fields")) {
      static const std::set<std::string> wave = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz", "Sx", "Sy", "S"};
      static const std::set<std::string> magnetic = {"Mx", "My", "Mz", "Lx", "Ly", "Lz", "dLx", "dLy", "dLz",
                                                     "M1x", "M1y", "M1z", "M2x", "M2y", "M2z"};
      for (const auto& f : o["fields"]) {
        const std::string name = f.IsScalar() ? f.Scalar() : "";
        if (wave.count(name)) {
          if (std::find(out.fields.begin(), out.fields.end(), name) != out.fields.end())
            r_.error(f, fmt::format("field '{}' is listed twice", name));
          else
            out.fields.push_back(name);
        } else if (magnetic.count(name)) {
          bool any = false;
          for (const auto& m : scene_.media) any |= m.magnet.has_value();
          if (!any) {
            r_.error(f, fmt::format("field '{}' needs a magnetic medium in the scene", name));
            ok = false;
          } else if (std::find(out.fields.begin(), out.fields.end(), name) != out.fields.end()) {
            r_.error(f, fmt::format("field '{}' is listed twice", name));
          } else {
            out.fields.push_back(name);
          }
        } else {
          r_.error(f, fmt::format("unknown field '{}' (Ex Ey Ez Hx Hy Hz Sx Sy S; with magnets Mx My Mz Lx Ly Lz "
                                  "dLx dLy dLz M1x ... M2z)",
                                  name));
          ok = false;
        }
      }
      if (o["fields"].size() == 0) {
        r_.error(o["fields"], "'fields' is empty");
        ok = false;
      }
    }
    if (ok) scene_.outputs.push_back(out);
  }
};

Scene read_yaml(YAML::Node root, const std::string& name, const std::vector<std::string>& overrides) {
  for (const auto& o : overrides) apply_override(root, o);
  Diagnostics d;
  SceneBuilder b(d, name);
  Scene s = b.build(root);
  d.throw_if_any();
  return s;
}

Scene load_checked(const std::string& text, const std::string& name, const std::vector<std::string>& overrides) {
  YAML::Node root;
  try {
    root = YAML::Load(text);
  } catch (const YAML::ParserException& e) {
    throw BadInput(fmt::format("{}:{}:{}: error: this is not valid YAML: {}", name, e.mark.line + 1, e.mark.column + 1,
                               e.msg));
  }
  if (!root || root.IsNull()) throw BadInput(fmt::format("{}: error: the scene file is empty", name));
  return read_yaml(root, name, overrides);
}

}  // namespace

Scene read_scene_text(const std::string& text, const std::string& name, const std::vector<std::string>& overrides) {
  return load_checked(text, name, overrides);
}

Scene read_scene(const std::string& path, const std::vector<std::string>& overrides) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw BadInput(fmt::format("{}: error: cannot open the scene file", path));
  std::stringstream ss;
  ss << in.rdbuf();
  return load_checked(ss.str(), path, overrides);
}

}  // namespace ty

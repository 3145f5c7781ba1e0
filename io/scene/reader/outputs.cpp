/// \file outputs.cpp
/// \brief The `outputs` section: snapshots, probes, power spectra and spectral maps.
#include <algorithm>
#include <cmath>
#include <set>

#include "io/scene/reader/reader.h"

namespace ty::reader {

bool SceneBuilder::read_output_name(const YAML::Node& o, Output& out, const char* what) {
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

bool SceneBuilder::read_region(const YAML::Node& o, Output& out) {
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

void SceneBuilder::read_power_spectrum(const YAML::Node& o, Output& out) {
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
      if (auto v = r_.quantity(l["x"], "line.x", Kind::length, cell().x)) {
        const double x = *v + scene_.origin_shift.x;
        out.from = {x, G.extent.y}, out.to = {x, 0};  // positive towards +x
      } else
        ok = false;
    } else if (l["y"] && l.size() == 1) {
      if (auto v = r_.quantity(l["y"], "line.y", Kind::length, cell().y)) {
        const double y = *v + scene_.origin_shift.y;
        out.from = {0, y}, out.to = {G.extent.x, y};  // positive towards +y
      } else
        ok = false;
    } else if (l["from"] && l["to"] && l.size() == 2) {
      auto a = r_.vec2(l["from"], "from", Kind::length, cell()), b = r_.vec2(l["to"], "to", Kind::length, cell());
      if (a && b) {
        out.from = to_internal(*a), out.to = to_internal(*b);
        if (std::hypot(out.to.x - out.from.x, out.to.y - out.from.y) <= 0)
          r_.error(l, "the power-spectrum line has no length"), ok = false;
      } else
        ok = false;
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
    if (b["from"]) {
      if (auto v = r_.positive(b["from"], "band.from", Kind::frequency))
        out.band_from = *v;
      else
        ok = false;
    }
    if (b["to"]) {
      if (auto v = r_.positive(b["to"], "band.to", Kind::frequency))
        out.band_to = *v;
      else
        ok = false;
    }
    if (b["count"]) {
      if (auto v = r_.integer(b["count"], "band.count", 1, 100000))
        out.count = *v;
      else
        ok = false;
    }
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

void SceneBuilder::read_spectral_map(const YAML::Node& o, Output& out) {
  out.kind = Output::Kind::spectral_map;
  if (!r_.is_map(o, "spectral-map")) return;
  r_.allow(o, {"name", "frequencies", "fields", "stride", "region"}, "a spectral-map output");
  bool ok = true;
  for (auto k : {"frequencies", "fields"})
    if (!o[k]) r_.error(o, fmt::format("a spectral-map output needs the key '{}'", k)), ok = false;
  ok = read_output_name(o, out, "spectral-map output") && ok;
  if (o["frequencies"] && r_.is_seq(o["frequencies"], "frequencies")) {
    for (const auto& f : o["frequencies"])
      if (auto v = r_.positive(f, "frequencies", Kind::frequency))
        out.frequencies.push_back(*v);
      else
        ok = false;
    if (out.frequencies.empty()) r_.error(o["frequencies"], "'frequencies' is empty"), ok = false;
  }
  if (o["fields"] && r_.is_seq(o["fields"], "fields")) {
    static const std::set<std::string> allowed = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz", "Sx", "Sy", "S"};
    for (const auto& f : o["fields"]) {
      const std::string name = f.IsScalar() ? f.Scalar() : "";
      if (!allowed.count(name))
        r_.error(f, fmt::format("field '{}' cannot go in a spectral map (Ex Ey Ez Hx Hy Hz Sx Sy S)", name)),
            ok = false;
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

void SceneBuilder::read_output(const YAML::Node& item) {
  if (!item.IsMap() || item.size() != 1) {
    r_.error(item,
             "each output is one of 'snapshots', 'probe', 'power-spectrum' or 'spectral-map' with its keys below it");
    return;
  }
  const std::string kind = item.begin()->first.as<std::string>("");
  Output out;
  out.where = r_.mark(item.begin()->first);
  const YAML::Node o = item.begin()->second;  // a copy: the iterator is a temporary
  if (kind == "snapshots")
    out.kind = Output::Kind::snapshots;
  else if (kind == "probe")
    out.kind = Output::Kind::probe;
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
    r_.allow(o, {"name", "at", "over", "fields"}, "a probe");
    ok = read_output_name(o, out, "probe") && ok;
    if (o["at"] && o["over"]) {
      r_.error(o["over"], "a probe is either at a point ('at') or the mean over a line ('over'), not both");
      ok = false;
    } else if (o["over"]) {
      ok = read_probe_line(o["over"], out) && ok;
    } else if (!o["at"]) {
      r_.error(o, "a probe needs the key 'at' (a point) or 'over' (a line: {from: [x, y], to: [x, y]})");
      ok = false;
    } else if (auto p = r_.vec2(o["at"], "at", Kind::length, cell())) {
      out.at = to_internal(*p);
    } else {
      ok = false;
    }
  }
  ok = read_fields(o, kind, out) && ok;
  if (ok) scene_.outputs.push_back(out);
}

/// A line probe's `over: {from: [x, y], to: [x, y]}`: a straight line inside the extent; its
/// middle is the probe's `at` (for the placement checks).
bool SceneBuilder::read_probe_line(const YAML::Node& l, Output& out) {
  if (!r_.is_map(l, "over")) return false;
  r_.allow(l, {"from", "to"}, "a probe's line");
  bool ok = true;
  for (const char* k : {"from", "to"}) {
    if (!l[k]) {
      r_.error(l, fmt::format("a probe's line needs the key '{}'", k));
      ok = false;
    } else if (auto p = r_.vec2(l[k], k, Kind::length, cell())) {
      (k[0] == 'f' ? out.from : out.to) = to_internal(*p);
    } else {
      ok = false;
    }
  }
  if (!ok) return false;
  const Vec2 e = scene_.grid.extent;
  for (const Vec2 p : {out.from, out.to})
    if (grid_ok_ && (p.x < 0 || p.y < 0 || p.x > e.x || p.y > e.y)) {
      r_.error(l, "the probe's line leaves the grid's extent");
      return false;
    }
  if (out.from.x == out.to.x && out.from.y == out.to.y) {
    r_.error(l, "the probe's line has zero length");
    return false;
  }
  out.over_line = true;
  out.at = {0.5 * (out.from.x + out.to.x), 0.5 * (out.from.y + out.to.y)};
  return true;
}

/// The `fields` of snapshots or a probe: wave fields always, magnetic ones with a magnet.
bool SceneBuilder::read_fields(const YAML::Node& o, const std::string& kind, Output& out) {
  bool ok = true;
  if (!o["fields"]) {
    r_.error(o, fmt::format("{} needs the key 'fields'", kind));
    ok = false;
  } else if (r_.is_seq(o["fields"], "fields")) {
    static const std::set<std::string> wave = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz", "Sx", "Sy", "S"};
    static const std::set<std::string> magnetic = {"Mx",  "My",  "Mz",  "Lx",  "Ly",  "Lz",  "dLx", "dLy",
                                                   "dLz", "M1x", "M1y", "M1z", "M2x", "M2y", "M2z"};
    for (const auto& f : o["fields"]) {
      const std::string name = f.IsScalar() ? f.Scalar() : "";
      if (wave.count(name)) {
        if (std::find(out.fields.begin(), out.fields.end(), name) != out.fields.end())
          r_.error(f, fmt::format("field '{}' is listed twice", name));
        else
          out.fields.push_back(name);
      } else if (magnetic.count(name) && out.over_line) {
        r_.error(f, fmt::format("field '{}': a probe over a line records the wave fields only", name));
        ok = false;
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
  return ok;
}

}  // namespace ty::reader

/// \file sources.cpp
/// \brief The `sources` section: point, beam and plane sources, their waveforms (cw, pulse,
/// chirp, single-cycle, file) and launch lines.
#include <cmath>
#include <filesystem>

#include "io/scene/reader/reader.h"

namespace ty::reader {

using constants::pi;

Waveform SceneBuilder::read_waveform(const YAML::Node& w, double f) {
  Waveform wf;
  if (!r_.is_map(w, "waveform")) return wf;
  r_.require(w, "kind", "waveform");
  if (!w["kind"]) return wf;
  auto kind = r_.choice<Waveform::Kind>(
      w["kind"], "waveform.kind",
      {{"cw", Waveform::Kind::cw},
       {"pulse", Waveform::Kind::pulse},
       {"chirp", Waveform::Kind::chirp},
       {"single-cycle", Waveform::Kind::single_cycle},
       {"file", Waveform::Kind::file}});
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
    case Waveform::Kind::single_cycle:  // centred 6 tau after the start: g(0) ~ 1.5e-7
      r_.allow(w, {"kind", "delay"}, "a single-cycle waveform");
      wf.delay = 6.0 / (2 * pi * f);
      if (w["delay"])
        if (auto v = r_.quantity(w["delay"], "delay", Kind::time, 0, period)) wf.delay = *v;
      break;
    case Waveform::Kind::file: read_file_waveform(w, wf); break;
  }
  return wf;
}

/// `file` (relative to the scene's folder; kept absolute, so the resolved scene in a run
/// folder finds it) and `time-unit` (default s).
void SceneBuilder::read_file_waveform(const YAML::Node& w, Waveform& wf) {
  r_.allow(w, {"kind", "file", "time-unit"}, "a file waveform");
  r_.require(w, "file", "a file waveform");
  double unit = 1;
  if (w["time-unit"])
    if (auto u = r_.text(w["time-unit"], "time-unit")) {
      std::string why;
      const auto q = parse_quantity("1 " + *u, Kind::time, why);
      if (!q || q->relative != Quantity::Relative::none)
        r_.error(w["time-unit"], fmt::format("'time-unit' must be a unit of time (s, ps, fs, ...); got '{}'", *u));
      else
        unit = q->value, wf.time_unit = *u;
    }
  if (!w["file"]) return;
  const auto name = r_.text(w["file"], "file");
  if (!name) return;
  namespace fs = std::filesystem;
  fs::path p(*name);
  if (p.is_relative()) p = fs::absolute(fs::path(scene_.file).parent_path() / p);
  wf.file = p.lexically_normal().string();
  read_waveform_table(r_, w["file"], wf.file, unit, wf);
}

void SceneBuilder::read_source(const YAML::Node& item, size_t index) {
  if (!item.IsMap() || item.size() != 1) {
    r_.error(item, "each source is one of 'point', 'beam' or 'plane' with its keys below it");
    return;
  }
  const std::string kind = item.begin()->first.as<std::string>("");
  const YAML::Node s = item.begin()->second;  // a copy: the iterator is a temporary
  Source src;
  src.where = r_.mark(item.begin()->first);
  if (kind == "point")
    src.kind = Source::Kind::point;
  else if (kind == "beam")
    src.kind = Source::Kind::beam;
  else if (kind == "plane")
    src.kind = Source::Kind::plane;
  else {
    r_.error(item.begin()->first, fmt::format("unknown source kind '{}' (point, beam or plane)", kind));
    return;
  }
  if (!r_.is_map(s, kind)) return;
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
    if (auto f = r_.positive(s["frequency"], "frequency", Kind::frequency))
      src.frequency = *f;
    else
      ok = false;
  }
  if (need("waveform")) src.waveform = read_waveform(s["waveform"], src.frequency);
  if (src.waveform.kind == Waveform::Kind::file && !s["frequency"] && !src.waveform.table_time.empty()) {
    const Band2 b = source_band(src);  // the carrier a launch line's delays are set for
    src.frequency = 0.5 * (b.lo + b.hi);
  }
  if (src.waveform.kind != Waveform::Kind::chirp && src.waveform.kind != Waveform::Kind::file && !s["frequency"]) {
    r_.error(s, fmt::format("a {} source needs the key 'frequency'", kind));
    ok = false;
  }
  if (need("amplitude")) {
    const Kind k = src.kind != Source::Kind::point ? Kind::electric_field
                   : is_electric(src.component)    ? Kind::current
                                                   : Kind::voltage;
    if (auto a = r_.quantity(s["amplitude"], "amplitude", k))
      src.amplitude = *a;
    else
      ok = false;
  }
  if (src.kind == Source::Kind::point)
    read_point_source(s, src, ok);
  else
    read_line_source(s, kind, src, ok);
  if (ok) scene_.sources.push_back(src);
}

/// The keys of a point source: `at` and the footprint `spread`.
void SceneBuilder::read_point_source(const YAML::Node& s, Source& src, bool& ok) {
  const Vec2 dx = cell();
  auto need = [&](const char* k) {
    if (s[k]) return true;
    r_.error(s, fmt::format("a point source needs the key '{}'", k));
    ok = false;
    return false;
  };
  if (need("at")) {
    if (auto p = r_.vec2(s["at"], "at", Kind::length, dx)) {
      src.at = to_internal(*p);
    } else {
      ok = false;
    }
  }
  src.spread = 0;
  if (s["spread"])
    if (auto v = r_.quantity(s["spread"], "spread", Kind::length, cell_any())) {
      if (*v < 0) r_.error(s["spread"], "'spread' must not be negative");
      src.spread = *v;
    }
}

/// The keys of a beam or a plane wave: launch line, waist and focus or direction, and the
/// angle to the line's normal.
void SceneBuilder::read_line_source(const YAML::Node& s, const std::string& kind, Source& src, bool& ok) {
  const Vec2 dx = cell();
  auto need = [&](const char* k) {
    if (s[k]) return true;
    r_.error(s, fmt::format("a {} source needs the key '{}'", kind, k));
    ok = false;
    return false;
  };
  if (need("launch")) read_launch(s["launch"], src, ok);
  if (src.kind == Source::Kind::beam) {
    if (need("waist")) {
      if (auto v = r_.positive(s["waist"], "waist", Kind::length, cell_any()))
        src.waist = *v;
      else
        ok = false;
    }
    if (need("focus")) {
      if (auto p = r_.vec2(s["focus"], "focus", Kind::length, dx))
        src.focus = to_internal(*p);
      else
        ok = false;
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

void SceneBuilder::read_launch(const YAML::Node& l, Source& src, bool& ok) {
  if (!r_.is_map(l, "launch") || l.size() != 1 || !(l["x"] || l["y"])) {
    r_.error(l, "'launch' must be {x: ...} or {y: ...}");
    ok = false;
    return;
  }
  src.line_axis = l["x"] ? 'x' : 'y';
  const YAML::Node v = l[std::string(1, src.line_axis)];
  auto q = r_.quantity(v, "launch", Kind::length, src.line_axis == 'x' ? cell().x : cell().y);
  if (!q) {
    ok = false;
    return;
  }
  const double shift = src.line_axis == 'x' ? scene_.origin_shift.x : scene_.origin_shift.y;
  src.line_at = *q + shift;  // inside the extent: see check_placement (io/scene/validation.cpp)
}

}  // namespace ty::reader

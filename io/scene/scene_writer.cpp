/// \file scene_writer.cpp
/// \brief The resolved scene as YAML, through yaml-cpp's emitter.
#include "io/scene/scene_writer.h"

#include <fmt/format.h>
#include <yaml-cpp/yaml.h>

#include "io/scene/units.h"

namespace ty {
namespace {

std::string q(double v, Kind k) { return format_si(v, k); }

void vec3(YAML::Emitter& e, const std::array<double, 3>& v, Kind k) {
  e << YAML::Flow << YAML::BeginSeq;
  for (double c : v) e << (k == Kind::dimensionless ? fmt::format("{}", c) : q(c, k));
  e << YAML::EndSeq;
}

/// A permittivity that disperses or rotates, per axis, each oscillator by its strength.
void permittivity_tensor(YAML::Emitter& e, const PermittivityTensor& t) {
  e << YAML::Key << "permittivity" << YAML::Value << YAML::Flow << YAML::BeginMap;
  const char* names[3] = {"u", "v", "z"};
  for (int a = 0; a < 3; ++a) {
    const PermittivityModel& m = t.axis[a];
    e << YAML::Key << names[a] << YAML::Value << YAML::Flow << YAML::BeginMap;
    e << YAML::Key << "background" << YAML::Value << fmt::format("{}", m.eps_inf);
    e << YAML::Key << "lorentz" << YAML::Value << YAML::Flow << YAML::BeginSeq;
    for (const LorentzTerm& l : m.lorentz)
      e << YAML::Flow << YAML::BeginMap << YAML::Key << "to" << YAML::Value << q(l.f_to, Kind::frequency) << YAML::Key
        << "strength" << YAML::Value << fmt::format("{}", l.delta_eps) << YAML::Key << "damping" << YAML::Value
        << q(l.damping, Kind::frequency) << YAML::EndMap;
    e << YAML::EndSeq << YAML::Key << "drude" << YAML::Value << YAML::Flow << YAML::BeginSeq;
    for (const DrudeTerm& d : m.drude)
      e << YAML::Flow << YAML::BeginMap << YAML::Key << "plasma" << YAML::Value << q(d.plasma, Kind::frequency)
        << YAML::Key << "collision" << YAML::Value << q(d.collision, Kind::frequency) << YAML::EndMap;
    e << YAML::EndSeq << YAML::EndMap;
  }
  e << YAML::Key << "rotate" << YAML::Value << q(t.rotate, Kind::angle) << YAML::EndMap;
}

/// The magnet block with every value explicit (the exchange as its constant lambda).
void magnet(YAML::Emitter& e, const Magnet& g) {
  e << YAML::Key << "magnet" << YAML::Value << YAML::Flow << YAML::BeginMap;
  e << YAML::Key << "sublattices" << YAML::Value << YAML::Flow << YAML::BeginSeq;
  for (const auto& sl : g.sublattices) {  // a linewidth table sets the damping (thermal below)
    e << YAML::Flow << YAML::BeginMap << YAML::Key << "saturation" << YAML::Value << q(sl.saturation, Kind::magnetic_field)
      << YAML::Key << "g" << YAML::Value << sl.g;
    if (g.thermal.linewidth.empty()) e << YAML::Key << "damping" << YAML::Value << sl.damping;
    e << YAML::EndMap;
  }
  e << YAML::EndSeq;
  const bool two = g.sublattices.size() == 2;
  if (two) e << YAML::Key << "exchange-constant" << YAML::Value << g.lambda;
  if (!g.anisotropy.empty()) {
    e << YAML::Key << "anisotropy" << YAML::Value << YAML::Flow << YAML::BeginSeq;
    for (const auto& a : g.anisotropy) {
      e << YAML::Flow << YAML::BeginMap << YAML::Key << "axis" << YAML::Value;
      vec3(e, a.axis, Kind::dimensionless);
      e << YAML::Key << "field" << YAML::Value << q(a.field, Kind::magnetic_field) << YAML::EndMap;
    }
    e << YAML::EndSeq;
  }
  if (two) {
    e << YAML::Key << "dzyaloshinskii" << YAML::Value;
    vec3(e, g.dzyaloshinskii, Kind::magnetic_field);
  }
  if (g.order[0] != 0 || g.order[1] != 0 || g.order[2] != 0) {
    e << YAML::Key << "order" << YAML::Value;
    vec3(e, g.order, Kind::dimensionless);
  }
  if (g.thermal.active())
    e << YAML::Key << "thermal" << YAML::Value << YAML::Flow << YAML::BeginMap << YAML::Key << "spin" << YAML::Value
      << g.thermal.spin << YAML::Key << "ordering" << YAML::Value << q(g.thermal.ordering, Kind::temperature)
      << YAML::Key << "reference" << YAML::Value << q(g.thermal.reference, Kind::temperature) << YAML::Key
      << "anisotropy-power" << YAML::Value << g.thermal.anisotropy_power;
  if (g.thermal.active() && !g.thermal.linewidth.empty()) {
    e << YAML::Key << "linewidth" << YAML::Value << YAML::Flow << YAML::BeginSeq;
    for (const auto& p : g.thermal.linewidth)
      e << YAML::Flow << YAML::BeginSeq << q(p[0], Kind::temperature) << q(p[1], Kind::frequency) << YAML::EndSeq;
    e << YAML::EndSeq;
  }
  if (g.thermal.active()) e << YAML::EndMap;
  if (!g.state.history.empty()) {
    e << YAML::Key << "history" << YAML::Value << YAML::Flow << YAML::BeginSeq;
    for (const auto& b : g.state.history) vec3(e, b, Kind::magnetic_field);
    e << YAML::EndSeq;
  } else if (g.state.pick != "lowest") {
    e << YAML::Key << "state" << YAML::Value << g.state.pick;
  }
  e << YAML::EndMap;
}

void vec2(YAML::Emitter& e, Vec2 v, Kind k) {
  e << YAML::Flow << YAML::BeginSeq << q(v.x, k) << q(v.y, k) << YAML::EndSeq;
}

void waveform(YAML::Emitter& e, const Waveform& w) {
  e << YAML::Key << "waveform" << YAML::Value << YAML::Flow << YAML::BeginMap;
  switch (w.kind) {
    case Waveform::Kind::cw:
      e << YAML::Key << "kind" << YAML::Value << "cw" << YAML::Key << "ramp" << YAML::Value << q(w.ramp, Kind::time);
      break;
    case Waveform::Kind::pulse:
      e << YAML::Key << "kind" << YAML::Value << "pulse" << YAML::Key << "fwhm" << YAML::Value << q(w.fwhm, Kind::time)
        << YAML::Key << "delay" << YAML::Value << q(w.delay, Kind::time);
      break;
    case Waveform::Kind::chirp:
      e << YAML::Key << "kind" << YAML::Value << "chirp" << YAML::Key << "from" << YAML::Value
        << q(w.from, Kind::frequency) << YAML::Key << "to" << YAML::Value << q(w.to, Kind::frequency) << YAML::Key
        << "length" << YAML::Value << q(w.length, Kind::time);
      break;
    case Waveform::Kind::single_cycle:
      e << YAML::Key << "kind" << YAML::Value << "single-cycle" << YAML::Key << "delay" << YAML::Value
        << q(w.delay, Kind::time);
      break;
    case Waveform::Kind::file:
      e << YAML::Key << "kind" << YAML::Value << "file" << YAML::Key << "file" << YAML::Value << w.file << YAML::Key
        << "time-unit" << YAML::Value << w.time_unit;
      break;
  }
  e << YAML::EndMap;
}

/// Internal positions back in the user's coordinates.
Vec2 user(const Scene& s, Vec2 p) { return Vec2{p.x - s.origin_shift.x, p.y - s.origin_shift.y}; }

void region(YAML::Emitter& e, const Scene& s, const Region& r) {
  e << YAML::Key << "region" << YAML::Value << YAML::BeginMap << YAML::Key << "centre" << YAML::Value;
  vec2(e, user(s, r.centre), Kind::length);
  e << YAML::Key << "size" << YAML::Value;
  vec2(e, r.size, Kind::length);
  e << YAML::EndMap;
}

void grid_section(YAML::Emitter& e, const Scene& s) {
  e << YAML::Key << "grid" << YAML::Value << YAML::BeginMap;
  e << YAML::Key << "extent" << YAML::Value;
  vec2(e, s.grid.extent, Kind::length);
  e << YAML::Key << "cell" << YAML::Value;
  vec2(e, {s.grid.dx, s.grid.dy}, Kind::length);
  e << YAML::Key << "boundaries" << YAML::Value << YAML::Flow << YAML::BeginMap << YAML::Key << "x" << YAML::Value
    << boundary_name(s.grid.bx) << YAML::Key << "y" << YAML::Value << boundary_name(s.grid.by) << YAML::EndMap;
  if (s.grid.bx == Boundary::bloch)
    e << YAML::Key << "bloch" << YAML::Value << YAML::Flow << YAML::BeginMap << YAML::Key << "wavenumber"
      << YAML::Value << s.grid.bloch_kx << YAML::EndMap;
  const Absorber& a = s.grid.absorber;
  e << YAML::Key << "absorber" << YAML::Value << YAML::Flow << YAML::BeginMap << YAML::Key << "kind" << YAML::Value
    << (a.kind == Absorber::Kind::pml ? "pml" : a.kind == Absorber::Kind::graded ? "graded" : "auto") << YAML::Key
    << "cells" << YAML::Value;
  if (a.cells > 0) e << a.cells; else e << "auto";
  e << YAML::Key << "grading" << YAML::Value << a.grading << YAML::Key << "strength" << YAML::Value
    << a.strength << YAML::Key << "kappa" << YAML::Value << a.kappa_max << YAML::Key << "alpha" << YAML::Value
    << q(a.alpha_max, Kind::conductivity) << YAML::EndMap;
  e << YAML::Key << "origin" << YAML::Value << (s.grid.origin_corner ? "corner" : "centre");
  e << YAML::EndMap;
}

void time_section(YAML::Emitter& e, const Scene& s) {
  e << YAML::Key << "time" << YAML::Value << YAML::BeginMap << YAML::Key << "stop" << YAML::Value;
  if (const AutoStop& a = s.time.auto_stop; a.on) {
    e << "auto" << YAML::Key << "limit" << YAML::Value << q(s.time.stop, Kind::time) << YAML::Key << "energy-left"
      << YAML::Value << a.energy_left << YAML::Key << "tolerance" << YAML::Value << a.tolerance;
    if (a.check_every > 0) e << YAML::Key << "check-every" << YAML::Value << q(a.check_every, Kind::time);
  } else {
    e << q(s.time.stop, Kind::time);
  }
  e << YAML::Key << "step-fraction" << YAML::Value << s.time.step_fraction << YAML::Key
    << "precision" << YAML::Value << (s.time.precision == Precision::single ? "single" : "double") << YAML::Key
    << "threads" << YAML::Value;
  if (s.time.threads > 0) e << s.time.threads; else e << "auto";
  e << YAML::EndMap;
}

void media_section(YAML::Emitter& e, const Scene& s) {
  e << YAML::Key << "media" << YAML::Value << YAML::BeginMap;
  for (const auto& m : s.media) {
    e << YAML::Key << m.name << YAML::Value << YAML::Flow << YAML::BeginMap;
    if (m.tensor) {
      permittivity_tensor(e, *m.tensor);
    } else {
      e << YAML::Key << "permittivity" << YAML::Value << YAML::Flow << YAML::BeginSeq << m.permittivity[0]
        << m.permittivity[1] << m.permittivity[2] << YAML::EndSeq;
    }
    e << YAML::Key << "conductivity" << YAML::Value << q(m.conductivity, Kind::conductivity);
    e << YAML::Key << "perfect-conductor" << YAML::Value << m.perfect_conductor;
    if (m.magnet) magnet(e, *m.magnet);
    if (m.magnet && m.magnet->thermal.active())
      e << YAML::Key << "temperature" << YAML::Value << q(m.magnet->thermal.temperature, Kind::temperature);
    e << YAML::EndMap;
    if (!m.crystal.empty()) e << YAML::Comment("from the crystal library: " + m.crystal);
  }
  e << YAML::EndMap;
}

void shape(YAML::Emitter& e, const Scene& s, const Shape& sh) {
  switch (sh.kind) {
    case Shape::Kind::rectangle:
      e << YAML::Key << "rectangle" << YAML::Value << YAML::BeginMap << YAML::Key << "centre" << YAML::Value;
      vec2(e, user(s, sh.centre), Kind::length);
      e << YAML::Key << "size" << YAML::Value;
      vec2(e, sh.size, Kind::length);
      e << YAML::Key << "rotate" << YAML::Value << q(sh.rotate, Kind::angle) << YAML::EndMap;
      break;
    case Shape::Kind::circle:
      e << YAML::Key << "circle" << YAML::Value << YAML::BeginMap << YAML::Key << "centre" << YAML::Value;
      vec2(e, user(s, sh.centre), Kind::length);
      e << YAML::Key << "radius" << YAML::Value << q(sh.radius, Kind::length) << YAML::EndMap;
      break;
    case Shape::Kind::polygon:
      e << YAML::Key << "polygon" << YAML::Value << YAML::BeginSeq;
      for (const auto& v : sh.vertices) vec2(e, user(s, v), Kind::length);
      e << YAML::EndSeq;
      break;
  }
}

void bodies_section(YAML::Emitter& e, const Scene& s) {
  e << YAML::Key << "bodies" << YAML::Value << YAML::BeginSeq;
  for (const auto& b : s.bodies) {
    e << YAML::Flow << YAML::BeginMap << YAML::Key << "medium" << YAML::Value << s.media[b.medium].name;
    shape(e, s, b.shape);
    e << YAML::Key << "sample" << YAML::Value << b.sample;
    const BodyOrder& o = b.magnetic;  // a body's own magnetic order (an antiferromagnetic domain)
    if (o.reversed) e << YAML::Key << "order" << YAML::Value << "reversed";
    if (o.order != std::array<double, 3>{0, 0, 0}) {
      e << YAML::Key << "order" << YAML::Value;
      vec3(e, o.order, Kind::dimensionless);
    }
    if (!o.state.empty()) e << YAML::Key << "state" << YAML::Value << o.state;
    e << YAML::EndMap;
  }
  e << YAML::EndSeq;
}

void source(YAML::Emitter& e, const Scene& s, const Source& src) {
  e << YAML::BeginMap;
  const char* kind = src.kind == Source::Kind::point ? "point" : src.kind == Source::Kind::beam ? "beam" : "plane";
  e << YAML::Key << kind << YAML::Value << YAML::BeginMap;
  if (src.kind == Source::Kind::point) {
    e << YAML::Key << "at" << YAML::Value;
    vec2(e, user(s, src.at), Kind::length);
    e << YAML::Key << "component" << YAML::Value << component_name(src.component);
    e << YAML::Key << "amplitude" << YAML::Value
      << q(src.amplitude, is_electric(src.component) ? Kind::current : Kind::voltage);
    e << YAML::Key << "spread" << YAML::Value << q(src.spread, Kind::length);
  } else {
    e << YAML::Key << "polarization" << YAML::Value << component_name(src.component);
    e << YAML::Key << "amplitude" << YAML::Value << q(src.amplitude, Kind::electric_field);
    const double shift = src.line_axis == 'x' ? s.origin_shift.x : s.origin_shift.y;
    e << YAML::Key << "launch" << YAML::Value << YAML::Flow << YAML::BeginMap << YAML::Key
      << std::string(1, src.line_axis) << YAML::Value << q(src.line_at - shift, Kind::length) << YAML::EndMap;
    if (src.kind == Source::Kind::beam) {
      e << YAML::Key << "waist" << YAML::Value << q(src.waist, Kind::length);
      e << YAML::Key << "focus" << YAML::Value;
      vec2(e, user(s, src.focus), Kind::length);
      e << YAML::Key << "angle" << YAML::Value << q(src.angle, Kind::angle);
    } else {
      const double c = std::cos(src.angle), sn = std::sin(src.angle);
      e << YAML::Key << "direction" << YAML::Value
        << (std::abs(c) > std::abs(sn) ? (c > 0 ? "+x" : "-x") : (sn > 0 ? "+y" : "-y"));
    }
  }
  e << YAML::Key << "frequency" << YAML::Value << q(src.frequency, Kind::frequency);
  waveform(e, src.waveform);
  e << YAML::EndMap << YAML::EndMap;
}

/// A line as its two ends: the same line and normal.
void line(YAML::Emitter& e, const Scene& s, const char* key, const Output& out) {
  e << YAML::Key << key << YAML::Value << YAML::Flow << YAML::BeginMap << YAML::Key << "from" << YAML::Value;
  vec2(e, user(s, out.from), Kind::length);
  e << YAML::Key << "to" << YAML::Value;
  vec2(e, user(s, out.to), Kind::length);
  e << YAML::EndMap;
}

void output(YAML::Emitter& e, const Scene& s, const Output& out) {
  e << YAML::BeginMap;
  if (out.kind == Output::Kind::snapshots) {
    e << YAML::Key << "snapshots" << YAML::Value << YAML::BeginMap;
    e << YAML::Key << "fields" << YAML::Value << YAML::Flow << out.fields;
    e << YAML::Key << "every" << YAML::Value << q(out.every, Kind::time);
    e << YAML::Key << "stride" << YAML::Value << out.stride;
    if (out.region.given) region(e, s, out.region);
  } else if (out.kind == Output::Kind::power_spectrum) {
    e << YAML::Key << "power-spectrum" << YAML::Value << YAML::BeginMap;
    e << YAML::Key << "name" << YAML::Value << out.name;
    line(e, s, "line", out);
    e << YAML::Key << "band" << YAML::Value << YAML::Flow << YAML::BeginMap << YAML::Key << "from" << YAML::Value
      << q(out.band_from, Kind::frequency) << YAML::Key << "to" << YAML::Value << q(out.band_to, Kind::frequency)
      << YAML::Key << "count" << YAML::Value << out.count << YAML::EndMap;
  } else if (out.kind == Output::Kind::spectral_map) {
    e << YAML::Key << "spectral-map" << YAML::Value << YAML::BeginMap;
    e << YAML::Key << "name" << YAML::Value << out.name;
    e << YAML::Key << "frequencies" << YAML::Value << YAML::Flow << YAML::BeginSeq;
    for (double f : out.frequencies) e << q(f, Kind::frequency);
    e << YAML::EndSeq;
    e << YAML::Key << "fields" << YAML::Value << YAML::Flow << out.fields;
    e << YAML::Key << "stride" << YAML::Value << out.stride;
    if (out.region.given) region(e, s, out.region);
  } else {  // a probe: at a point, or the mean over a line (a finite detector)
    e << YAML::Key << "probe" << YAML::Value << YAML::BeginMap;
    e << YAML::Key << "name" << YAML::Value << out.name;
    if (out.over_line) {
      line(e, s, "over", out);
    } else {
      e << YAML::Key << "at" << YAML::Value;
      vec2(e, user(s, out.at), Kind::length);
    }
    e << YAML::Key << "fields" << YAML::Value << YAML::Flow << out.fields;
  }
  e << YAML::EndMap << YAML::EndMap;
}

}  // namespace

std::string resolved_scene_yaml(const Scene& s) {
  YAML::Emitter e;
  e << YAML::BeginMap;
  e << YAML::Key << "title" << YAML::Value << YAML::DoubleQuoted << s.title;
  grid_section(e, s);
  time_section(e, s);
  e << YAML::Key << "bias" << YAML::Value << YAML::Flow << YAML::BeginSeq;
  for (double b : s.bias) e << q(b, Kind::magnetic_field);
  e << YAML::EndSeq;
  media_section(e, s);
  bodies_section(e, s);
  e << YAML::Key << "sources" << YAML::Value << YAML::BeginSeq;
  for (const auto& src : s.sources) source(e, s, src);
  e << YAML::EndSeq;
  e << YAML::Key << "outputs" << YAML::Value << YAML::BeginSeq;
  for (const auto& out : s.outputs) output(e, s, out);
  e << YAML::EndSeq;
  e << YAML::EndMap;
  return std::string(e.c_str()) + "\n";
}

}  // namespace ty

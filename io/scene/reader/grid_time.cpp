/// \file grid_time.cpp
/// \brief The `grid` and `time` sections, and the prescan of the sources' frequencies that
/// `cells-per-wavelength` and `periods` need before the grid is read.
#include <algorithm>
#include <cmath>
#include <set>

#include "io/scene/reader/reader.h"

namespace ty::reader {

using constants::c0;
using constants::pi;

void SceneBuilder::prescan_sources(const YAML::Node& list) {
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
        } else if (kind == "single-cycle") {  // its band reaches 3.57 times its centre
          s.waveform.kind = Waveform::Kind::single_cycle;
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

void SceneBuilder::read_grid(const YAML::Node& g) {
  r_.allow(g, {"extent", "cell", "cells-per-wavelength", "boundaries", "bloch", "absorber", "origin"}, "grid");
  GridSpec& G = scene_.grid;
  r_.require(g, "extent", "grid");
  G.where = r_.mark(g["extent"] ? g["extent"] : g);
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
  ok = read_cell(g) && ok;
  read_boundaries(g);
  if (!ok) return;
  // whole numbers of cells: the extent is rounded and the user told
  const double nx = std::max(1.0, std::round(G.extent.x / G.dx)), ny = std::max(1.0, std::round(G.extent.y / G.dy));
  if (std::abs(nx * G.dx - G.extent.x) > 1e-6 * G.dx || std::abs(ny * G.dy - G.extent.y) > 1e-6 * G.dy)
    scene_.warnings.push_back(fmt::format("grid: extent rounded to whole cells: {} x {} cells = {:.6g} m x {:.6g} m",
                                          nx, ny, nx * G.dx, ny * G.dy));
  G.extent = {nx * G.dx, ny * G.dy};
  if (!G.origin_corner) scene_.origin_shift = {0.5 * G.extent.x, 0.5 * G.extent.y};
  grid_ok_ = true;
}

/// `cell` ([dx, dy] or one size) or `cells-per-wavelength` (at the highest frequency of
/// any source, in the densest medium); false when neither gives a cell.
bool SceneBuilder::read_cell(const YAML::Node& g) {
  GridSpec& G = scene_.grid;
  bool ok = true;
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
  return ok;
}

/// `bloch: {wavenumber: K}` (rad/m) or `bloch: {angle: A, at: F}` (k_x = 2 pi F sin(A) / c,
/// the wavenumber of a plane wave in vacuum at angle A from the y axis at frequency F), or
/// with `in: MEDIUM` the wave's angle inside that medium (a prism): k_x = 2 pi F n sin(A) / c,
/// n = sqrt(eps) of an isotropic, non-dispersive, non-magnetic medium (phase matching across
/// the faces parallel to x, Snell's law: Born & Wolf, Principles of Optics, sec. 1.5.1).
double SceneBuilder::bloch_index(const YAML::Node& in) {
  if (!in) return 1.0;
  const auto name = r_.text(in, "bloch.in");
  if (!name) return 1.0;
  const auto it = std::find_if(scene_.media.begin(), scene_.media.end(), [&](const Medium& m) { return m.name == *name; });
  if (it == scene_.media.end()) {
    r_.error(in, fmt::format("'bloch.in': medium '{}' is not defined under 'media'", *name));
    return 1.0;
  }
  const auto& e = it->permittivity;
  if (it->magnet || it->tensor || it->perfect_conductor || it->conductivity != 0 || e[0] != e[1] || e[1] != e[2]) {
    r_.error(in, fmt::format("'bloch.in': medium '{}' must be an isotropic, non-dispersive, lossless dielectric "
                             "(its index is the angle's scale); give 'wavenumber' otherwise",
                             *name));
    return 1.0;
  }
  return std::sqrt(e[0]);
}

void SceneBuilder::read_bloch(const YAML::Node& g) {
  GridSpec& G = scene_.grid;
  const auto& k = g["bloch"];
  if (!k) {
    if (G.bx == Boundary::bloch) r_.error(g["boundaries"], "'bloch' sides need 'grid.bloch' (wavenumber, or angle and at)");
    return;
  }
  if (G.bx != Boundary::bloch) r_.error(k, "'grid.bloch' needs 'boundaries: {x: bloch}'");
  if (!r_.is_map(k, "bloch")) return;
  r_.allow(k, {"wavenumber", "angle", "at", "in"}, "bloch");
  const double n = bloch_index(k["in"]);
  if (k["in"] && !k["angle"]) r_.error(k["in"], "'bloch.in' goes with 'angle' and 'at' (the angle inside that medium)");
  if (k["wavenumber"] && (k["angle"] || k["at"])) {
    r_.error(k, "'bloch': give either 'wavenumber' or 'angle' and 'at', not both");
  } else if (k["wavenumber"]) {
    if (auto v = r_.quantity(k["wavenumber"], "bloch.wavenumber", Kind::dimensionless)) G.bloch_kx = *v;
  } else if (k["angle"] && k["at"]) {
    const auto a = r_.quantity(k["angle"], "bloch.angle", Kind::angle);
    const auto f = r_.quantity(k["at"], "bloch.at", Kind::frequency);
    if (a && f) {
      if (!(std::abs(*a) < 0.5 * pi)) r_.error(k["angle"], "'bloch.angle' must lie strictly between -90 and 90 deg");
      if (!(*f > 0)) r_.error(k["at"], "'bloch.at' must be a positive frequency");
      G.bloch_kx = 2 * pi * *f * n * std::sin(*a) / c0;
    }
  } else {
    r_.error(k, "'bloch' needs 'wavenumber' (rad/m), or 'angle' and 'at' (a frequency)");
  }
}

void SceneBuilder::read_boundaries(const YAML::Node& g) {
  GridSpec& G = scene_.grid;
  if (const auto& b = g["boundaries"]) {
    if (r_.is_map(b, "boundaries")) {
      r_.allow(b, {"x", "y"}, "boundaries");
      const std::initializer_list<std::pair<std::string_view, Boundary>> opts = {
          {"absorbing", Boundary::absorbing},
          {"periodic", Boundary::periodic},
          {"electric-wall", Boundary::electric_wall},
          {"magnetic-wall", Boundary::magnetic_wall},
          {"bloch", Boundary::bloch}};
      if (b["x"])
        if (auto v = r_.choice<Boundary>(b["x"], "boundaries.x", opts)) G.bx = *v;
      if (b["y"])
        if (auto v = r_.choice<Boundary>(b["y"], "boundaries.y", opts)) {
          if (*v == Boundary::bloch) r_.error(b["y"], "'bloch' sides are along x only (the wavenumber is k_x)");
          else G.by = *v;
        }
    }
  }
  read_bloch(g);
  if (const auto& a = g["absorber"]) {
    if (r_.is_map(a, "absorber")) {
      r_.allow(a, {"kind", "cells", "grading", "strength", "kappa", "alpha"}, "absorber");
      Absorber& A = G.absorber;
      if (a["kind"])
        if (auto v = r_.choice<Absorber::Kind>(a["kind"], "absorber.kind",
                                               {{"auto", Absorber::Kind::automatic},
                                                {"pml", Absorber::Kind::pml},
                                                {"graded", Absorber::Kind::graded}}))
          A.kind = *v;
      if (a["cells"]) {
        if (a["cells"].IsScalar() && a["cells"].Scalar() == "auto")
          A.cells = 0;
        else if (auto v = r_.integer(a["cells"], "absorber.cells", 1, 200))
          A.cells = *v;
      }
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
}

void SceneBuilder::read_time(const YAML::Node& t) {
  if (t["courant"]) r_.error(t["courant"], "'time.courant' is now called 'time.step-fraction' (same meaning)");
  r_.allow(t, {"stop", "limit", "energy-left", "tolerance", "check-every", "step-fraction", "courant", "precision",
               "threads"},
           "time");
  r_.require(t, "stop", "time");
  scene_.time.where = r_.mark(t["stop"] ? t["stop"] : t);
  if (t["stop"] && t["stop"].IsScalar() && t["stop"].Scalar() == "auto") {
    read_auto_stop(t);
  } else {
    for (const char* k : {"limit", "energy-left", "tolerance", "check-every"})
      if (t[k]) r_.error(t[k], fmt::format("'time.{}' belongs to 'stop: auto'; this run stops at 'time.stop'", k));
    if (t["stop"])
      if (auto v = r_.positive(t["stop"], "time.stop", Kind::time, 0, common_period_)) scene_.time.stop = *v;
  }
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

void SceneBuilder::read_auto_stop(const YAML::Node& t) {
  AutoStop& a = scene_.time.auto_stop;
  a.on = true;
  a.where = r_.mark(t["stop"]);
  if (!t["limit"]) {
    r_.error(t["stop"], "'stop: auto' needs 'time.limit', the latest the run may stop (e.g. limit: 2 ns)");
  } else {
    scene_.time.where = r_.mark(t["limit"]);
    if (auto v = r_.positive(t["limit"], "time.limit", Kind::time, 0, common_period_)) scene_.time.stop = *v;
  }
  if (t["energy-left"])
    if (auto v = r_.quantity(t["energy-left"], "time.energy-left", Kind::dimensionless)) {
      if (!(*v > 0 && *v < 1)) r_.error(t["energy-left"], fmt::format("'time.energy-left' must lie in (0, 1), got {}", *v));
      a.energy_left = *v;
    }
  if (t["tolerance"])
    if (auto v = r_.quantity(t["tolerance"], "time.tolerance", Kind::dimensionless)) {
      if (!(*v > 0 && *v < 1)) r_.error(t["tolerance"], fmt::format("'time.tolerance' must lie in (0, 1), got {}", *v));
      a.tolerance = *v;
    }
  if (t["check-every"])
    if (auto v = r_.positive(t["check-every"], "time.check-every", Kind::time, 0, common_period_)) a.check_every = *v;
}

}  // namespace ty::reader

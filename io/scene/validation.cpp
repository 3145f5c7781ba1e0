/// \file validation.cpp
/// \brief The whole-scene rules of validation.h: integer sizes, step counts, memory against
/// the machine's, placement inside the extent, launch lines, and the warnings that need
/// several sections at once.
#include "io/scene/validation.h"

#include <fmt/format.h>

#include <algorithm>
#include <climits>
#include <cmath>

#include "io/scene/bloch_rules.h"
#include "io/scene/constants.h"
#include "io/scene/medium_lookup.h"

namespace ty {
namespace {

/// Cells along one side: the solver indexes rows and columns with int and pads each row
/// by up to 64 elements for alignment.
constexpr double kMaxSide = static_cast<double>(INT_MAX) - 64;
/// Step counts and times (n+1)*dt are exact in a double up to 2^53.
constexpr double kMaxSteps = 9007199254740992.0;
std::string gigabytes(double b) {
  if (b < 1e9) return fmt::format("{:.1f} MB", b / 1e6);
  if (b < 1e12) return fmt::format("{:.3g} GB", b / 1e9);
  return fmt::format("{:.4g} TB", b / 1e12);
}

}  // namespace

RunSizes run_sizes(const Scene& s) {
  const GridSpec& G = s.grid;
  RunSizes z;
  z.npml_x = absorber_cells(s, 0);
  z.npml_y = absorber_cells(s, 1);
  z.nx = std::round(G.extent.x / G.dx) + 2 * z.npml_x;
  z.ny = std::round(G.extent.y / G.dy) + 2 * z.npml_y;
  z.dt = s.time.step_fraction / (constants::c0 * std::sqrt(1.0 / (G.dx * G.dx) + 1.0 / (G.dy * G.dy)));
  z.steps = std::max(1.0, std::ceil(s.time.stop / z.dt - 1e-9));
  add_memory(s, z);
  return z;
}

namespace {

void check_sizes(const Scene& s, const RunSizes& z, Diagnostics& d) {
  if (z.nx > kMaxSide || z.ny > kMaxSide)
    d.error(s.grid.where,
            fmt::format("grid: {:.0f} x {:.0f} cells (absorber included); at most {:.0f} fit along a side: "
                        "give a smaller extent or a larger cell",
                        z.nx, z.ny, kMaxSide));
  if (!(z.steps <= kMaxSteps))
    d.error(s.time.where,
            fmt::format("time.stop: {:.4g} s is {:.4g} steps of {:.4g} fs; at most {:.4g} steps are allowed",
                        s.time.stop, z.steps, z.dt * 1e15, kMaxSteps));
  for (const auto& o : s.outputs)
    if (o.kind == Output::Kind::snapshots && o.every < z.dt * (1 - 1e-9))
      d.error(o.where, fmt::format("snapshots every {:.4g} s is shorter than one time step ({:.4g} fs); give at least "
                                   "the time step",
                                   o.every, z.dt * 1e15));
}

void check_memory(const RunSizes& z, double limit, Diagnostics& d) {
  const double total = z.memory_bytes();
  if (!(total > limit)) return;
  // the largest of the parts held through the run (the passing ones follow from them)
  const auto big = std::max_element(z.memory.begin(), z.memory.end(), [](const MemoryItem& a, const MemoryItem& b) {
    const bool ha = a.phase == MemoryItem::Phase::held, hb = b.phase == MemoryItem::Phase::held;
    return ha != hb ? hb : a.bytes < b.bytes;
  });
  std::string parts;
  for (const auto& m : z.memory)
    if (m.bytes >= 0.01 * total) parts += fmt::format("{}{} {}", parts.empty() ? "" : ", ", m.what, gigabytes(m.bytes));
  d.error(big->where, fmt::format("the run needs about {} of memory ({}), more than this machine allows ({}); "
                                  "{} is the largest part: shorten time.stop, coarsen the grid or record less",
                                  gigabytes(total), parts, gigabytes(limit), big->what));
}

/// Where things may be: bodies at least partly, point sources, launch lines, probes and
/// power-spectrum lines wholly inside the extent (not in or beyond the absorber).
void check_placement(const Scene& s, Diagnostics& d) {
  const Vec2 e = s.grid.extent;
  const double tol = 1e-9 * s.grid.dx;
  auto inside = [&](Vec2 p) { return p.x >= -tol && p.y >= -tol && p.x <= e.x + tol && p.y <= e.y + tol; };
  for (const auto& b : s.bodies) {
    Vec2 lo, hi;
    b.shape.bounds(lo, hi);
    if (hi.x <= 0 || hi.y <= 0 || lo.x >= e.x || lo.y >= e.y)
      d.error(b.where, "the body lies wholly outside the grid's extent");
  }
  for (const auto& src : s.sources) {
    if (src.kind == Source::Kind::point && !inside(src.at))
      d.error(src.where, "the point source lies outside the grid's extent (inside or beyond the absorber)");
    const double top = src.line_axis == 'x' ? e.x : e.y;
    if (src.kind != Source::Kind::point && (src.line_at < -tol || src.line_at > top + tol))
      d.error(src.where, "the launch line lies outside the grid's extent (inside or beyond the absorber)");
  }
  for (const auto& o : s.outputs) {
    if (o.kind == Output::Kind::probe && !inside(o.at)) d.error(o.where, "the probe lies outside the grid's extent");
    if (o.kind == Output::Kind::power_spectrum && (!inside(o.from) || !inside(o.to)))
      d.error(o.where, "the power-spectrum line lies outside the grid's extent");
  }
}

/// A launch line's field is set by the medium where the beam's axis meets the line; inside
/// a perfect conductor there is no field to launch.
void check_launch(const Scene& s, Diagnostics& d) {
  for (const auto& src : s.sources) {
    if (src.kind == Source::Kind::point) continue;
    const Vec2 p = launch_point(src, s.grid.extent);
    const int m = medium_at(s, p);
    if (m >= 0 && s.media[m].tensor && s.media[m].tensor->dispersive())
      d.error(src.where, fmt::format("the launch line starts inside the dispersive medium '{}' (at x = {:.4g} mm, "
                                     "y = {:.4g} mm); launch from a medium without dispersion",
                                     s.media[m].name, (p.x - s.origin_shift.x) * 1e3, (p.y - s.origin_shift.y) * 1e3));
    if (m >= 0 && s.media[m].perfect_conductor)
      d.error(src.where, fmt::format("the launch line starts inside the perfect conductor '{}' (at x = {:.4g} mm, "
                                     "y = {:.4g} mm); move the line or the body",
                                     s.media[m].name, (p.x - s.origin_shift.x) * 1e3, (p.y - s.origin_shift.y) * 1e3));
  }
}

/// `stop: auto` with a source that never ends decides by its spectra: it needs one.
void check_auto_stop(const Scene& s, Diagnostics& d) {
  if (!s.time.auto_stop.on) return;
  const bool cw = std::any_of(s.sources.begin(), s.sources.end(),
                              [](const Source& src) { return !std::isfinite(source_end(src)); });
  const bool spectra = std::any_of(s.outputs.begin(), s.outputs.end(), [](const Output& o) {
    return o.kind == Output::Kind::power_spectrum || o.kind == Output::Kind::spectral_map;
  });
  if (cw && !spectra)
    d.error(s.time.auto_stop.where, "'stop: auto' with a cw source stops when its power spectra or spectral maps are steady, "
                          "and this scene records neither: add one, or give 'time.stop' as a time");
}

void warn_plane_sides(const Scene& s, std::vector<std::string>& w) {
  for (const auto& src : s.sources) {
    if (src.kind != Source::Kind::plane) continue;
    const bool along_x = src.line_axis == 'x';  // a line x = const: its ends meet the y boundaries
    if ((along_x ? s.grid.by : s.grid.bx) != Boundary::absorbing) continue;
    w.push_back(
        fmt::format("plane source at line {}: its launch line ends in the absorbing boundaries along {}, so the "
                    "wave is cut off there and its edges radiate; make boundaries.{} periodic for a plane wave "
                    "without edges",
                    src.where.line, along_x ? 'y' : 'x', along_x ? 'y' : 'x'));
  }
}

/// A power-spectrum line through a body the reference run removes measures inside the
/// sample in one run and in vacuum in the other: the ratio is no transmission.
void warn_line_in_sample(const Scene& s, std::vector<std::string>& w) {
  const Scene ref = reference_scene(s);
  for (const auto& o : s.outputs) {
    if (o.kind != Output::Kind::power_spectrum) continue;
    for (const auto& b : s.bodies) {
      const bool kept = std::any_of(ref.bodies.begin(), ref.bodies.end(), [&](const Body& r) {
        return r.where.line == b.where.line && r.where.column == b.where.column;
      });
      bool inside = false;
      for (int k = 0; k <= 64 && !kept && !inside; ++k)
        inside =
            b.shape.contains({o.from.x + (o.to.x - o.from.x) * k / 64.0, o.from.y + (o.to.y - o.from.y) * k / 64.0});
      if (inside)
        w.push_back(
            fmt::format("power spectrum '{}' (line {}): its line passes through the sample body at line {}, "
                        "which the reference run removes; place the line outside the sample",
                        o.name, o.where.line, b.where.line));
    }
  }
}

}  // namespace

std::vector<std::string> validate_scene(const Scene& s, double memory_limit) {
  Diagnostics d;
  const RunSizes z = run_sizes(s);
  check_sizes(s, z, d);
  if (d.empty()) check_memory(z, memory_limit, d);  // past the integers, the memory adds nothing
  check_placement(s, d);
  if (d.empty()) check_launch(s, d);
  check_auto_stop(s, d);
  check_bloch(s, d);
  d.throw_if_any();
  std::vector<std::string> w;
  warn_plane_sides(s, w);
  warn_line_in_sample(s, w);
  return w;
}

}  // namespace ty

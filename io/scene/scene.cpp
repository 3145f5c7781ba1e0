/// \file scene.cpp
/// \brief Names of the scene's enumerations, the point-in-shape tests of bodies, and the
/// absorbing layers' thickness.
#include "io/scene/scene.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "io/scene/constants.h"

#include "io/scene/constants.h"

namespace ty {

const char* component_name(Component c) {
  static const char* names[] = {"Ex", "Ey", "Ez", "Hx", "Hy", "Hz"};
  return names[static_cast<int>(c)];
}

const char* boundary_name(Boundary b) {
  switch (b) {
    case Boundary::absorbing: return "absorbing";
    case Boundary::periodic: return "periodic";
    case Boundary::electric_wall: return "electric-wall";
    case Boundary::magnetic_wall: return "magnetic-wall";
    case Boundary::bloch: return "bloch";
  }
  return "?";
}

double Magnet::exchange_field() const {
  return sublattices.empty() ? 0.0 : lambda * sublattices[0].saturation;
}

Vec2 launch_point(const Source& s, Vec2 extent) {
  const double c = std::cos(s.angle), sn = std::sin(s.angle);
  if (s.line_axis == 'x')
    return {s.line_at, s.kind == Source::Kind::beam ? s.focus.y + (s.line_at - s.focus.x) / c * sn : 0.5 * extent.y};
  return {s.kind == Source::Kind::beam ? s.focus.x + (s.line_at - s.focus.y) / sn * c : 0.5 * extent.x, s.line_at};
}

namespace {
/// Where a file waveform's amplitude spectrum is above 1% of its peak: the trapezoid-rule
/// transform of its table at 400 frequencies up to half its mean sampling rate.
Band2 table_band(const Waveform& w) {
  const size_t n = w.table_time.size();
  if (n < 2) return {};
  const double f_top = 0.5 * (n - 1) / (w.table_time.back() - w.table_time.front());
  std::vector<double> a(400);
  for (size_t m = 0; m < a.size(); ++m) {
    const double om = 2 * constants::pi * f_top * (m + 1) / a.size();
    double re = 0, im = 0;
    for (size_t k = 0; k + 1 < n; ++k) {
      const double h = 0.5 * (w.table_time[k + 1] - w.table_time[k]);
      for (size_t e : {k, k + 1})
        re += h * w.table_value[e] * std::cos(om * w.table_time[e]), im += h * w.table_value[e] * std::sin(om * w.table_time[e]);
    }
    a[m] = std::hypot(re, im);
  }
  const double peak = *std::max_element(a.begin(), a.end());
  size_t lo = 0, hi = a.size() - 1;
  while (lo < hi && a[lo] < 0.01 * peak) ++lo;
  while (hi > lo && a[hi] < 0.01 * peak) --hi;
  return {f_top * (lo + 1) / a.size(), f_top * (hi + 1) / a.size()};
}
}  // namespace

Band2 source_band(const Source& s) {
  switch (s.waveform.kind) {
    case Waveform::Kind::cw: return {s.frequency, s.frequency};
    case Waveform::Kind::pulse: {
      // Gaussian field envelope of std dev fwhm / (2 sqrt(ln 2)): its spectrum falls to 1%
      // at sqrt(2 ln 100) / (2 pi sigma_t) from the carrier
      const double sigma_t = s.waveform.fwhm / (2.0 * std::sqrt(std::log(2.0)));
      const double w = std::sqrt(2.0 * std::log(100.0)) / (2.0 * 3.14159265358979323846 * sigma_t);
      return {std::max(0.0, s.frequency - w), s.frequency + w};
    }
    case Waveform::Kind::chirp:
      return {std::min(s.waveform.from, s.waveform.to), std::max(s.waveform.from, s.waveform.to)};
    case Waveform::Kind::single_cycle:  // w exp(-w^2 tau^2 / 2) at 1% of its peak (solver/sources/waveform.h)
      return {0.0061 * s.frequency, 3.5716 * s.frequency};
    case Waveform::Kind::file: return table_band(s.waveform);
  }
  return {s.frequency, s.frequency};
}

double source_end(const Source& s) {
  switch (s.waveform.kind) {
    case Waveform::Kind::cw: return std::numeric_limits<double>::infinity();
    case Waveform::Kind::pulse: return s.waveform.delay + 6.0 * s.waveform.fwhm / (2.0 * std::sqrt(std::log(2.0)));
    case Waveform::Kind::chirp: return s.waveform.length;
    case Waveform::Kind::single_cycle:  // u exp(-u^2/2), u = w (t - delay): below 1e-7 of its peak past u = 6
      return s.waveform.delay + 6.0 / (2.0 * constants::pi * s.frequency);
    case Waveform::Kind::file: return s.waveform.table_time.empty() ? 0.0 : s.waveform.table_time.back();
  }
  return std::numeric_limits<double>::infinity();
}

Scene reference_scene(const Scene& s) {
  Scene r = s;
  r.reference = true;
  r.bodies.clear();
  bool marked = false;
  for (const auto& b : s.bodies) marked |= b.sample;
  for (const auto& b : s.bodies) {
    bool remove = b.sample;
    if (!marked) {
      bool holds = false;
      for (const auto& src : s.sources) {
        const Vec2 p = src.kind == Source::Kind::point ? src.at : launch_point(src, s.grid.extent);
        holds |= b.shape.contains(p);
      }
      remove = !holds;
    }
    if (!remove) r.bodies.push_back(b);
  }
  return r;
}

bool Shape::contains(Vec2 p) const {
  switch (kind) {
    case Kind::rectangle: {
      const double dx = p.x - centre.x, dy = p.y - centre.y;
      // unrotated: the same test without a sine and cosine per point (the solver asks for
      // every node of the grid while it builds)
      if (rotate == 0) return std::abs(dx) <= 0.5 * size.x && std::abs(dy) <= 0.5 * size.y;
      const double c = std::cos(rotate), s = std::sin(rotate);
      const double u = c * dx + s * dy, v = -s * dx + c * dy;  // into the rectangle's own frame
      return std::abs(u) <= 0.5 * size.x && std::abs(v) <= 0.5 * size.y;
    }
    case Kind::circle: {
      const double dx = p.x - centre.x, dy = p.y - centre.y;
      return dx * dx + dy * dy <= radius * radius;
    }
    case Kind::polygon: {  // even-odd crossing rule
      bool inside = false;
      const size_t n = vertices.size();
      for (size_t a = 0, b = n - 1; a < n; b = a++) {
        const Vec2 &pa = vertices[a], &pb = vertices[b];
        if ((pa.y > p.y) != (pb.y > p.y) && p.x < (pb.x - pa.x) * (p.y - pa.y) / (pb.y - pa.y) + pa.x) inside = !inside;
      }
      return inside;
    }
  }
  return false;
}

void Shape::bounds(Vec2& lo, Vec2& hi) const {
  switch (kind) {
    case Kind::rectangle: {
      const double c = std::abs(std::cos(rotate)), s = std::abs(std::sin(rotate));
      const double hx = 0.5 * (c * size.x + s * size.y), hy = 0.5 * (s * size.x + c * size.y);
      lo = {centre.x - hx, centre.y - hy};
      hi = {centre.x + hx, centre.y + hy};
      return;
    }
    case Kind::circle:
      lo = {centre.x - radius, centre.y - radius};
      hi = {centre.x + radius, centre.y + radius};
      return;
    case Kind::polygon:
      lo = hi = vertices.empty() ? Vec2{} : vertices[0];
      for (const auto& v : vertices) {
        lo = {std::min(lo.x, v.x), std::min(lo.y, v.y)};
        hi = {std::max(hi.x, v.x), std::max(hi.y, v.y)};
      }
      return;
  }
}

int absorber_cells(const Scene& s, int axis) {
  const GridSpec& G = s.grid;
  if ((axis == 0 ? G.bx : G.by) != Boundary::absorbing) return 0;
  if (G.absorber.cells > 0) return G.absorber.cells;
  if (G.absorber.kind == Absorber::Kind::pml) return Absorber::kPmlCells;
  // the highest index of a magnetic medium at the two edges of the extent along the axis, at
  // every cell along them (a body holding one of those points runs on through that layer)
  const double along = axis == 0 ? G.extent.y : G.extent.x, d = axis == 0 ? G.dy : G.dx;
  const double cell = axis == 0 ? G.dx : G.dy;
  // one point a cell, but at most kEdgePoints: a side of 2e9 cells (which the memory rule
  // refuses later) took minutes here, four billion lookups, before any rule could speak
  constexpr double kEdgePoints = 1e7;
  const double cells = std::round(along / d);
  const int n = cells >= 1 ? static_cast<int>(std::min(cells, kEdgePoints)) : 1;
  const double pitch = cells > kEdgePoints ? along / n : d;
  double index = G.absorber.kind == Absorber::Kind::graded ? 1.0 : 0.0;  // 0: no magnet there
  for (double edge : {0.0, axis == 0 ? G.extent.x : G.extent.y})
    for (int k = 0; k < n; ++k) {
      const double t = (k + 0.5) * pitch;
      const Vec2 p = axis == 0 ? Vec2{edge, t} : Vec2{t, edge};
      for (int b = static_cast<int>(s.bodies.size()) - 1; b >= 0; --b)
        if (s.bodies[b].shape.contains(p)) {
          const int m = s.bodies[b].medium;
          if (m >= 0 && m < static_cast<int>(s.media.size()) && s.media[m].magnet)
            for (double e : s.media[m].permittivity) index = std::max(index, std::sqrt(std::max(e, 1.0)));
          break;
        }
    }
  if (index == 0) return Absorber::kPmlCells;
  // the graded loss reflects as a taper, less the more wavelengths it spans: kGradedWavelengths
  // of the longest carrier's wavelength in that medium (graded_loss.h)
  double f = 0;
  for (const Source& src : s.sources)
    if (src.frequency > 0) f = f > 0 ? std::min(f, src.frequency) : src.frequency;
  if (!(f > 0) || !(cell > 0)) return Absorber::kGradedCells;
  const double wavelengths = Absorber::kGradedWavelengths * constants::c0 / (f * index) / cell;
  return static_cast<int>(std::clamp(std::ceil(wavelengths), double(Absorber::kGradedCells), double(Absorber::kMostCells)));
}

}  // namespace ty

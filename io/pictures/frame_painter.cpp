/// \file frame_painter.cpp
/// \brief The annotated field picture of frame_painter.h. Layout: title and caption above,
/// the field panel with axes below and left of it, the colour bar to its right. Text is
/// drawn with cairo's simple text API in a sans-serif face (DejaVu Sans on Debian).
#include "io/pictures/frame_painter.h"

#include "io/run/atomic_file.h"

#include "io/scene/constants.h"

#include <cairo-pdf.h>
#include <cairo-svg.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <stdexcept>

namespace ty {
namespace {

constexpr int kLeft = 84, kRight = 150, kTop = 58, kBottom = 62;
constexpr double kInk = 0.12;  // grey level of text and lines

void font(cairo_t* cr, double size, bool bold = false) {
  cairo_select_font_face(cr, "DejaVu Sans", CAIRO_FONT_SLANT_NORMAL,
                         bold ? CAIRO_FONT_WEIGHT_BOLD : CAIRO_FONT_WEIGHT_NORMAL);
  cairo_set_font_size(cr, size);
}

/// Text with its anchor: ax = 0 left, 0.5 centre, 1 right; ay likewise from top to bottom.
void text(cairo_t* cr, double x, double y, const std::string& s, double ax, double ay) {
  cairo_text_extents_t e;
  cairo_text_extents(cr, s.c_str(), &e);
  cairo_move_to(cr, x - e.x_bearing - ax * e.width, y - e.y_bearing - ay * e.height);
  cairo_show_text(cr, s.c_str());
}

/// White text with a dark rim, readable on any colour of the maps.
void halo_text(cairo_t* cr, double x, double y, const std::string& s) {
  cairo_text_extents_t e;
  cairo_text_extents(cr, s.c_str(), &e);
  cairo_move_to(cr, x - e.x_bearing - 0.5 * e.width, y - e.y_bearing - e.height);
  cairo_text_path(cr, s.c_str());
  cairo_set_source_rgb(cr, 0, 0, 0);
  cairo_set_line_width(cr, 3);
  cairo_stroke_preserve(cr);
  cairo_set_source_rgb(cr, 1, 1, 1);
  cairo_fill(cr);
}

std::string pretty_units(std::string u) {
  for (auto [from, to] : {std::pair<std::string, std::string>{"^2", "²"}, {"^3", "³"}, {"um", "µm"}}) {
    for (size_t p; (p = u.find(from)) != std::string::npos;) u.replace(p, from.size(), to);
  }
  return u;
}

std::string superscript(int n) {
  static const char* digits[10] = {"⁰", "¹", "²", "³", "⁴", "⁵", "⁶", "⁷", "⁸", "⁹"};
  std::string s = n < 0 ? "⁻" : "";
  const std::string d = std::to_string(std::abs(n));
  for (char c : d) s += digits[c - '0'];
  return s;
}

std::string tick_label(double v, double step) {
  if (std::abs(v) < 1e-9 * step) v = 0;
  const int decimals = std::max(0, -static_cast<int>(std::floor(std::log10(step) + 1e-9)));
  return fmt::format("{:.{}f}", v, decimals);
}

}  // namespace

std::vector<double> nice_ticks(double lo, double hi, int target) {
  std::vector<double> t;
  if (!(hi > lo)) return t;
  const double raw = (hi - lo) / std::max(1, target);
  const double p = std::pow(10.0, std::floor(std::log10(raw)));
  double step = p;
  for (double m : {1.0, 2.0, 5.0, 10.0})
    if (m * p >= raw * 0.999) {
      step = m * p;
      break;
    }
  for (double v = std::ceil(lo / step - 1e-9) * step; v <= hi + 1e-9 * step; v += step) t.push_back(v);
  return t;
}

FramePainter::FramePainter(FrameStyle style, std::vector<double> x, std::vector<double> y)
    : style_(std::move(style)), x_(std::move(x)), y_(std::move(y)) {
  if (x_.empty() || y_.empty()) throw std::runtime_error("a frame needs at least one node");
  const double dx = x_.size() > 1 ? x_[1] - x_[0] : 1e-6, dy = y_.size() > 1 ? y_[1] - y_[0] : 1e-6;
  // the nodes shown: all, or those inside the region of interest
  i0_ = 0, i1_ = static_cast<int>(x_.size()) - 1, j0_ = 0, j1_ = static_cast<int>(y_.size()) - 1;
  const Window& e = style_.extent;
  if (!style_.show_absorber && e.x1 > e.x0 && e.y1 > e.y0) {
    const double tx = 1e-6 * dx, ty = 1e-6 * dy;
    while (i0_ < i1_ && x_[i0_] < e.x0 - tx) ++i0_;
    while (i1_ > i0_ && x_[i1_] > e.x1 + tx) --i1_;
    while (j0_ < j1_ && y_[j0_] < e.y0 - ty) ++j0_;
    while (j1_ > j0_ && y_[j1_] > e.y1 + ty) --j1_;
  }
  FrameLayout& L = layout_;
  L.view = {x_[i0_] - 0.5 * dx, x_[i1_] + 0.5 * dx, y_[j0_] - 0.5 * dy, y_[j1_] + 0.5 * dy};
  const double aspect = (L.view.x1 - L.view.x0) / (L.view.y1 - L.view.y0);
  const int size = std::max(100, style_.size);
  L.panel_w = aspect >= 1 ? size : std::max(40, static_cast<int>(std::lround(size * aspect)));
  L.panel_h = aspect >= 1 ? std::max(40, static_cast<int>(std::lround(size / aspect))) : size;
  L.panel_x = kLeft;
  L.panel_y = kTop;
  L.width = kLeft + L.panel_w + kRight;
  L.height = kTop + std::max(L.panel_h, 240) + kBottom;
  L.width += L.width % 2;  // H.264 in yuv420p needs even sizes
  L.height += L.height % 2;
  raster_ = cairo_image_surface_create(CAIRO_FORMAT_ARGB32, L.width, L.height);
  cells_.resize(static_cast<size_t>(i1_ - i0_ + 1) * (j1_ - j0_ + 1));
}

FramePainter::~FramePainter() {
  if (raster_) cairo_surface_destroy(raster_);
}

double FramePainter::px(double x) const {
  const auto& L = layout_;
  return L.panel_x + (x - L.view.x0) / (L.view.x1 - L.view.x0) * L.panel_w;
}

double FramePainter::py(double y) const {
  const auto& L = layout_;
  return L.panel_y + (L.view.y1 - y) / (L.view.y1 - L.view.y0) * L.panel_h;
}

void FramePainter::paint(const float* values, const std::string& time_label) {
  cairo_t* cr = cairo_create(raster_);
  draw(cr, values, time_label);
  cairo_destroy(cr);
  cairo_surface_flush(raster_);
}

const uint8_t* FramePainter::pixels() const { return cairo_image_surface_get_data(raster_); }
int FramePainter::stride() const { return cairo_image_surface_get_stride(raster_); }

void FramePainter::write(const std::string& path, const float* values, const std::string& time_label) const {
  namespace fs = std::filesystem;
  const std::string ext = fs::path(path).extension().string();
  const std::string tmp = temporary_name(path);
  cairo_status_t st = CAIRO_STATUS_SUCCESS;
  if (ext == ".png") {
    st = cairo_surface_write_to_png(raster_, tmp.c_str());
  } else if (ext == ".pdf" || ext == ".svg") {
    cairo_surface_t* s = ext == ".pdf" ? cairo_pdf_surface_create(tmp.c_str(), layout_.width, layout_.height)
                                       : cairo_svg_surface_create(tmp.c_str(), layout_.width, layout_.height);
    cairo_t* cr = cairo_create(s);
    draw(cr, values, time_label);
    cairo_destroy(cr);
    cairo_surface_finish(s);
    st = cairo_surface_status(s);
    cairo_surface_destroy(s);
  } else {
    throw std::runtime_error(fmt::format("'{}': pictures are .png, .pdf or .svg", path));
  }
  if (st != CAIRO_STATUS_SUCCESS) {
    discard_temporary(tmp);
    throw std::runtime_error(fmt::format("cannot write '{}': {}", path, cairo_status_to_string(st)));
  }
  commit_file(tmp, path);
}

void FramePainter::draw(cairo_t* cr, const float* values, const std::string& time_label) const {
  const auto& L = layout_;
  cairo_set_source_rgb(cr, 1, 1, 1);
  cairo_paint(cr);
  draw_field(cr, values);
  draw_outlines(cr);
  draw_axes(cr);
  draw_colour_bar(cr);
  // title, caption and time
  cairo_set_source_rgb(cr, kInk, kInk, kInk);
  font(cr, 16, true);
  text(cr, L.panel_x, 10, style_.title, 0, 0);
  font(cr, 13);
  text(cr, L.panel_x, 34, style_.caption, 0, 0);
  if (!time_label.empty()) text(cr, L.panel_x + L.panel_w, 34, time_label, 1, 0);
}

void FramePainter::draw_field(cairo_t* cr, const float* values) const {
  const auto& L = layout_;
  const int nx = static_cast<int>(x_.size()), w = i1_ - i0_ + 1, h = j1_ - j0_ + 1;
  const ColourMap& map = ColourMap::of(style_.colours);
  const double scale = 1.0 / (style_.hi - style_.lo), lo = style_.lo;
  for (int r = 0; r < h; ++r) {  // picture rows run downwards, data rows upwards
    const float* row = values + static_cast<size_t>(j1_ - r) * nx + i0_;
    uint32_t* out = cells_.data() + static_cast<size_t>(r) * w;
    for (int i = 0; i < w; ++i) out[i] = map.pixel((row[i] - lo) * scale);
  }
  cairo_surface_t* img = cairo_image_surface_create_for_data(reinterpret_cast<unsigned char*>(cells_.data()),
                                                             CAIRO_FORMAT_RGB24, w, h, w * 4);
  cairo_save(cr);
  cairo_rectangle(cr, L.panel_x, L.panel_y, L.panel_w, L.panel_h);
  cairo_clip(cr);
  cairo_translate(cr, L.panel_x, L.panel_y);
  cairo_scale(cr, static_cast<double>(L.panel_w) / w, static_cast<double>(L.panel_h) / h);
  cairo_set_source_surface(cr, img, 0, 0);
  // cells stay sharp when enlarged; a reduced field is filtered rather than decimated
  const bool enlarged = L.panel_w >= 2 * w && L.panel_h >= 2 * h;
  cairo_pattern_set_filter(cairo_get_source(cr), enlarged ? CAIRO_FILTER_NEAREST : CAIRO_FILTER_GOOD);
  cairo_pattern_set_extend(cairo_get_source(cr), CAIRO_EXTEND_PAD);
  cairo_paint(cr);
  cairo_restore(cr);
  cairo_surface_destroy(img);
  // the absorbing layers, where shown: a veil with hatching
  const Window& e = style_.extent;
  if (style_.show_absorber && e.x1 > e.x0) {
    cairo_save(cr);
    cairo_rectangle(cr, L.panel_x, L.panel_y, L.panel_w, L.panel_h);
    cairo_rectangle(cr, px(e.x0), py(e.y1), px(e.x1) - px(e.x0), py(e.y0) - py(e.y1));
    cairo_set_fill_rule(cr, CAIRO_FILL_RULE_EVEN_ODD);
    cairo_clip(cr);
    cairo_set_source_rgba(cr, 1, 1, 1, 0.55);
    cairo_paint(cr);
    cairo_set_source_rgba(cr, 0, 0, 0, 0.35);
    cairo_set_line_width(cr, 1);
    for (int d = -L.panel_h; d < L.panel_w; d += 10) {
      cairo_move_to(cr, L.panel_x + d, L.panel_y + L.panel_h);
      cairo_line_to(cr, L.panel_x + d + L.panel_h, L.panel_y);
    }
    cairo_stroke(cr);
    cairo_restore(cr);
  }
}

void FramePainter::draw_outlines(cairo_t* cr) const {
  const auto& L = layout_;
  cairo_save(cr);
  cairo_rectangle(cr, L.panel_x, L.panel_y, L.panel_w, L.panel_h);
  cairo_clip(cr);
  for (const Shape& s : style_.bodies) {
    cairo_new_path(cr);
    if (s.kind == Shape::Kind::circle) {
      cairo_save(cr);
      cairo_translate(cr, px(s.centre.x), py(s.centre.y));
      cairo_scale(cr, px(s.centre.x + s.radius) - px(s.centre.x), py(s.centre.y) - py(s.centre.y + s.radius));
      cairo_arc(cr, 0, 0, 1, 0, 2 * constants::pi);
      cairo_restore(cr);
    } else {
      std::vector<Vec2> v = s.vertices;
      if (s.kind == Shape::Kind::rectangle) {
        const double c = std::cos(s.rotate), n = std::sin(s.rotate);
        v.clear();
        for (auto [a, b] : {std::pair{-1, -1}, {1, -1}, {1, 1}, {-1, 1}}) {
          const double u = 0.5 * a * s.size.x, w = 0.5 * b * s.size.y;
          v.push_back({s.centre.x + c * u - n * w, s.centre.y + n * u + c * w});
        }
      }
      for (size_t k = 0; k < v.size(); ++k) (k ? cairo_line_to : cairo_move_to)(cr, px(v[k].x), py(v[k].y));
      cairo_close_path(cr);
    }
    cairo_set_line_join(cr, CAIRO_LINE_JOIN_ROUND);
    cairo_set_source_rgb(cr, 1, 1, 1);
    cairo_set_line_width(cr, 3.5);
    cairo_stroke_preserve(cr);
    cairo_set_source_rgb(cr, 0, 0, 0);
    cairo_set_line_width(cr, 1.5);
    cairo_stroke(cr);
  }
  cairo_restore(cr);
}

void FramePainter::draw_axes(cairo_t* cr) const {
  const auto& L = layout_;
  const Window& v = L.view;
  const bool mm = std::max(v.x1 - v.x0, v.y1 - v.y0) >= 1.5e-3;
  const double unit = mm ? 1e-3 : 1e-6;
  const char* uname = mm ? "mm" : "µm";
  cairo_set_source_rgb(cr, kInk, kInk, kInk);
  cairo_set_line_width(cr, 1);
  cairo_rectangle(cr, L.panel_x - 0.5, L.panel_y - 0.5, L.panel_w + 1, L.panel_h + 1);
  cairo_stroke(cr);
  font(cr, 12);
  const auto tx = nice_ticks(v.x0 / unit, v.x1 / unit, std::max(2, L.panel_w / 110));
  const double sx = tx.size() > 1 ? tx[1] - tx[0] : 1;
  for (double t : tx) {
    const double p = std::round(px(t * unit)) + 0.5;
    cairo_move_to(cr, p, L.panel_y + L.panel_h + 0.5);
    cairo_line_to(cr, p, L.panel_y + L.panel_h + 6);
    cairo_stroke(cr);
    text(cr, p, L.panel_y + L.panel_h + 9, tick_label(t, sx), 0.5, 0);
  }
  const auto ty = nice_ticks(v.y0 / unit, v.y1 / unit, std::max(2, L.panel_h / 80));
  const double sy = ty.size() > 1 ? ty[1] - ty[0] : 1;
  for (double t : ty) {
    const double p = std::round(py(t * unit)) + 0.5;
    cairo_move_to(cr, L.panel_x - 0.5, p);
    cairo_line_to(cr, L.panel_x - 6, p);
    cairo_stroke(cr);
    text(cr, L.panel_x - 9, p, tick_label(t, sy), 1, 0.5);
  }
  font(cr, 13);
  text(cr, L.panel_x + 0.5 * L.panel_w, L.panel_y + L.panel_h + 30, fmt::format("x ({})", uname), 0.5, 0);
  cairo_save(cr);
  cairo_translate(cr, 18, L.panel_y + 0.5 * L.panel_h);
  cairo_rotate(cr, -constants::pi / 2);
  text(cr, 0, 0, fmt::format("y ({})", uname), 0.5, 0);
  cairo_restore(cr);
  // scale bar, lower left inside the panel: about a fifth of the width
  const double target = 0.2 * (v.x1 - v.x0) / unit;
  const double p10 = std::pow(10.0, std::floor(std::log10(target)));
  double bar = p10;
  for (double m : {2.0, 5.0})
    if (m * p10 <= target) bar = m * p10;
  const double x0 = L.panel_x + 14, y0 = L.panel_y + L.panel_h - 14;
  const double len = bar * unit / (v.x1 - v.x0) * L.panel_w;
  cairo_rectangle(cr, x0, y0 - 4, len, 4);
  cairo_set_source_rgb(cr, 1, 1, 1);
  cairo_fill_preserve(cr);
  cairo_set_source_rgb(cr, 0, 0, 0);
  cairo_set_line_width(cr, 1);
  cairo_stroke(cr);
  font(cr, 12, true);
  halo_text(cr, x0 + 0.5 * len, y0 - 8, fmt::format("{:g} {}", bar, uname));
}

void FramePainter::draw_colour_bar(cairo_t* cr) const {
  const auto& L = layout_;
  const ColourMap& map = ColourMap::of(style_.colours);
  // the bar spans the panel exactly, however thin the panel (a thin panel gets fewer ticks)
  const int h = L.panel_h, x = L.panel_x + L.panel_w + 22, w = 18, y = L.panel_y;
  for (int r = 0; r < h; ++r) {
    const Rgb c = map.at(1.0 - (r + 0.5) / h);
    cairo_set_source_rgb(cr, c.r, c.g, c.b);
    cairo_rectangle(cr, x, y + r, w, 1.01);
    cairo_fill(cr);
  }
  cairo_set_source_rgb(cr, kInk, kInk, kInk);
  cairo_set_line_width(cr, 1);
  cairo_rectangle(cr, x - 0.5, y - 0.5, w + 1, h + 1);
  cairo_stroke(cr);
  // ticks in engineering steps of 10^3: the label carries the factor
  const double big = std::max(std::abs(style_.lo), std::abs(style_.hi));
  const int e3 = big > 0 ? 3 * static_cast<int>(std::floor(std::log10(big) / 3)) : 0;
  const double f = std::pow(10.0, e3);
  const auto ticks = nice_ticks(style_.lo / f, style_.hi / f, std::max(2, h / 60));
  const double step = ticks.size() > 1 ? ticks[1] - ticks[0] : 1;
  font(cr, 12);
  for (double t : ticks) {
    const double p = std::round(y + h - (t * f - style_.lo) / (style_.hi - style_.lo) * h) + 0.5;
    cairo_move_to(cr, x + w, p);
    cairo_line_to(cr, x + w + 5, p);
    cairo_stroke(cr);
    text(cr, x + w + 8, p, tick_label(t, step), 0, 0.5);
  }
  const std::string units = pretty_units(style_.units);
  std::string label = style_.field;
  if (e3 != 0) label += fmt::format(" (10{}{}{})", superscript(e3), units.empty() ? "" : " ", units);
  else if (!units.empty()) label += " (" + units + ")";
  font(cr, 13);
  cairo_text_extents_t e;
  cairo_text_extents(cr, label.c_str(), &e);
  if (e.width + 8 <= h) {  // beside the bar, turned, when the bar is long enough
    cairo_save(cr);
    cairo_translate(cr, L.width - 16, y + 0.5 * h);
    cairo_rotate(cr, -constants::pi / 2);
    text(cr, 0, 0, label, 0.5, 0.5);
    cairo_restore(cr);
  } else {  // under a short bar, level
    text(cr, L.width - 6, y + h + 12, label, 1, 0);
  }
}

}  // namespace ty

/// \file frame_painter.h
/// \brief One annotated picture of a 2D field, drawn with cairo: the field through a colour
/// map with fixed limits, the outline of every body, the absorbing layers shaded (or left
/// out), axes in mm or µm, a scale bar, the time, a colour bar with the field's name and
/// units, and the scene's title. The same drawing goes to a raster surface (PNG frames, movie
/// frames) or to a PDF or SVG surface (figures for papers).
#pragma once
#include <cairo.h>

#include <cstdint>
#include <string>
#include <vector>

#include "io/pictures/colour_map.h"
#include "io/scene/scene.h"

namespace ty {

/// A rectangle in user coordinates, m.
struct Window {
  double x0 = 0, x1 = 0, y0 = 0, y1 = 0;
};

/// Everything a frame shows besides the field values.
struct FrameStyle {
  std::string title;       ///< the scene's title
  std::string caption;     ///< what is shown, e.g. "Ez, snapshot"
  std::string field;       ///< colour-bar label, e.g. "Ez" or "|Ez|²"
  std::string units;       ///< e.g. "V/m"
  ColourMap::Kind colours = ColourMap::Kind::diverging;
  double lo = -1, hi = 1;  ///< colour limits
  std::vector<Shape> bodies;  ///< outlines, user coordinates
  Window extent;              ///< the region of interest; outside it are the absorbing layers
  bool show_absorber = false; ///< shade the absorbing layers instead of cropping them
  int size = 800;             ///< the field panel's longer side, px
};

/// Where the field panel lies in the picture (px) and which user window it shows (m).
struct FrameLayout {
  int width = 0, height = 0;
  int panel_x = 0, panel_y = 0, panel_w = 0, panel_h = 0;
  Window view;
};

class FramePainter {
 public:
  /// x, y: the field's node positions (uniformly spaced), m; values come [y][x], row 0 lowest.
  FramePainter(FrameStyle style, std::vector<double> x, std::vector<double> y);
  ~FramePainter();
  FramePainter(const FramePainter&) = delete;
  FramePainter& operator=(const FramePainter&) = delete;

  const FrameLayout& layout() const { return layout_; }
  void set_limits(double lo, double hi) { style_.lo = lo, style_.hi = hi; }
  /// Draws one frame into the raster surface.
  void paint(const float* values, const std::string& time_label);
  /// The raster: BGRA bytes (cairo ARGB32, little-endian), `stride()` bytes a row.
  const uint8_t* pixels() const;
  int stride() const;
  /// Writes the last painted frame: PNG from the raster, or PDF/SVG (by the extension),
  /// drawing again on a vector surface. Written under a temporary name, then renamed.
  void write(const std::string& path, const float* values, const std::string& time_label) const;

 private:
  void draw(cairo_t* cr, const float* values, const std::string& time_label) const;
  void draw_field(cairo_t* cr, const float* values) const;
  void draw_axes(cairo_t* cr) const;
  void draw_colour_bar(cairo_t* cr) const;
  void draw_outlines(cairo_t* cr) const;
  double px(double x) const;
  double py(double y) const;

  FrameStyle style_;
  std::vector<double> x_, y_;
  int i0_ = 0, i1_ = 0, j0_ = 0, j1_ = 0;  // the nodes shown
  FrameLayout layout_;
  cairo_surface_t* raster_ = nullptr;
  mutable std::vector<uint32_t> cells_;  // the field's pixels, one per node shown
};

/// "Nice" tick positions (1, 2, 5 times a power of ten) covering [lo, hi], about `target` of them.
std::vector<double> nice_ticks(double lo, double hi, int target);

}  // namespace ty

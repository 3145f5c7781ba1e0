/// \file test_frame_painter.cpp
/// \brief The frame painter's colour bar spans the field panel exactly, for a thin panel
/// (10:1, 80 px tall) as for a square one: it starts at the panel's top with the map's top
/// colour and ends at its bottom with the map's bottom colour, and nothing of it reaches
/// past the panel (before, a thin panel's bar kept a 240 px minimum and hung far below).
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <vector>

#include "io/pictures/frame_painter.h"

using namespace ty;

namespace {

struct Painted {
  FrameLayout L;
  std::vector<Rgb> column;  // the colour bar's middle column, top to bottom
};

Painted paint_field(double width_m, double height_m, int size) {
  const int nx = 101, ny = static_cast<int>(std::lround(100 * height_m / width_m)) + 1;
  std::vector<double> x(nx), y(ny);
  for (int i = 0; i < nx; ++i) x[i] = width_m * i / (nx - 1);
  for (int j = 0; j < ny; ++j) y[j] = height_m * j / (ny - 1);
  FrameStyle st;
  st.title = "bar test";
  st.field = "Ez";
  st.units = "V/m";
  st.lo = -1, st.hi = 1;
  st.extent = {x.front(), x.back(), y.front(), y.back()};
  st.size = size;
  FramePainter p(st, x, y);
  std::vector<float> v(static_cast<size_t>(nx) * ny, 0.0f);
  p.paint(v.data(), "t = 0");
  Painted out;
  out.L = p.layout();
  const int xc = out.L.panel_x + out.L.panel_w + 22 + 9;
  for (int r = 0; r < out.L.height; ++r) {
    const uint8_t* px = p.pixels() + static_cast<size_t>(r) * p.stride() + 4 * xc;  // BGRA
    out.column.push_back({px[2] / 255.0, px[1] / 255.0, px[0] / 255.0});
  }
  return out;
}

/// The rows of the column whose colour is far from both the white page and the ink.
std::pair<int, int> coloured_rows(const std::vector<Rgb>& c) {
  int first = -1, last = -1;
  for (int r = 0; r < static_cast<int>(c.size()); ++r) {
    const double lo = std::min({c[r].r, c[r].g, c[r].b}), hi = std::max({c[r].r, c[r].g, c[r].b});
    if (hi - lo > 0.05) {  // a map colour (the diverging map's near-white centre is tinted too little; ends decide)
      if (first < 0) first = r;
      last = r;
    }
  }
  return {first, last};
}

}  // namespace

TEST_CASE("frame painter: the colour bar is as tall as the panel, thin or square") {
  for (auto [w, h] : {std::pair{10e-3, 1e-3}, std::pair{4e-3, 4e-3}}) {
    const Painted p = paint_field(w, h, 800);
    const auto [first, last] = coloured_rows(p.column);
    MESSAGE("panel rows ", p.L.panel_y, " to ", p.L.panel_y + p.L.panel_h - 1, "; coloured bar rows ", first, " to ",
            last);
    REQUIRE(first >= 0);
    CHECK(first >= p.L.panel_y);
    CHECK(first <= p.L.panel_y + 2);
    CHECK(last <= p.L.panel_y + p.L.panel_h - 1);
    CHECK(last >= p.L.panel_y + p.L.panel_h - 3);
    // the top is the map's top (positive end), the bottom its bottom
    const ColourMap& map = ColourMap::diverging();
    CHECK(map.invert(p.column[first]) > 0.97);
    CHECK(map.invert(p.column[last]) < 0.03);
  }
}

/// \file yee_grid.cpp
/// \brief Yee grid layout and the Courant limit.
#include "solver/grid/yee_grid.h"

#include <algorithm>
#include <cmath>

#include "io/scene/units.h"

namespace ty {

void YeeGrid::init(int nx_, int ny_, int npx, int npy, double dx_, double dy_, int align_elements) {
  nx = nx_;
  ny = ny_;
  npml_x = npx;
  npml_y = npy;
  dx = dx_;
  dy = dy_;
  lead = align_elements;  // column 0 starts on an aligned boundary; column -1 is the ghost
  const long need = lead + nx + 1;
  stride = (need + align_elements - 1) / align_elements * align_elements;
}

YeeGrid grid_for(const Scene& s, int align_elements) {
  const GridSpec& G = s.grid;
  const int ext_x = static_cast<int>(std::lround(G.extent.x / G.dx));
  const int ext_y = static_cast<int>(std::lround(G.extent.y / G.dy));
  const int npx = absorber_cells(s, 0);
  const int npy = absorber_cells(s, 1);
  YeeGrid g;
  g.init(ext_x + 2 * npx, ext_y + 2 * npy, npx, npy, G.dx, G.dy, align_elements);
  g.dt = s.time.step_fraction * courant_limit_dt(G.dx, G.dy);
  return g;
}

long steps_for(const Scene& s, const YeeGrid& g) {
  return std::max(1L, static_cast<long>(std::ceil(s.time.stop / g.dt - 1e-9)));
}

double courant_limit_dt(double dx, double dy) {
  return 1.0 / (constants::c0 * std::sqrt(1.0 / (dx * dx) + 1.0 / (dy * dy)));
}

}  // namespace ty

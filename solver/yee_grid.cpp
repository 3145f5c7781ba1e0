/// \file yee_grid.cpp
/// \brief Yee grid layout and the Courant limit.
#include "solver/yee_grid.h"

#include <cmath>

#include "io/units.h"

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

double courant_limit_dt(double dx, double dy) {
  return 1.0 / (constants::c0 * std::sqrt(1.0 / (dx * dx) + 1.0 / (dy * dy)));
}

}  // namespace ty

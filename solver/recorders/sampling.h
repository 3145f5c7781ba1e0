/// \file sampling.h
/// \brief What every recorder shares: bilinear point stencils, the sampling interval of
/// running DFTs, and the names and units of the recordable fields.
#pragma once
#include <array>
#include <string>

#include "io/scene/scene.h"
#include "solver/grid/yee_grid.h"

namespace ty {

/// Steps between the samples of a running DFT (power-spectrum lines, spectral maps): every step would
/// be wasted work, since the fields hold nothing above the sources' bands. Sampling every M
/// steps (the last step always among them) with M dt <= 1/(8 f_max), f_max the highest of
/// the recorder's frequencies and the sources' band edges, aliases nothing below 7 f_max
/// onto the recorded band (harmonics of a driven magnet up to the sixth included), and the
/// sum with weight M dt is the same Riemann sum of the Fourier integral. M is also kept at
/// most window / 400, so short windows sample every step.
int dft_every(const Scene& s, double f_max, double dt, long window_steps);

/// Bilinear interpolation stencil of one component at a point.
struct PointStencil {
  std::array<long, 4> index{};
  std::array<double, 4> weight{};
  template <class R>
  double operator()(const R* f) const {
    double v = 0;
    for (int q = 0; q < 4; ++q) v += weight[q] * f[index[q]];
    return v;
  }
};
PointStencil point_stencil(const YeeGrid& g, Component c, Vec2 p);

const char* field_units(const std::string& field);
bool is_magnetic_field(const std::string& field);

}  // namespace ty

/// \file curl_stencil.h
/// \brief The curl terms of the Yee update as a table: F_p(i, j) += sign * coef *
/// F_q(i + di, j + dj), coef 0 = c dt/dx, 1 = c dt/dy (H), 2 = cb c dt/dx, 3 = cb c dt/dy
/// (E, cb of node p). The row kernels (simulation.cpp) spell the same terms out for speed;
/// the total-field/scattered-field sheets (build_sources.cpp) read this table to find every
/// term that reaches across a launch line (Taflove & Hagness, Computational
/// Electrodynamics, 3rd ed., sec. 5.9, for the TF/SF correction terms).
#pragma once
#include "io/scene/scene.h"

namespace ty {

struct CurlTerm {
  Component p, q;
  int di, dj, coef;
  double sign;
};
inline constexpr CurlTerm kCurlTerms[] = {
    {Component::Hx, Component::Ez, 0, 1, 1, -1}, {Component::Hx, Component::Ez, 0, 0, 1, +1},
    {Component::Hy, Component::Ez, 1, 0, 0, +1}, {Component::Hy, Component::Ez, 0, 0, 0, -1},
    {Component::Hz, Component::Ey, 1, 0, 0, -1}, {Component::Hz, Component::Ey, 0, 0, 0, +1},
    {Component::Hz, Component::Ex, 0, 1, 1, +1}, {Component::Hz, Component::Ex, 0, 0, 1, -1},
    {Component::Ex, Component::Hz, 0, 0, 3, +1}, {Component::Ex, Component::Hz, 0, -1, 3, -1},
    {Component::Ey, Component::Hz, 0, 0, 2, -1}, {Component::Ey, Component::Hz, -1, 0, 2, +1},
    {Component::Ez, Component::Hy, 0, 0, 2, +1}, {Component::Ez, Component::Hy, -1, 0, 2, -1},
    {Component::Ez, Component::Hx, 0, 0, 3, -1}, {Component::Ez, Component::Hx, 0, -1, 3, +1},
};

}  // namespace ty

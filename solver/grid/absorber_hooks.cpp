/// \file absorber_hooks.cpp
/// \brief The absorber's hooks in a Simulation: choosing each side's kind, building the
/// strips (coefficients from cpml.h, auxiliaries psi only in the strips), the CPML
/// correction of the H and E updates of one row (Roden & Gedney, Microw. Opt. Technol. Lett.
/// 27, 334 (2000); Taflove & Hagness, 3rd ed., sec. 7.9), called by the row kernels after
/// the bulk update, and the graded loss (graded_loss.h) on a row's fields.
#include <fmt/format.h>

#include "solver/simulation.h"

namespace ty {

using constants::c0;
using constants::eta0;

template <class R>
void Simulation<R>::build_pml() {
  const Absorber& A = scene_.grid.absorber;
  // which sides take the graded loss: all, none, or (automatic) those whose layer holds
  // magnetic cells, where a PML can amplify backward waves (graded_loss.h)
  bool graded[4] = {false, false, false, false};  // x low, x high, y low, y high
  for (long k = 0; k < mag_.count(); ++k) {
    graded[0] |= mag_.ci[k] < g_.npml_x;
    graded[1] |= mag_.ci[k] >= g_.nx - g_.npml_x;
    graded[2] |= mag_.cj[k] < g_.npml_y;
    graded[3] |= mag_.cj[k] >= g_.ny - g_.npml_y;
  }
  for (bool& b : graded) b = A.kind == Absorber::Kind::graded || (A.kind == Absorber::Kind::automatic && b);
  px_ = make_cpml_axis(g_.nx, g_.npml_x, g_.dx, g_.dt, A, graded[0], graded[1]);
  py_ = make_cpml_axis(g_.ny, g_.npml_y, g_.dy, g_.dt, A, graded[2], graded[3]);
  pml_row_of_.assign(g_.ny, -1);
  for (int l = 0; l < py_.count(); ++l) pml_row_of_[py_.lines[l]] = l;
  static const char* side[4] = {"left", "right", "bottom", "top"};
  std::string pml, loss;
  for (int q = 0; q < 4; ++q) {
    if ((q < 2 ? g_.npml_x : g_.npml_y) == 0) continue;
    std::string& to = graded[q] ? loss : pml;
    to += (to.empty() ? "" : ", ") + std::string(side[q]);
  }
  if (!loss.empty())
    notes_.push_back(fmt::format("absorbers: graded loss (nothing in it can amplify) on the {} side{}{}", loss,
                                 loss.find(',') == std::string::npos ? "" : "s",
                                 pml.empty() ? "" : "; convolutional PML on the " + pml));
  for (int h = 0; h < 2; ++h) {
    for (int l = 0; l < px_.count(); ++l) {
      pbx_[h].push_back(static_cast<R>(px_.b[h][l]));
      pax_[h].push_back(static_cast<R>(px_.a[h][l]));
      pkx_[h].push_back(static_cast<R>(px_.kinv_m1[h][l]));
      pdx_[h].push_back(static_cast<R>(px_.decay[h][l]));
    }
    for (int l = 0; l < py_.count(); ++l) {
      pby_[h].push_back(static_cast<R>(py_.b[h][l]));
      pay_[h].push_back(static_cast<R>(py_.a[h][l]));
      pky_[h].push_back(static_cast<R>(py_.kinv_m1[h][l]));
      pdy_[h].push_back(static_cast<R>(py_.decay[h][l]));
    }
  }
  const size_t nxl = static_cast<size_t>(g_.ny) * px_.count();
  for (auto* a : {&psi_hyx_, &psi_hzx_, &psi_eyx_, &psi_ezx_, &cb_eyx_, &cb_ezx_}) a->resize(nxl);
  const size_t nyl = static_cast<size_t>(py_.count()) * g_.nx;
  for (auto* a : {&psi_hxy_, &psi_hzy_, &psi_exy_, &psi_ezy_, &cb_exy_, &cb_ezy_}) a->resize(nyl);
  bytes_ += 6 * (nxl + nyl) * sizeof(R);
  const double kx = c0 * g_.dt / g_.dx, ky = c0 * g_.dt / g_.dy;
  for (int j = 0; j < g_.ny; ++j)
    for (int l = 0; l < px_.count(); ++l) {
      cb_eyx_[static_cast<size_t>(j) * px_.count() + l] = static_cast<R>(node_cb(1, px_.lines[l], j) * kx);
      cb_ezx_[static_cast<size_t>(j) * px_.count() + l] = static_cast<R>(node_cb(2, px_.lines[l], j) * kx);
    }
  for (int l = 0; l < py_.count(); ++l) {
    const int j = py_.lines[l];
    for (int i = 0; i < g_.nx; ++i) {
      cb_exy_[static_cast<size_t>(l) * g_.nx + i] = static_cast<R>(node_cb(0, i, j) * ky);
      cb_ezy_[static_cast<size_t>(l) * g_.nx + i] = static_cast<R>(node_cb(2, i, j) * ky);
    }
  }
}

template <class R>
void Simulation<R>::pml_h_row(int j) {
  const int nx = g_.nx;
  const long o = g_.at(0, j), s = g_.stride;
  R* __restrict hx = f_[3].data() + o;
  R* __restrict hy = f_[4].data() + o;
  R* __restrict hz = f_[5].data() + o;
  const R* __restrict ex = f_[0].data() + o;
  const R* __restrict ey = f_[1].data() + o;
  const R* __restrict ez = f_[2].data() + o;
  const R* __restrict exn = f_[0].data() + o + s;  // from the array, not from ex (C11 6.7.3.1p4)
  const R* __restrict ezn = f_[2].data() + o + s;
  const R sx = sx_, sy = sy_;
  // convolutional PML, x strips (columns of px_) and y strips (whole rows)
  const int ncx = px_.any_pml() ? px_.count() : 0;
  if (ncx) {
    R* __restrict p1 = psi_hyx_.data() + static_cast<size_t>(j) * ncx;
    R* __restrict p2 = psi_hzx_.data() + static_cast<size_t>(j) * ncx;
    const R *b = pbx_[1].data(), *a = pax_[1].data(), *k = pkx_[1].data();
    for (int l = 0; l < ncx; ++l) {
      const int i = px_.lines[l];
      const R d1 = ez[i + 1] - ez[i], d2 = ey[i + 1] - ey[i];
      p1[l] = b[l] * p1[l] + a[l] * d1;
      p2[l] = b[l] * p2[l] + a[l] * d2;
      hy[i] += sx * (k[l] * d1 + p1[l]);
      hz[i] -= sx * (k[l] * d2 + p2[l]);
    }
  }
  if (const int l = pml_row_of_[j]; l >= 0 && !py_.graded[2 * j < g_.ny ? 0 : 1]) {
    R* __restrict p1 = psi_hxy_.data() + static_cast<size_t>(l) * nx;
    R* __restrict p2 = psi_hzy_.data() + static_cast<size_t>(l) * nx;
    const R b = pby_[1][l], a = pay_[1][l], k = pky_[1][l];
#pragma omp simd
    for (int i = 0; i < nx; ++i) {
      const R d1 = ezn[i] - ez[i], d2 = exn[i] - ex[i];
      p1[i] = b * p1[i] + a * d1;
      p2[i] = b * p2[i] + a * d2;
      hx[i] -= sy * (k * d1 + p1[i]);
      hz[i] += sy * (k * d2 + p2[i]);
    }
  }
}

template <class R>
void Simulation<R>::pml_e_row(int j) {
  const int nx = g_.nx;
  const long o = g_.at(0, j), s = g_.stride;
  R* __restrict ex = f_[0].data() + o;
  R* __restrict ey = f_[1].data() + o;
  R* __restrict ez = f_[2].data() + o;
  const R* __restrict hx = f_[3].data() + o;
  const R* __restrict hy = f_[4].data() + o;
  const R* __restrict hz = f_[5].data() + o;
  const R* __restrict hxp = f_[3].data() + o - s;  // from the array, not from hx (C11 6.7.3.1p4)
  const R* __restrict hzp = f_[5].data() + o - s;
  const int ncx = px_.any_pml() ? px_.count() : 0;
  if (ncx) {
    R* __restrict p1 = psi_eyx_.data() + static_cast<size_t>(j) * ncx;
    R* __restrict p2 = psi_ezx_.data() + static_cast<size_t>(j) * ncx;
    const R* __restrict c1 = cb_eyx_.data() + static_cast<size_t>(j) * ncx;
    const R* __restrict c2 = cb_ezx_.data() + static_cast<size_t>(j) * ncx;
    const R *b = pbx_[0].data(), *a = pax_[0].data(), *k = pkx_[0].data();
    for (int l = 0; l < ncx; ++l) {
      const int i = px_.lines[l];
      const R d1 = hz[i] - hz[i - 1], d2 = hy[i] - hy[i - 1];
      p1[l] = b[l] * p1[l] + a[l] * d1;
      p2[l] = b[l] * p2[l] + a[l] * d2;
      ey[i] -= c1[l] * (k[l] * d1 + p1[l]);
      ez[i] += c2[l] * (k[l] * d2 + p2[l]);
    }
  }
  if (const int l = pml_row_of_[j]; l >= 0 && !py_.graded[2 * j < g_.ny ? 0 : 1]) {
    R* __restrict p1 = psi_exy_.data() + static_cast<size_t>(l) * nx;
    R* __restrict p2 = psi_ezy_.data() + static_cast<size_t>(l) * nx;
    const R* __restrict c1 = cb_exy_.data() + static_cast<size_t>(l) * nx;
    const R* __restrict c2 = cb_ezy_.data() + static_cast<size_t>(l) * nx;
    const R b = pby_[0][l], a = pay_[0][l], k = pky_[0][l];
#pragma omp simd
    for (int i = 0; i < nx; ++i) {
      const R d1 = hz[i] - hzp[i], d2 = hx[i] - hxp[i];
      p1[i] = b * p1[i] + a * d1;
      p2[i] = b * p2[i] + a * d2;
      ex[i] += c1[i] * (k * d1 + p1[i]);
      ez[i] -= c2[i] * (k * d2 + p2[i]);
    }
  }
}

template <class R>
void Simulation<R>::graded_decay(int j, bool electric, int mask) {
  // each node times exp(-nu dt / 2) at its own position (graded_loss.h), once before its
  // update and once after (a symmetric split: with nu uniform the step is exactly the
  // lossless one times exp(-nu dt), its dispersion and impedance unchanged): along x, Ex, Hy and Hz
  // sit on half-integer columns [1], Ey, Ez and Hx on integer ones [0]; along y, Ey, Hx and
  // Hz on half-integer rows [1], Ex, Ez and Hy on integer ones [0]. Corners take both factors.
  const int first = electric ? 0 : 3;
  const long o = g_.at(0, j);
  R* __restrict f0 = f_[first].data() + o;      // Ex or Hx
  R* __restrict f1 = f_[first + 1].data() + o;  // Ey or Hy
  R* __restrict f2 = f_[first + 2].data() + o;  // Ez or Hz
  if (px_.any_graded()) {
    // the x component and the (y, z) ones; the lines in their stretches of consecutive
    // columns (CpmlAxis::stretch), each a vector loop
    const R* s0 = electric ? pdx_[1].data() : pdx_[0].data();
    const R* s1 = electric ? pdx_[0].data() : pdx_[1].data();
    for (size_t k = 0; k + 1 < px_.stretch.size(); ++k) {
      const int a = px_.stretch[k], b = px_.stretch[k + 1];
      const long shift = px_.lines[a] - a;  // column of line l in the stretch: l + shift
      if (mask & 1)
#pragma omp simd
        for (int l = a; l < b; ++l) f0[l + shift] *= s0[l];
      if (mask & 2)
#pragma omp simd
        for (int l = a; l < b; ++l) f1[l + shift] *= s1[l];
      if (mask & 4)
#pragma omp simd
        for (int l = a; l < b; ++l) f2[l + shift] *= s1[l];
    }
  }
  if (const int l = pml_row_of_[j]; l >= 0 && py_.any_graded()) {
    const R on = pdy_[0][l], half = pdy_[1][l];  // integer row, half-integer row
    const R s0 = electric ? on : half, s1 = electric ? half : on, s2 = s0;
    if (s0 == R(1) && s1 == R(1)) return;
    const int nx = g_.nx;
    if (mask & 1)
#pragma omp simd
      for (int i = 0; i < nx; ++i) f0[i] *= s0;
    if (mask & 2)
#pragma omp simd
      for (int i = 0; i < nx; ++i) f1[i] *= s1;
    if (mask & 4)
#pragma omp simd
      for (int i = 0; i < nx; ++i) f2[i] *= s2;
  }
}

#define TY_INSTANTIATE(R)                      \
  template void Simulation<R>::build_pml();    \
  template void Simulation<R>::pml_h_row(int); \
  template void Simulation<R>::pml_e_row(int); \
  template void Simulation<R>::graded_decay(int, bool, int);
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

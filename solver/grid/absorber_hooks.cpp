/// \file absorber_hooks.cpp
/// \brief The absorber's hooks in a Simulation: building the convolutional PML strips
/// (coefficients from cpml.h, auxiliaries psi only in the strips) and the CPML correction
/// of the H and E updates of one row (Roden & Gedney, Microw. Opt. Technol. Lett. 27, 334
/// (2000); Taflove & Hagness, 3rd ed., sec. 7.9), called by the row kernels after the
/// bulk update. Magnetic cells in the strips get their damping ramp in magnetic_step.cpp.
#include "solver/simulation.h"

namespace ty {

using constants::c0;
using constants::eta0;

template <class R>
void Simulation<R>::build_pml(const std::vector<double> (&cb)[3]) {
  const Absorber& A = scene_.grid.absorber;
  px_ = make_cpml_axis(g_.nx, g_.npml_x, g_.dx, g_.dt, A);
  py_ = make_cpml_axis(g_.ny, g_.npml_y, g_.dy, g_.dt, A);
  for (int h = 0; h < 2; ++h) {
    for (int l = 0; l < px_.count(); ++l) {
      pbx_[h].push_back(static_cast<R>(px_.b[h][l]));
      pax_[h].push_back(static_cast<R>(px_.a[h][l]));
      pkx_[h].push_back(static_cast<R>(px_.kinv_m1[h][l]));
    }
    for (int l = 0; l < py_.count(); ++l) {
      pby_[h].push_back(static_cast<R>(py_.b[h][l]));
      pay_[h].push_back(static_cast<R>(py_.a[h][l]));
      pky_[h].push_back(static_cast<R>(py_.kinv_m1[h][l]));
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
      const size_t node = static_cast<size_t>(j) * g_.nx + px_.lines[l];
      cb_eyx_[static_cast<size_t>(j) * px_.count() + l] = static_cast<R>(cb[1][node] * kx);
      cb_ezx_[static_cast<size_t>(j) * px_.count() + l] = static_cast<R>(cb[2][node] * kx);
    }
  pml_row_of_.assign(g_.ny, -1);
  for (int l = 0; l < py_.count(); ++l) {
    const int j = py_.lines[l];
    pml_row_of_[j] = l;
    for (int i = 0; i < g_.nx; ++i) {
      const size_t node = static_cast<size_t>(j) * g_.nx + i;
      cb_exy_[static_cast<size_t>(l) * g_.nx + i] = static_cast<R>(cb[0][node] * ky);
      cb_ezy_[static_cast<size_t>(l) * g_.nx + i] = static_cast<R>(cb[2][node] * ky);
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
  const R* __restrict exn = ex + s;
  const R* __restrict ezn = ez + s;
  const R sx = sx_, sy = sy_;
  // convolutional PML, x strips (columns of px_) and y strips (whole rows)
  const int ncx = px_.count();
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
  if (const int l = pml_row_of_[j]; l >= 0) {
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
  const R* __restrict hxp = hx - s;
  const R* __restrict hzp = hz - s;
  const int ncx = px_.count();
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
  if (const int l = pml_row_of_[j]; l >= 0) {
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

#define TY_INSTANTIATE(R)                                                  \
  template void Simulation<R>::build_pml(const std::vector<double>(&)[3]); \
  template void Simulation<R>::pml_h_row(int);                             \
  template void Simulation<R>::pml_e_row(int);
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

/// \file yee_update.h
/// \brief The Yee update of one node (Yee 1966; Taflove & Hagness, Computational
/// Electrodynamics, 3rd ed., eqs. 3.41-3.43 with d/dz = 0), written once for a value and for
/// a vector of them, with every multiply-add explicit (std::fma, or the vector's own): each
/// result is then rounded the same way in a vector loop, its scalar remainder, a loop over
/// coefficient runs and the fused row (fused_row.h), whatever the compiler would have fused.
/// That is what keeps a row's bits the same whichever of them updates it (the thread count
/// and the blocking decide which: simulation.h). The sums: d = F(i + 1) - F(i) and the like,
/// s = c dt / dx or dy, k = cb c dt / dx or dy, ca the E node's decay (1 in vacuum).
#pragma once
#include <cmath>
#include <type_traits>
#if defined(__AVX512F__) || defined(__FMA__)
#include <immintrin.h>
#endif

namespace ty::yee {

#if defined(__AVX512F__)
inline constexpr int kBytes = 64;  // one 512-bit register a vector
#elif defined(__AVX__)
inline constexpr int kBytes = 32;
#else
inline constexpr int kBytes = 16;
#endif

/// GCC's vector extension of kBytes (an alias template cannot carry the attribute).
template <class R>
struct VecOf {
  typedef R type __attribute__((vector_size(kBytes)));
};
template <class R>
using Vec = typename VecOf<R>::type;

/// a b + c rounded once.
inline double mul_add(double a, double b, double c) { return std::fma(a, b, c); }
inline float mul_add(float a, float b, float c) { return std::fma(a, b, c); }
inline Vec<double> mul_add(Vec<double> a, Vec<double> b, Vec<double> c) {
#if defined(__AVX512F__)
  return (Vec<double>)_mm512_fmadd_pd((__m512d)a, (__m512d)b, (__m512d)c);
#elif defined(__AVX__) && defined(__FMA__)
  return (Vec<double>)_mm256_fmadd_pd((__m256d)a, (__m256d)b, (__m256d)c);
#else
  for (int l = 0; l < kBytes / 8; ++l) a[l] = std::fma(a[l], b[l], c[l]);
  return a;
#endif
}
inline Vec<float> mul_add(Vec<float> a, Vec<float> b, Vec<float> c) {
#if defined(__AVX512F__)
  return (Vec<float>)_mm512_fmadd_ps((__m512)a, (__m512)b, (__m512)c);
#elif defined(__AVX__) && defined(__FMA__)
  return (Vec<float>)_mm256_fmadd_ps((__m256)a, (__m256)b, (__m256)c);
#else
  for (int l = 0; l < kBytes / 4; ++l) a[l] = std::fma(a[l], b[l], c[l]);
  return a;
#endif
}

// H from E: Hx -= sy dEz/dy, Hy += sx dEz/dx, Hz -= sx dEy/dx - sy dEx/dy (neg_sy = -sy)
template <class T>
inline T hx(T h, T d_ez_y, T neg_sy) {
  return mul_add(neg_sy, d_ez_y, h);
}
template <class T>
inline T hy(T h, T d_ez_x, T sx) {
  return mul_add(sx, d_ez_x, h);
}
template <class T>
inline T hz(T h, T d_ey_x, T d_ex_y, T sx, T sy) {
  return h - mul_add(sx, d_ey_x, -(sy * d_ex_y));
}

// E from H: Ex = ca Ex + ky dHz/dy, Ey = ca Ey - kx dHz/dx, Ez = ca Ez + kx dHy/dx - ky dHx/dy;
// with ca = 1 (the vacuum forms below) the products ca E are exact, so both give the same bits
template <class T>
inline T ex(T ca, T e, T d_hz_y, T ky) {
  return mul_add(ky, d_hz_y, ca * e);
}
template <class T>
inline T ey(T ca, T e, T d_hz_x, T neg_kx) {
  return mul_add(neg_kx, d_hz_x, ca * e);
}
template <class T>
inline T ez(T ca, T e, T d_hy_x, T d_hx_y, T kx, T ky) {
  return mul_add(ca, e, mul_add(kx, d_hy_x, -(ky * d_hx_y)));
}
template <class T>
inline T ex(T e, T d_hz_y, T ky) {
  return mul_add(ky, d_hz_y, e);
}
template <class T>
inline T ey(T e, T d_hz_x, T neg_kx) {
  return mul_add(neg_kx, d_hz_x, e);
}
template <class T>
inline T ez(T e, T d_hy_x, T d_hx_y, T kx, T ky) {
  return e + mul_add(kx, d_hy_x, -(ky * d_hx_y));
}

}  // namespace ty::yee

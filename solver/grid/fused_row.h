/// \file fused_row.h
/// \brief H and then E of one row's interior columns [a, b) in a single vector loop: the Yee
/// update of Simulation::h_row and e_row_update's constant-coefficient loop (Yee 1966;
/// Taflove & Hagness, Computational Electrodynamics, 3rd ed., eqs. 3.41-3.43 with d/dz = 0),
/// the same expressions in the same order, so the same bits. The pair of row loops loads each
/// block of W columns 20 times (10 vectors in each, four of them one column off); here each
/// block's E and H are loaded once and stored once, the E value one column right is shifted in
/// from the next block's vector (already loaded) and the new H value one column left from the
/// previous block's (still in a register): 10 loads and 6 stores a block (docs/performance.md,
/// "One loop for H and E"). The H of column b - 1 reads E(b) as it was, and the E of column a
/// reads H(a - 1) as it is: the caller updates H outside [a, b) first and E outside it after.
#pragma once
#include <cstring>
#include <utility>

#include "solver/grid/yee_update.h"

namespace ty::fused_row {

/// Columns a vector holds; a fused span's ends are multiples of it (columns 0 start a
/// 64-byte line: yee_grid.h).
template <class R>
constexpr int lanes() {
  return yee::kBytes / static_cast<int>(sizeof(R));
}

#if defined(__GNUC__) && defined(__has_builtin)
#if __has_builtin(__builtin_shufflevector)
#define TY_FUSED_ROW_VECTORS 1
#endif
#endif

#ifdef TY_FUSED_ROW_VECTORS
/// Lanes 1 .. W of the pair (a, b): the values one column right of a's.
template <class V, std::size_t... I>
inline V one_right(V a, V b, std::index_sequence<I...>) {
  return __builtin_shufflevector(a, b, (I + 1)...);
}
/// Lanes W-1 .. 2W-2 of the pair (a, b): the values one column left of b's.
template <class V, std::size_t... I>
inline V one_left(V a, V b, std::index_sequence<I...>) {
  return __builtin_shufflevector(a, b, (I + sizeof...(I) - 1)...);
}
#endif

/// The row's six arrays at column 0 (Ex, Ey, Ez, Hx, Hy, Hz), s the row stride; sx, sy = c dt
/// / dx, c dt / dy, kx, ky the E update's (ca = 1) on the whole span; b - a a multiple of lanes<R>().
template <class R>
void step(R* const* f, long s, int a, int b, R sx, R sy, R kx, R ky) {
  R* __restrict ex = f[0];
  R* __restrict ey = f[1];
  R* __restrict ez = f[2];
  R* __restrict hx = f[3];
  R* __restrict hy = f[4];
  R* __restrict hz = f[5];
  // the neighbour rows from the arrays, not from ex and hx: one restrict pointer is not made
  // from another in the same block (C11 6.7.3.1p4)
  const R* __restrict exn = f[0] + s;  // E of the row above
  const R* __restrict ezn = f[2] + s;
  const R* __restrict hxp = f[3] - s;  // H of the row below
  const R* __restrict hzp = f[5] - s;
#ifdef TY_FUSED_ROW_VECTORS
  using V = yee::Vec<R>;
  constexpr int W = lanes<R>();
  using Lanes = std::make_index_sequence<W>;
  auto load = [](const R* p) {
    V v;
    std::memcpy(&v, p, sizeof v);
    return v;
  };
  auto store = [](R* p, V v) { std::memcpy(p, &v, sizeof v); };
  // each coefficient copied to every lane as the row loops hold it (0 - k would give +0 where
  // -k is -0, and a product with -0 can keep a -0 result that +0 would not)
  auto splat = [](R x) {
    V v;
    for (int l = 0; l < W; ++l) v[l] = x;
    return v;
  };
  const V vsx = splat(sx), vsy = splat(sy), neg_sy = splat(-sy), vkx = splat(kx), vky = splat(ky), neg_kx = splat(-kx);
  V hy_left{}, hz_left{};  // new H of the block before: lane W-1 is column a - 1
  hy_left[W - 1] = hy[a - 1], hz_left[W - 1] = hz[a - 1];
  V ez_here = load(ez + a), ey_here = load(ey + a);
  for (int i = a; i < b; i += W) {
    const V ez_next = load(ez + i + W), ey_next = load(ey + i + W);
    const V ez_right = one_right(ez_here, ez_next, Lanes{}), ey_right = one_right(ey_here, ey_next, Lanes{});
    const V ex_here = load(ex + i);
    const V hxv = yee::hx(load(hx + i), load(ezn + i) - ez_here, neg_sy);
    const V hyv = yee::hy(load(hy + i), ez_right - ez_here, vsx);
    const V hzv = yee::hz(load(hz + i), ey_right - ey_here, load(exn + i) - ex_here, vsx, vsy);
    store(hx + i, hxv), store(hy + i, hyv), store(hz + i, hzv);
    const V hy0 = one_left(hy_left, hyv, Lanes{}), hz0 = one_left(hz_left, hzv, Lanes{});
    store(ex + i, yee::ex(ex_here, hzv - load(hzp + i), vky));
    store(ey + i, yee::ey(ey_here, hzv - hz0, neg_kx));
    store(ez + i, yee::ez(ez_here, hyv - hy0, hxv - load(hxp + i), vkx, vky));
    hy_left = hyv, hz_left = hzv, ez_here = ez_next, ey_here = ey_next;
  }
#else
  for (int i = a; i < b; ++i) {
    hx[i] = yee::hx(hx[i], ezn[i] - ez[i], R(-sy));
    hy[i] = yee::hy(hy[i], ez[i + 1] - ez[i], sx);
    hz[i] = yee::hz(hz[i], ey[i + 1] - ey[i], exn[i] - ex[i], sx, sy);
  }
  for (int i = a; i < b; ++i) {
    ex[i] = yee::ex(ex[i], hz[i] - hzp[i], ky);
    ey[i] = yee::ey(ey[i], hz[i] - hz[i - 1], R(-kx));
    ez[i] = yee::ez(ez[i], hy[i] - hy[i - 1], hx[i] - hxp[i], kx, ky);
  }
#endif
}

}  // namespace ty::fused_row

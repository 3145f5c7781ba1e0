/// \file slabs.h
/// \brief How a grid is cut over P ranks, and what crosses each cut every step.
///
/// The step sweeps rows (simulation.h), so the grid is cut into P slabs of whole rows,
/// contiguous blocks whose sizes differ by at most one (the rows a rank owns are then
/// whole rows of memory: a halo row is one contiguous copy, the row kernels are unchanged).
/// A 2D process grid would cut the halo per rank from a row to a half row's perimeter only
/// when P is large against ny/nx; slabs are kept while every rank holds at least
/// `kMinRowsPerRank` rows, which `check --ranks` enforces.
///
/// What crosses a cut is derived from the curl stencil table (curl_stencil.h), the way the
/// launch sheets are: an H update of row j reads the E components whose terms have dj = +1
/// (the row above, old values), an E update of row j reads the H components whose terms
/// have dj = -1 (the row below, this step's values). So each step a rank receives those E
/// rows from the rank above before its last H row, and those H rows from the rank below
/// before its first E row; nothing else in the sweep reads across a row.
#pragma once
#include <array>

#include "solver/grid/curl_stencil.h"

namespace ty::parallel {

inline constexpr int kMinRowsPerRank = 2;

/// Components of kind `electric` (E: read by H terms from the row above; else H: read by E
/// terms from the row below) that cross a cut, as a mask over Component (bit c).
constexpr unsigned halo_mask(bool electric) {
  unsigned m = 0;
  for (const CurlTerm& t : kCurlTerms) {
    const bool reads_e = static_cast<int>(t.q) < 3;
    if (reads_e == electric && t.dj == (electric ? +1 : -1)) m |= 1u << static_cast<int>(t.q);
    // a term reading the other way across a row would need a second halo: there is none
  }
  return m;
}
constexpr int halo_components(bool electric) {
  int n = 0;
  for (unsigned m = halo_mask(electric); m; m >>= 1) n += m & 1u;
  return n;
}
/// No H term reads the row below and no E term the row above (one halo row each way).
constexpr bool halo_is_one_sided() {
  for (const CurlTerm& t : kCurlTerms)
    if ((static_cast<int>(t.q) < 3 && t.dj < 0) || (static_cast<int>(t.q) >= 3 && t.dj > 0)) return false;
  return true;
}
static_assert(halo_is_one_sided(), "the row exchange assumes E halos come from above and H halos from below");
static_assert(halo_components(true) == 2 && halo_components(false) == 2, "Ex, Ez up; Hx, Hz down (Yee 1966)");

/// The components of a halo, in Component order.
constexpr std::array<int, 3> halo_list(bool electric) {
  std::array<int, 3> l{-1, -1, -1};
  int n = 0;
  for (int c = 0; c < 6; ++c)
    if (halo_mask(electric) & (1u << c)) l[n++] = c;
  return l;
}

/// Rows [lo, hi) of rank r of P.
inline void slab_rows(int ny, int r, int P, int& lo, int& hi) {
  const int q = ny / P, rem = ny % P;
  lo = r * q + (r < rem ? r : rem);
  hi = lo + q + (r < rem ? 1 : 0);
}

/// Whether rank r of P reads row j of a cell list: its rows [lo, hi) and the row beyond each
/// side, across a periodic y seam too (the neighbours its step reads; a resumed rank reads
/// the same rows back, Simulation::owned_parts with widen 1). Every row with one rank.
inline bool reads_row(int j, int ny, int r, int P, bool periodic_y) {
  if (P == 1) return true;
  int lo, hi;
  slab_rows(ny, r, P, lo, hi);
  if (j >= lo - 1 && j <= hi) return true;
  return periodic_y && ((lo == 0 && j == ny - 1) || (hi == ny && j == 0));
}

/// Bytes that cross one cut per step, both ways together (whole rows of `stride` values,
/// ghost columns and padding included, as sent): the E rows going down to the rank below,
/// the H rows going up to the rank above.
inline long halo_bytes_per_cut(long stride, int bytes_per_value) {
  return static_cast<long>(halo_components(true) + halo_components(false)) * stride * bytes_per_value;
}

}  // namespace ty::parallel

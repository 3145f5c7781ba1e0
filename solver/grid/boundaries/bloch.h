/// \file bloch.h
/// \brief The Bloch-periodic x sides at a fixed transverse wavenumber k_x: the sine-cosine
/// method (Harms, Mittra & Ko, IEEE Trans. Antennas Propag. 42, 1317 (1994); Taflove &
/// Hagness, Computational Electrodynamics, 3rd ed., ch. 13, the constant-k_x "sine-cosine"
/// direct-field method -- section number from memory).
///
/// The complex field F = A + iB obeys the Bloch condition F(x + L_x) = F(x) e^{i k_x L_x}.
/// Maxwell's equations are real and linear, so A (the cosine copy) and B (the sine copy) are
/// two real fields, each stepped by the ordinary solver; they meet only at the x seam, where
/// the ghost columns take, with c = cos(k_x L_x) and s = sin(k_x L_x):
///   past the right edge (column nx = column 0 moved by +L_x: Ey, Ez, and Hx for the gather)
///     A_g = c A(0) - s B(0),        B_g = s A(0) + c B(0)
///   past the left edge (column -1 = column nx-1 moved by -L_x: Hy, Hz)
///     A_g = c A(nx-1) + s B(nx-1),  B_g = c B(nx-1) - s A(nx-1)
/// Written at the moments periodic.h writes its copies (E ghosts just before a row's H
/// update, from both copies' E at step n; H ghosts after both copies' final H of the row),
/// so the two copies step in lock-step, row by row (Simulation::step_pair). At k_x = 0,
/// c = 1 and s = 0: A's ghosts are exactly periodic.h's copies and B stays zero.
#pragma once

namespace ty::bloch {

struct Phase {
  double c = 1, s = 0;  ///< cos and sin of k_x L_x
};

/// Right-edge ghost (column nx) of copies a and b from their column 0 values a0, b0.
template <class R>
inline void right_ghost(R& ag, R& bg, R a0, R b0, const Phase& p) {
  ag = static_cast<R>(p.c * a0 - p.s * b0);
  bg = static_cast<R>(p.s * a0 + p.c * b0);
}
/// Left-edge ghost (column -1) of copies a and b from their column nx-1 values.
template <class R>
inline void left_ghost(R& ag, R& bg, R a1, R b1, const Phase& p) {
  ag = static_cast<R>(p.c * a1 + p.s * b1);
  bg = static_cast<R>(p.c * b1 - p.s * a1);
}

/// Row pointers at column 0 of both copies: Ey, Ez ghosts of column nx.
template <class R>
inline void e_ghosts_x(R* eya, R* eza, R* eyb, R* ezb, int nx, const Phase& p) {
  right_ghost(eya[nx], eyb[nx], eya[0], eyb[0], p);
  right_ghost(eza[nx], ezb[nx], eza[0], ezb[0], p);
}
/// Hy, Hz ghosts of column -1 and the Hx ghost of column nx.
template <class R>
inline void h_ghosts_x(R* hxa, R* hya, R* hza, R* hxb, R* hyb, R* hzb, int nx, const Phase& p) {
  left_ghost(hya[-1], hyb[-1], hya[nx - 1], hyb[nx - 1], p);
  left_ghost(hza[-1], hzb[-1], hza[nx - 1], hzb[nx - 1], p);
  right_ghost(hxa[nx], hxb[nx], hxa[0], hxb[0], p);
}

}  // namespace ty::bloch

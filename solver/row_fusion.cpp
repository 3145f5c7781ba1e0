/// \file row_fusion.cpp
/// \brief Which columns of each row take H and E in one loop (solver/grid/fused_row.h), and
/// the row step that uses them. A row's fused span is the longest stretch of columns where
/// all three E components share one coefficient run with ca = 1 and the same (kx, ky), clear
/// of the x absorber's strips, the walls' and ghosts' columns (a vector's margin at each
/// side) and the nodes that take more than the plain update (sources, poles), cut to whole
/// vectors; rows in a y strip or held by a magnetic wall take none. The rest of the row goes
/// through h_row and e_row as before: H outside the span first (with the absorber's
/// corrections and the walls' hooks), then the span, then E outside it, so every node is
/// updated from the same values by the same formulas (yee_update.h) as by h_row then e_row:
/// the same bits, whichever rows the thread count and the blocking hand to which loop.
#include <algorithm>

#include "solver/grid/fused_row.h"
#include "solver/simulation.h"

namespace ty {

template <class R>
void Simulation<R>::build_fusion() {
  constexpr int W = fused_row::lanes<R>();
  const int nx = g_.nx, ny = g_.ny;
  if (fused_.empty()) bytes_ += static_cast<std::size_t>(ny) * sizeof(FusedSpan);
  fused_.assign(static_cast<std::size_t>(ny), {});
  // magnets, ranks and Bloch pairs step their rows by their own sweeps (a rotated tensor's
  // in-plane nodes are swept as vacuum, by the same formula in either loop, and stepped after
  // the whole sweep: tensor_cells.h)
  if (!mag_.empty() || ranks_ > 1 || walls_.bloch_x) return;
  // the x strips' columns (their corrections and losses come between the plain update and
  // the neighbours' reads) and a vector's margin at each side (the walls' columns 0 and
  // nx - 1, the ghosts) stay with the row kernels; the span's last vector reads E(b .. b+W-1)
  int lo = W, hi = nx - W;
  for (const int l : px_.lines) l < nx / 2 ? lo = std::max(lo, l + 1) : hi = std::min(hi, l);
  lo = (lo + W - 1) / W * W;
  if (hi - lo < 2 * W) return;
  std::vector<int> cut;  // a row's columns with a node that takes more than the plain update
  for (int j = 0; j < ny; ++j) {
    if (pml_row_of_[j] >= 0 || (walls_.magnetic_y && j == ny - 1)) continue;  // a y strip, a wall's hold on the row
    // the sources' and the poles' nodes (each node's extra before and after its own update
    // keeps its order as long as it stays out of the span)
    const long o = g_.at(0, j);
    cut.clear();
    for (int q = inj_h_row_[j]; q < inj_h_row_[j + 1]; ++q) cut.push_back(static_cast<int>(inj_h_[q].index - o));
    for (int q = inj_e_row_[j]; q < inj_e_row_[j + 1]; ++q) cut.push_back(static_cast<int>(inj_e_[q].index - o));
    for (int q = disp_.row_first[j]; q < disp_.row_first[j + 1]; ++q)
      cut.push_back(static_cast<int>(disp_.index[q] - o));
    std::sort(cut.begin(), cut.end());
    FusedSpan best;
    // a stretch [s, e) with the E update (kx, ky), cut at those nodes, each piece to whole vectors in [lo, hi)
    auto offer = [&](int s, int e, R kx, R ky) {
      for (auto c = std::lower_bound(cut.begin(), cut.end(), s); s < e; ++c) {
        const int end = c == cut.end() ? e : std::min(e, *c);
        const int a = std::max((s + W - 1) / W * W, lo), b = a + std::max(0, std::min(end, hi) - a) / W * W;
        if (b - a > best.b - best.a) best = {a, b, kx, ky};
        if (c == cut.end()) break;
        s = *c + 1;
      }
    };
    // walk the three components' runs together (each tiles the row, coefficient_runs.cpp):
    // between two run ends each component has one run; a stretch goes on while all three
    // have ca = 1 and the same (kx, ky)
    int p[3] = {row_runs_[3 * j], row_runs_[3 * j + 1], row_runs_[3 * j + 2]};
    FusedSpan now;
    for (int i = 0; i < nx;) {
      int end = nx;
      for (int c = 0; c < 3; ++c) {
        while (runs_[p[c]].i1 <= i) ++p[c];
        end = std::min(end, runs_[p[c]].i1);
      }
      const Run &x = runs_[p[0]], &y = runs_[p[1]], &z = runs_[p[2]];
      const bool plain =
          x.ca == R(1) && y.ca == R(1) && z.ca == R(1) && x.kx == y.kx && y.kx == z.kx && x.ky == y.ky && y.ky == z.ky;
      const bool on = plain && now.b == i && now.b > now.a && now.kx == x.kx && now.ky == x.ky;
      if (!on && now.b > now.a) offer(now.a, now.b, now.kx, now.ky);
      now = on ? FusedSpan{now.a, end, now.kx, now.ky} : plain ? FusedSpan{i, end, x.kx, x.ky} : FusedSpan{};
      i = end;
    }
    if (now.b > now.a) offer(now.a, now.b, now.kx, now.ky);
    if (best.b - best.a >= 2 * W) fused_[j] = best;
  }
}

template <class R>
void Simulation<R>::set_row_fusion(bool on) {
  if (on)
    build_fusion();
  else
    fused_.assign(static_cast<std::size_t>(g_.ny), {});
}

template <class R>
int Simulation<R>::fused_rows() const {
  return static_cast<int>(std::count_if(fused_.begin(), fused_.end(), [](const FusedSpan& f) { return f.b > f.a; }));
}

template <class R>
void Simulation<R>::he_row(int j, const double* ev) {
  const FusedSpan& s = fused_[j];
  if (s.b == s.a) {
    h_row(j, ev);
    e_row(j, ev);
    return;
  }
  h_row(j, ev, s.a, s.b);
  const long o = g_.at(0, j);
  R* const f[6] = {f_[0].data() + o, f_[1].data() + o, f_[2].data() + o,
                   f_[3].data() + o, f_[4].data() + o, f_[5].data() + o};
  fused_row::step(f, g_.stride, s.a, s.b, sx_, sy_, s.kx, s.ky);
  e_row(j, ev, s.a, s.b);
}

#define TY_INSTANTIATE(R)                            \
  template void Simulation<R>::build_fusion();       \
  template void Simulation<R>::set_row_fusion(bool); \
  template int Simulation<R>::fused_rows() const;    \
  template void Simulation<R>::he_row(int, const double*);
TY_INSTANTIATE(float)
TY_INSTANTIATE(double)
#undef TY_INSTANTIATE

}  // namespace ty

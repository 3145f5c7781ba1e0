/// \file magnet_halo.h
/// \brief What the step of a scene with magnetic cells reads across a cut between ranks,
/// derived from the table of the cells' gather (kCellGather, magnetic_cells.h) the way
/// slabs.h derives the field halo from the curl stencil table, and the buffers it travels in.
///
/// A cell belongs to the rank that owns its row (its Hz node: the row sweep moves a row's
/// cells between that row's H and E updates). For the cells of row j (magnetic_cells.h):
///   - the gather reads the H rows j + dj: the components of its terms with dj = +1 come from
///     the row above, twice a step: as they were before Faraday's law (b at n-1/2) and as h*
///     after it, before the scatter (b at n+1/2);
///   - the scatter P = G^T writes H row j from the cell rows j - dj: H row lo of a rank takes
///     the change dM, along the axes of the components with a dj != 0 term, of the cells of
///     row lo - 1;
///   - the cell's field G B / mu0 - mu0 dM reads the previous state of the cells dj_a - dj_b
///     rows away (two terms of one component): along those axes, both sublattices, of the
///     rows lo - 1 and hi (sent after each step, as the state the next step reads).
/// Nothing else of the magnetic step reads across a row (the gather's other terms, the
/// scatter into Hx and Hz and the cells' neighbours along x stay in the row).
#pragma once
#include <array>
#include <vector>

#include "solver/media/magnetic_cells.h"
#include "solver/parallel/ranks.h"

namespace ty::parallel {

constexpr int axis_of(Component q) { return static_cast<int>(q) - 3; }

/// H components (bit c of Component) the gather of row j reads from row j + 1.
constexpr unsigned cell_h_above_mask() {
  unsigned m = 0;
  for (const CellNode& t : kCellGather)
    if (t.dj == 1) m |= 1u << static_cast<int>(t.q);
  return m;
}
/// Axes (bit a) along which the scatter into a row takes the change of the cells of another row.
constexpr unsigned cell_dm_axes() {
  unsigned m = 0;
  for (const CellNode& t : kCellGather)
    if (t.dj != 0) m |= 1u << axis_of(t.q);
  return m;
}
/// Axes (bit a) along which a cell's field reads the state of the cells of another row.
constexpr unsigned cell_m_axes() {
  unsigned m = 0;
  for (const CellNode& a : kCellGather)
    for (const CellNode& b : kCellGather)
      if (a.q == b.q && a.dj != b.dj) m |= 1u << axis_of(a.q);
  return m;
}
constexpr int bits(unsigned m) { return m ? static_cast<int>(m & 1u) + bits(m >> 1) : 0; }
/// The gather reaches at most the row above: one cell row each way, H rows from above only.
constexpr bool cell_gather_is_one_row_up() {
  for (const CellNode& t : kCellGather)
    if (t.dj < 0 || t.dj > 1) return false;
  return true;
}
static_assert(cell_gather_is_one_row_up(), "the cells' halo is one row each way, the gather's H from above");
static_assert(cell_h_above_mask() == 1u << static_cast<int>(Component::Hy) && cell_dm_axes() == 2u &&
                  cell_m_axes() == 2u,
              "G of magnetic_cells.h: Hy of the row above; the cells above and below along y");

/// The list of the components in a mask, in Component order (-1 past the end).
constexpr std::array<int, 3> list_of(unsigned mask) {
  std::array<int, 3> l{-1, -1, -1};
  int n = 0;
  for (int c = 0; c < 6; ++c)
    if (mask & (1u << c)) l[n++] = c;
  return l;
}
/// Values a cell row's halo carries per cell: both sublattices along the m axes, dM along the dm axes.
inline constexpr int kCellValues = 2 * bits(cell_m_axes()) + bits(cell_dm_axes());

/// The magnetic step's exchange buffers over ranks, and the cells' blocks of the gathers.
template <class R>
struct MagnetHalo {
  std::vector<R> old_out, old_in;                 // E rows and the gather's H rows, as before the step (down)
  std::vector<R> star_out, star_in;               // the gather's H rows after Faraday's law (down)
  std::vector<double> cells_out[2], cells_in[2];  // [0] up, [1] down: a cell row's values
  std::vector<R> h_out, h_in;                     // H rows the E update reads (up)
  Request req[10];
  std::vector<int> recorder_cell_counts;  // bytes of the recorder rows' cells per rank
  std::vector<long> recorder_cells;       // first and end cell of each recorder row
  std::vector<double> recorder_buf;
  long tilted_elsewhere = 0;  // other ranks' midpoint cell-steps, as of the last gather_sums(true)
};

}  // namespace ty::parallel

/// \file recorder_taps.cpp
/// \brief Listing a block's recorder taps by row (recorder_taps.h).
#include "solver/blocking/recorder_taps.h"

#include <algorithm>

namespace ty::blocking {

void RecorderTaps::build(const std::vector<ProbeRecorder>& probes, const std::vector<PowerSpectrumRecorder>& lines,
                         int ny, long stride, const std::vector<int>& cell_row, int depth) {
  *this = RecorderTaps{};
  std::vector<std::pair<int, FieldTap>> f;  // (row, tap)
  std::vector<std::pair<int, CellTap>> c;
  auto stencil_row = [&](const PointStencil& st) {  // the upper of its rows (index = (j + 1) stride + ...)
    long top = 0;
    for (long i : st.index) top = std::max(top, i / stride - 1);
    return static_cast<int>(std::clamp<long>(top, 0, ny - 1));
  };
  for (const ProbeRecorder& p : probes) {
    const int g = groups();
    slot0.push_back(slots);
    for (int s = 0; s < p.field_reads(); ++s) f.push_back({stencil_row(p.slot_stencil(s)), {&p.slot_stencil(s), s % 6, slots + s, g}});
    for (size_t m = 0; m < p.magnetic.size(); ++m)
      for (int q = 0; q < 4; ++q)
        if (p.cells[q] >= 0)
          c.push_back({cell_row[p.cells[q]], {p.cells[q], &p.magnetic[m], slots + p.field_reads() + 4 * static_cast<int>(m) + q, g}});
    slots += p.slots();
  }
  for (const PowerSpectrumRecorder& r : lines) {
    const int g = groups();
    slot0.push_back(slots);
    for (size_t p = 0; p < r.points.size(); ++p)
      for (int k = 0; k < 6; ++k)
        f.push_back({stencil_row(r.stencil[p][k]), {&r.stencil[p][k], k, slots + static_cast<int>(p) * 6 + k, g}});
    slots += static_cast<int>(r.points.size()) * 6;
  }
  auto by_row = [ny](auto& list, auto& out, std::vector<int>& first) {
    std::stable_sort(list.begin(), list.end(), [](const auto& a, const auto& b) { return a.first < b.first; });
    first.assign(static_cast<size_t>(ny) + 1, 0);
    for (const auto& e : list) ++first[static_cast<size_t>(e.first) + 1];
    for (int j = 0; j < ny; ++j) first[j + 1] += first[j];
    for (const auto& e : list) out.push_back(e.second);
  };
  by_row(f, field, field_first);
  by_row(c, cell, cell_first);
  values.assign(static_cast<size_t>(depth) * slots, 0.0);
  active.assign(static_cast<size_t>(depth) * groups(), 0);
}

}  // namespace ty::blocking

/// \file recorder_gather.cpp
/// \brief The recorders' reads of other ranks' rows over P ranks (recorder_gather.h): which
/// nodes and rows, and their gather before each step's record().
#include <algorithm>
#include <cstring>
#include <utility>

#include "solver/parallel/recorder_gather.h"
#include "solver/simulation.h"

namespace ty {

namespace {
std::vector<int> sorted(std::vector<int> v) {
  std::sort(v.begin(), v.end());
  v.erase(std::unique(v.begin(), v.end()), v.end());
  return v;
}

/// Bytes of `rows` (sorted) per rank, `per_row` each.
std::vector<int> row_bytes(const std::vector<int>& rows, int ny, int P, int per_row) {
  std::vector<int> c(P, 0);
  for (int j : rows) c[parallel::row_owner(j, ny, P)] += per_row;
  return c;
}
}  // namespace

template <class R>
void Simulation<R>::build_recorder_gather() {
  parallel::RecorderGather<R>& X = rgather_;
  const long s = g_.stride;
  // the every-step recorders' nodes: each point stencil's four (row = index / stride - 1)
  std::vector<std::pair<int, std::pair<int, long>>> nodes;  // (row, (component, index))
  auto add = [&](const PointStencil& p, int c) {
    for (long id : p.index) nodes.push_back({static_cast<int>(id / s) - 1, {c, id}});
  };
  for (const auto& p : probes_) {
    for (int c = 0; c < 6; ++c) add(p.stencil[c], c);
    for (const auto& l : p.line)
      for (int c = 0; c < 6; ++c) add(l[c], c);
  }
  for (const auto& fl : power_spectra_)
    for (const auto& st : fl.stencil)
      for (int c = 0; c < 6; ++c) add(st[c], c);
  std::sort(nodes.begin(), nodes.end());
  nodes.erase(std::unique(nodes.begin(), nodes.end()), nodes.end());
  X.node_counts.assign(ranks_, 0);
  for (const auto& [j, n] : nodes) {
    X.node_comp.push_back(n.first), X.node_index.push_back(n.second);
    X.node_counts[parallel::row_owner(j, g_.ny, ranks_)] += static_cast<int>(sizeof(R));
  }
  X.node_buf.assign(nodes.size(), R(0));
  for (const auto& p : probes_)  // a magnetic probe's cells (gather_recorder_cells)
    for (long c : p.cells)
      if (c >= 0) X.cell_rows.push_back(mag_.cj[c]);
  X.cell_rows = sorted(X.cell_rows);
  // Each rank sums its own rows of every map (map_rows) and takes its own rows of the
  // snapshots (snapshots.h, FrameRows); both average to the Ez nodes (node_average.h), which
  // reads the row below: each cut's lower row is gathered on the steps a map samples, and on
  // a Poynting frame's step and the step before (E kept).
  for (auto& m : maps_) map_rows(m, rank_, ranks_, m.b0, m.b1);
  bool averages = false;
  for (const auto& f : snaps_.plan.fields) averages = averages || f.poynting();
  std::vector<int> rows;
  if (averages || !maps_.empty())
    for (int r = 0; r + 1 < ranks_; ++r) {
      int lo, hi;
      parallel::slab_rows(g_.ny, r, ranks_, lo, hi);
      rows.push_back(hi - 1);
    }
  if (averages) {
    for (long k : snaps_.plan.steps) X.frame_steps.push_back(k), X.frame_steps.push_back(k - 1);
    std::sort(X.frame_steps.begin(), X.frame_steps.end());
  }
  const int per_row = static_cast<int>(6 * s * sizeof(R));
  X.frame_rows = sorted(rows);
  X.frame_counts = row_bytes(X.frame_rows, g_.ny, ranks_, per_row);
  X.row_buf.assign(X.frame_rows.size() * 6 * s, R(0));
  for (const auto& m : maps_) {  // each frequency's points, a block per rank in rank order (gather_maps)
    std::vector<int> c(ranks_, 0);
    for (int r = 0; r < ranks_; ++r) {
      int b0, b1;
      map_rows(m, r, ranks_, b0, b1);
      c[r] = static_cast<int>((b1 - b0) * static_cast<long>(m.ni) * 6 * sizeof(std::complex<double>));
    }
    X.map_counts.push_back(c);
  }
  bytes_ += (X.row_buf.size() + X.node_buf.size()) * sizeof(R) + X.node_index.size() * (sizeof(long) + sizeof(int));
}

template <class R>
void Simulation<R>::map_rows(const SpectralMap& m, int r, int P, int& b0, int& b1) const {
  b0 = m.nj, b1 = m.nj;  // none
  for (int b = 0; b < m.nj; ++b)
    if (parallel::row_owner(m.j0 + b * m.stride, g_.ny, P) == r) b0 = std::min(b0, b), b1 = b + 1;
  if (b0 == m.nj) b0 = b1 = 0;
}

template <class R>
void Simulation<R>::gather_maps() {
  for (size_t q = 0; q < maps_.size(); ++q) {
    SpectralMap& m = maps_[q];
    const size_t np = static_cast<size_t>(m.ni) * m.nj;
    // onto rank 0, which writes them (run_folder.cpp); the others keep their own rows
    for (size_t f = 0; f < m.freq.size(); ++f)
      parallel::gather_bytes_to_root(m.acc.data() + f * np * 6, rgather_.map_counts[q]);
    if (rank_ == 0) m.b0 = 0, m.b1 = m.nj;
  }
}

template <class R>
void Simulation<R>::gather_for_recorders(long k) {
  const parallel::RecorderGather<R>& X = rgather_;
  bool rows = std::binary_search(X.frame_steps.begin(), X.frame_steps.end(), k);
  for (const auto& m : maps_) rows = rows || m.samples(k, total_steps_);
  if (rows) gather_rows(X.frame_rows, X.frame_counts);
  gather_nodes();
  gather_recorder_cells();
}

template <class R>
void Simulation<R>::gather_nodes() {
  parallel::RecorderGather<R>& X = rgather_;
  if (X.node_index.empty()) return;
  // nodes are sorted by row and slabs ascend with rank, so each rank's nodes are one block in order
  long first = 0;
  for (int r = 0; r < rank_; ++r) first += X.node_counts[r] / static_cast<long>(sizeof(R));
  const long last = first + X.node_counts[rank_] / static_cast<long>(sizeof(R));
  for (long q = first; q < last; ++q) X.node_buf[q] = f_[X.node_comp[q]][X.node_index[q]];
  parallel::allgather_bytes(X.node_buf.data(), X.node_counts);
  const long n = static_cast<long>(X.node_index.size());
  for (long q = 0; q < n; ++q)
    if (q < first || q >= last) f_[X.node_comp[q]][X.node_index[q]] = X.node_buf[q];
}

template <class R>
void Simulation<R>::gather_rows(const std::vector<int>& rows, const std::vector<int>& counts) {
  if (rows.empty()) return;
  const long s = g_.stride;
  const auto mine = [&](int j) { return parallel::row_owner(j, g_.ny, ranks_) == rank_; };  // as row_bytes counts them
  R* buf = rgather_.row_buf.data();
  size_t at = 0;
  for (int j : rows) {
    if (mine(j))
      for (int c = 0; c < 6; ++c) std::memcpy(buf + at + c * s, f_[c].data() + g_.row_begin(j), s * sizeof(R));
    at += 6 * s;
  }
  // rows are sorted and slabs ascend with rank, so each rank's rows are one block in order
  parallel::allgather_bytes(buf, counts);
  at = 0;
  for (int j : rows) {
    if (!mine(j))
      for (int c = 0; c < 6; ++c) std::memcpy(f_[c].data() + g_.row_begin(j), buf + at + c * s, s * sizeof(R));
    at += 6 * s;
  }
}

#define TY_RECORDER_GATHER(R)                              \
  template void Simulation<R>::build_recorder_gather();    \
  template void Simulation<R>::map_rows(const SpectralMap&, int, int, int&, int&) const; \
  template void Simulation<R>::gather_maps();              \
  template void Simulation<R>::gather_for_recorders(long); \
  template void Simulation<R>::gather_nodes();             \
  template void Simulation<R>::gather_rows(const std::vector<int>&, const std::vector<int>&);
TY_RECORDER_GATHER(float)
TY_RECORDER_GATHER(double)
#undef TY_RECORDER_GATHER

}  // namespace ty

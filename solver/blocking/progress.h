/// \file progress.h
/// \brief What a Simulation holds for temporal blocking (wavefront.h): the per-step row
/// counters of a block, and the depth a scene may use with the reason.
#pragma once
#include <atomic>
#include <cstddef>
#include <memory>
#include <string>

namespace ty::blocking {

/// The per-step row counters of one block (allocated once, outside the time loop).
class Progress {
 public:
  void resize(int depth) {
    done_ = std::make_unique<std::atomic<int>[]>(static_cast<std::size_t>(depth));
    n_ = depth;
  }
  int size() const { return n_; }
  void reset(int depth) {
    for (int t = 0; t < depth; ++t) done_[t].store(0, std::memory_order_relaxed);
  }
  void finished(int t, int rows) { done_[t].store(rows, std::memory_order_release); }
  /// Waits until step t has finished `rows` rows; spins briefly, then yields the core (a
  /// partner thread may not be running on a shared machine: solver/threads/wait_policy.h).
  void wait(int t, int rows, int& seen) const;

 private:
  std::unique_ptr<std::atomic<int>[]> done_;
  int n_ = 0;
};

/// The depth a scene may use and why: 1 with the reason when something in it reaches
/// across rows or steps outside the row's own work.
struct DepthChoice {
  int depth = 1;
  std::string why;
};

/// Depth `auto` on a grid of nx columns, `bytes` per value: deep enough to reuse each row
/// several times, shallow enough that the band of rows (skew * depth + 2 rows of six
/// arrays, plus extra_row_bytes a row: the magnetic cells' state) stays within `cache` bytes;
/// at most `most`.
int auto_depth(int nx, int ny, std::size_t bytes, std::size_t cache, int skew, std::size_t extra_row_bytes = 0,
               int most = 16);
/// The last-level cache the CPU reports (sysconf), bytes; 0 where it does not say.
std::size_t last_level_cache();
/// The bytes a block's band of rows may take: a quarter of the last-level cache, at least
/// 2 MiB (two cores' L2 here) and at most 16 MiB, or 32 MiB for a grid larger than that cache
/// (past_cache); 2 MiB where the CPU does not say (docs/performance.md, "The band's budget"
/// and "One loop for H and E": measured).
std::size_t band_bytes(bool past_cache = false);

}  // namespace ty::blocking

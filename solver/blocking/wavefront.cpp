/// \file wavefront.cpp
/// \brief The wavefront's wait and its depth `auto` (wavefront.h).
#include "solver/blocking/wavefront.h"

#include <thread>

namespace ty::blocking {

void Progress::wait(int t, int rows, int& seen) const {
  if (seen >= rows) return;
  for (int spins = 0;; ++spins) {
    seen = done_[t].load(std::memory_order_acquire);
    if (seen >= rows) return;
    if (spins > 2000) std::this_thread::yield();  // the partner may be off its core
  }
}

int auto_depth(int nx, int ny, std::size_t bytes, std::size_t cache, int skew, std::size_t extra_row_bytes) {
  const std::size_t row = 6 * static_cast<std::size_t>(nx + 2) * bytes + extra_row_bytes;
  int depth = 1;
  // the band a block keeps warm: skew * depth + 2 rows of the six arrays
  while (depth < 16 && static_cast<std::size_t>(skew * 2 * depth + 2) * row <= cache) depth *= 2;  // the doubled depth's band
  return std::max(1, std::min(depth, ny));
}

}  // namespace ty::blocking

/// \file wavefront.cpp
/// \brief The wavefront's wait and its depth `auto` (wavefront.h).
#include "solver/blocking/wavefront.h"

#include <unistd.h>

#include <algorithm>
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

std::size_t last_level_cache() {
  // glibc's sysconf reads the cache sizes from the CPU; 0 or -1 where it cannot tell
  const long l3 = sysconf(_SC_LEVEL3_CACHE_SIZE);
  return l3 > 0 ? static_cast<std::size_t>(l3) : 0;
}

std::size_t band_bytes(bool past_cache) {
  const std::size_t l3 = last_level_cache();
  const std::size_t floor = std::size_t(2) << 20, ceiling = std::size_t(past_cache ? 32 : 16) << 20;
  if (l3 == 0) return floor;
  return std::clamp(l3 / 4, floor, ceiling);
}

int auto_depth(int nx, int ny, std::size_t bytes, std::size_t cache, int skew, std::size_t extra_row_bytes,
               int most) {
  const std::size_t row = 6 * static_cast<std::size_t>(nx + 2) * bytes + extra_row_bytes;
  int depth = 1;
  // the band a block keeps warm: skew * depth + 2 rows of the six arrays
  while (depth < most && static_cast<std::size_t>(skew * 2 * depth + 2) * row <= cache) depth *= 2;  // the doubled depth's band
  return std::max(1, std::min({depth, most, ny}));  // doubling may pass a `most` that is no power of two
}

}  // namespace ty::blocking

/// \file test_aligned.cpp
/// \brief The mapped arrays of solver/grid/aligned.h: zero until written, 64-byte aligned,
/// values kept when a MappedVector grows, and pages resident only where written (the
/// kernel's anonymous mappings: pages are allocated on first write, mmap(2) and mincore(2),
/// Linux man-pages).
#include <doctest/doctest.h>
#include <sys/mman.h>
#include <unistd.h>

#include <cstdint>

#include "solver/grid/aligned.h"

using namespace ty;

namespace {
/// Resident pages of [p, p + bytes) (mincore), -1 if the call fails.
long resident_pages(const void* p, std::size_t bytes) {
  const long page = sysconf(_SC_PAGESIZE);
  const std::size_t n = (bytes + page - 1) / page;
  std::vector<unsigned char> v(n);
  if (mincore(const_cast<void*>(p), n * page, v.data()) != 0) return -1;
  long r = 0;
  for (unsigned char c : v) r += c & 1;
  return r;
}
}  // namespace

TEST_CASE("a MappedVector resized is zero, aligned, and keeps its values as it grows") {
  for (std::size_t n : {std::size_t(5), std::size_t(1) << 18}) {  // heap and mapped
    MappedVector<double> v;
    v.resize(n);
    CHECK(reinterpret_cast<std::uintptr_t>(v.data()) % 64 == 0);
    bool zero = true;
    for (double x : v) zero = zero && x == 0.0;
    CHECK(zero);
    v[n - 1] = 3.5, v[0] = -1;
    v.resize(2 * n);  // a new block: the values copied, the rest zero
    CHECK(v[0] == -1);
    CHECK(v[n - 1] == 3.5);
    CHECK(v[2 * n - 1] == 0.0);
  }
}

TEST_CASE("a large MappedVector is resident only where written (what divides the cells' state over ranks)") {
  if (aligned::kSanitized) return;  // the sanitizer build takes every array from the heap
  const std::size_t n = std::size_t(1) << 21;  // 16 MiB of doubles, 4096 pages
  MappedVector<double> v;
  v.resize(n);
  const long before = resident_pages(v.data(), n * sizeof(double));
  REQUIRE(before >= 0);
  CHECK(before < 16);  // resize wrote nothing
  for (std::size_t k = 0; k < n / 8; ++k) v[k] = 1.0;  // an eighth: 512 pages
  const long after = resident_pages(v.data(), n * sizeof(double));
  CHECK(after >= 512);
  CHECK(after < 2048);  // under half of 4096, with room for transparent huge pages (2 MiB each) at both ends
}

/// \file aligned.h
/// \brief A fixed-size, 64-byte-aligned, zero-initialised array for field storage.
///
/// A large array (1 MiB and more) is mapped from the kernel's zero pages (anonymous mmap),
/// so a page becomes resident only when first written: over MPI ranks (docs/parallel.md)
/// each rank writes only its own rows of the whole-grid arrays, and its resident memory is
/// those rows, not the grid; in one process each thread first touches its own rows (the
/// pages land on its memory node on a multi-socket machine). Small arrays, and every array
/// in the address-sanitizer build (whose checks see heap blocks only), come from the heap.
#pragma once
#include <sys/mman.h>

#include <algorithm>
#include <cstddef>
#include <cstdlib>
#include <cstring>
#include <new>
#include <utility>

namespace ty {

template <class T>
class AlignedArray {
 public:
  AlignedArray() = default;
  explicit AlignedArray(std::size_t n) { resize(n); }
  AlignedArray(const AlignedArray&) = delete;
  AlignedArray& operator=(const AlignedArray&) = delete;
  AlignedArray(AlignedArray&& o) noexcept : p_(o.p_), n_(o.n_), mapped_(o.mapped_) {
    o.p_ = nullptr, o.n_ = 0, o.mapped_ = 0;
  }
  AlignedArray& operator=(AlignedArray&& o) noexcept {
    std::swap(p_, o.p_);
    std::swap(n_, o.n_);
    std::swap(mapped_, o.mapped_);
    return *this;
  }
  ~AlignedArray() { release(); }

  void resize(std::size_t n) {
    release();
    const std::size_t bytes = std::max<std::size_t>(64, ((n * sizeof(T) + 63) / 64) * 64);
    if (bytes >= kMapAt && !kSanitized) {
      void* m = mmap(nullptr, bytes, PROT_READ | PROT_WRITE, MAP_PRIVATE | MAP_ANONYMOUS, -1, 0);
      if (m == MAP_FAILED) throw std::bad_alloc();
      p_ = static_cast<T*>(m), mapped_ = bytes;  // page-aligned, and zero until written
    } else {
      p_ = static_cast<T*>(std::aligned_alloc(64, bytes));
      if (!p_) throw std::bad_alloc();
      std::memset(static_cast<void*>(p_), 0, bytes);
    }
    n_ = n;
  }
  T* data() { return p_; }
  const T* data() const { return p_; }
  std::size_t size() const { return n_; }
  T& operator[](std::size_t k) { return p_[k]; }
  const T& operator[](std::size_t k) const { return p_[k]; }

 private:
  static constexpr std::size_t kMapAt = std::size_t(1) << 20;
#if defined(__SANITIZE_ADDRESS__)
  static constexpr bool kSanitized = true;
#elif defined(__has_feature)
#if __has_feature(address_sanitizer)
  static constexpr bool kSanitized = true;
#else
  static constexpr bool kSanitized = false;
#endif
#else
  static constexpr bool kSanitized = false;
#endif

  void release() {
    if (mapped_)
      munmap(p_, mapped_);
    else
      std::free(p_);
    p_ = nullptr, n_ = 0, mapped_ = 0;
  }

  T* p_ = nullptr;
  std::size_t n_ = 0;
  std::size_t mapped_ = 0;  ///< bytes mapped (0: from the heap)
};

}  // namespace ty

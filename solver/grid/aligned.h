/// \file aligned.h
/// \brief A fixed-size, 64-byte-aligned, zero-initialised array for field storage.
///
/// A large array (1 MiB and more) is mapped from the kernel's zero pages (anonymous mmap),
/// so a page becomes resident only when first written: over MPI ranks (docs/parallel.md)
/// each rank writes only its own rows of the whole-grid arrays, and its resident memory is
/// those rows, not the grid; in one process each thread first touches its own rows (the
/// pages land on its memory node on a multi-socket machine). Small arrays, and every array
/// in the address-sanitizer build (whose checks see heap blocks only), come from the heap.
///
/// Mapped arrays ask for transparent huge pages (madvise MADV_HUGEPAGE; Linux's default
/// policy gives them only where asked). A sweep walks some twenty arrays at once, a row at a
/// time, and with 4 KiB pages every row of every array is a new page for the TLB: 2 MiB pages
/// made `bench --case vacuum` 1.05x faster at 1024^2 and 1.03x at 4096^2 (medians of 7
/// alternating pairs, docs/performance.md). Over MPI ranks the hint is off (parallel::Session): a huge
/// page makes 2 MiB resident where one row is written, which would blur the division of
/// memory by rows.
#pragma once
#include <sys/mman.h>

#include <algorithm>
#include <complex>
#include <cstddef>
#include <cstdlib>
#include <cstring>
#include <new>
#include <type_traits>
#include <utility>
#include <vector>

namespace ty {

namespace aligned {
inline constexpr std::size_t kMapAt = std::size_t(1) << 20;  ///< bytes from which an array is mapped
#if defined(__SANITIZE_ADDRESS__)
inline constexpr bool kSanitized = true;
#elif defined(__has_feature)
#if __has_feature(address_sanitizer)
inline constexpr bool kSanitized = true;
#else
inline constexpr bool kSanitized = false;
#endif
#else
inline constexpr bool kSanitized = false;
#endif
/// Bytes for n values rounded up to whole 64-byte lines, and whether they are mapped.
inline std::size_t bytes_for(std::size_t n, std::size_t size) {
  return std::max<std::size_t>(64, ((n * size + 63) / 64) * 64);
}
inline bool mapped(std::size_t bytes) { return bytes >= kMapAt && !kSanitized; }
/// Whether mapped arrays ask for huge pages (see above); set before any array is made.
inline bool huge_pages = true;
/// Zero bytes, 64-byte aligned: mapped zero pages, or from the heap and cleared.
inline void* take(std::size_t bytes) {
  if (mapped(bytes)) {
    void* m = mmap(nullptr, bytes, PROT_READ | PROT_WRITE, MAP_PRIVATE | MAP_ANONYMOUS, -1, 0);
    if (m == MAP_FAILED) throw std::bad_alloc();
    if (huge_pages) madvise(m, bytes, MADV_HUGEPAGE);  // a hint: ignored where unsupported
    return m;  // page-aligned, and zero until written
  }
  void* p = std::aligned_alloc(64, bytes);
  if (!p) throw std::bad_alloc();
  std::memset(p, 0, bytes);
  return p;
}
inline void give(void* p, std::size_t bytes) {
  if (!p) return;
  if (mapped(bytes))
    munmap(p, bytes);
  else
    std::free(p);
}
}  // namespace aligned

/// An allocator for std::vector whose storage comes zeroed from aligned::take and whose
/// elements are default-initialised (no store): resize(n) of a MappedVector<double> leaves
/// the pages unwritten, so over MPI ranks a cell list sized for the whole grid is resident
/// only where a rank writes it (its rows' cells and the row beyond each side).
template <class U>
struct is_complex : std::false_type {};
template <class U>
struct is_complex<std::complex<U>> : std::true_type {};

template <class T>
struct MappedAllocator {
  using value_type = T;
  MappedAllocator() = default;
  template <class U>
  MappedAllocator(const MappedAllocator<U>&) {}  // NOLINT: converting, as std::allocator
  T* allocate(std::size_t n) { return static_cast<T*>(aligned::take(aligned::bytes_for(n, sizeof(T)))); }
  void deallocate(T* p, std::size_t n) { aligned::give(p, aligned::bytes_for(n, sizeof(T))); }
  template <class U>
  void construct(U* p) {
    // default-initialised: the zero the storage came with (a complex's constructor would
    // store its zero; all-zero bytes are 0 + 0i, and the storage is zero)
    if constexpr (!is_complex<U>::value) ::new (static_cast<void*>(p)) U;
  }
  template <class U, class... A>
  void construct(U* p, A&&... a) {
    ::new (static_cast<void*>(p)) U(std::forward<A>(a)...);
  }
  template <class U>
  bool operator==(const MappedAllocator<U>&) const {
    return true;
  }
};
template <class T>
using MappedVector = std::vector<T, MappedAllocator<T>>;

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
    const std::size_t bytes = aligned::bytes_for(n, sizeof(T));
    p_ = static_cast<T*>(aligned::take(bytes));
    mapped_ = bytes;
    n_ = n;
  }
  T* data() { return p_; }
  const T* data() const { return p_; }
  std::size_t size() const { return n_; }
  T& operator[](std::size_t k) { return p_[k]; }
  const T& operator[](std::size_t k) const { return p_[k]; }

 private:
  void release() {
    aligned::give(p_, mapped_);
    p_ = nullptr, n_ = 0, mapped_ = 0;
  }

  T* p_ = nullptr;
  std::size_t n_ = 0;
  std::size_t mapped_ = 0;  ///< bytes taken (aligned::take)
};

}  // namespace ty

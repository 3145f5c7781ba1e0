/// \file aligned.h
/// \brief A fixed-size, 64-byte-aligned, zero-initialised array for field storage.
#pragma once
#include <cstddef>
#include <cstdlib>
#include <cstring>
#include <new>

namespace ty {

template <class T>
class AlignedArray {
 public:
  AlignedArray() = default;
  explicit AlignedArray(std::size_t n) { resize(n); }
  AlignedArray(const AlignedArray&) = delete;
  AlignedArray& operator=(const AlignedArray&) = delete;
  AlignedArray(AlignedArray&& o) noexcept : p_(o.p_), n_(o.n_) { o.p_ = nullptr, o.n_ = 0; }
  AlignedArray& operator=(AlignedArray&& o) noexcept {
    std::swap(p_, o.p_);
    std::swap(n_, o.n_);
    return *this;
  }
  ~AlignedArray() { std::free(p_); }

  void resize(std::size_t n) {
    std::free(p_);
    const std::size_t bytes = ((n * sizeof(T) + 63) / 64) * 64;
    p_ = static_cast<T*>(std::aligned_alloc(64, bytes == 0 ? 64 : bytes));
    if (!p_) throw std::bad_alloc();
    std::memset(static_cast<void*>(p_), 0, bytes == 0 ? 64 : bytes);
    n_ = n;
  }
  T* data() { return p_; }
  const T* data() const { return p_; }
  std::size_t size() const { return n_; }
  T& operator[](std::size_t k) { return p_[k]; }
  const T& operator[](std::size_t k) const { return p_[k]; }

 private:
  T* p_ = nullptr;
  std::size_t n_ = 0;
};

}  // namespace ty

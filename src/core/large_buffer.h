// Large buffers (grids, FFT fields, scratch): one allocation path that takes fresh pages from the
// kernel (already zero: no separate zero-fill pass) and advises them into transparent huge pages.
// Inputs: an element count; output: an owning, 64-byte aligned array. Cost O(1) until first touch.
// Method: anonymous mmap + madvise(MADV_HUGEPAGE) (Linux); aligned_alloc + clear when small.
#pragma once

#include <cstddef>
#include <memory>
#include <utility>

namespace cuspmap {

/// Advises the 2 MiB-aligned interior of [data, data + bytes) into transparent huge pages
/// (advisory only; nothing changes where the kernel does not support it). A fresh 256 MB buffer
/// then takes 128 first-touch page faults instead of 65,536.
void advise_huge_pages(void* data, std::size_t bytes);

/// Releases memory from allocate_zeroed_bytes.
struct LargeBufferFree {
  std::size_t bytes = 0;  ///< the size it was allocated with
  void operator()(void* p) const;
};

/// A large buffer's memory, untyped: what one finished buffer hands to the next.
using LargeBytes = std::unique_ptr<void, LargeBufferFree>;

/// `bytes` of zeroed memory, aligned to 64 bytes (whole huge pages and no zero-fill pass when
/// large, aligned_alloc and a clear when small).
/// @throws std::bad_alloc when the system has no memory for it
LargeBytes allocate_zeroed_bytes(std::size_t bytes);

/// `bytes` of memory built from `spent` (a finished buffer, may be empty), whose pages the
/// kernel already holds: resized in place or moved (mremap). The first `*stale_bytes` bytes
/// keep the old values (the caller clears what it needs; memset of held pages is 10-50x cheaper
/// per byte than first-touch faults of fresh ones on these machines, docs/performance.md
/// "Fourth pass"); the rest is zero. Fresh zeroed memory (stale 0) when either is small.
/// @throws std::bad_alloc when the system has no memory for it
LargeBytes reuse_bytes(LargeBytes spent, std::size_t bytes, std::size_t* stale_bytes);

/// An owning array of `count` T, every element zero unless built from spent memory (T must be
/// trivial: float, double...).
template <class T>
class LargeBuffer {
 public:
  LargeBuffer() = default;
  explicit LargeBuffer(std::size_t count)
      : mem_(allocate_zeroed_bytes(count * sizeof(T))), count_(count) {}
  /// `count` elements in the memory of a finished buffer (reuse_bytes): the first
  /// `*stale_count` hold old values, the rest are zero.
  LargeBuffer(std::size_t count, LargeBytes spent, std::size_t* stale_count)
      : count_(count) {
    std::size_t stale_bytes = 0;
    mem_ = reuse_bytes(std::move(spent), count * sizeof(T), &stale_bytes);
    *stale_count = (stale_bytes + sizeof(T) - 1) / sizeof(T);
  }
  /// Hands the memory on (this buffer is empty afterwards).
  LargeBytes release() && {
    count_ = 0;
    return std::move(mem_);
  }
  T* data() { return static_cast<T*>(mem_.get()); }
  const T* data() const { return static_cast<const T*>(mem_.get()); }
  std::size_t size() const { return count_; }
  T& operator[](std::size_t k) { return data()[k]; }
  const T& operator[](std::size_t k) const { return data()[k]; }

 private:
  LargeBytes mem_;
  std::size_t count_ = 0;
};

}  // namespace cuspmap

// Large zeroed buffers from fresh kernel pages, advised into transparent huge pages.
// Inputs: a byte count; output: 64-byte aligned zeroed memory. Cost O(1) until first touch.
// Method: anonymous mmap (pages arrive zero-filled) + madvise(MADV_HUGEPAGE), Linux man-pages.
#include "core/large_buffer.h"

#include <sys/mman.h>

#include <algorithm>
#include <cstdint>
#include <cstdlib>
#include <cstring>
#include <new>

namespace cuspmap {
namespace {

constexpr std::uintptr_t kHugePageBytes = std::uintptr_t{2} << 20;
// Below one huge page, mmap would round a small buffer up to whole pages: calloc instead.
constexpr std::size_t kMapThresholdBytes = kHugePageBytes;

#if defined(__linux__) && defined(MREMAP_MAYMOVE) && defined(MREMAP_FIXED)
// Moves a mapping to a 2 MiB-aligned range of `bytes` (mremap): its huge pages move whole (page
// table entries, no copy); at an address the kernel chooses they would be split into 4 KiB
// pages, and the column passes of the transforms, which stride across rows, then miss the TLB
// (measured: the 48 M-cell texture report slower than with fresh memory). MAP_FAILED on failure.
void* grow_aligned(void* old, std::size_t old_bytes, std::size_t bytes) {
  const std::size_t span = bytes + kHugePageBytes;
  void* reserve = mmap(nullptr, span, PROT_NONE, MAP_PRIVATE | MAP_ANONYMOUS | MAP_NORESERVE, -1, 0);
  if (reserve == MAP_FAILED) return MAP_FAILED;
  const auto lo = reinterpret_cast<std::uintptr_t>(reserve);
  const std::uintptr_t at = (lo + kHugePageBytes - 1) & ~(kHugePageBytes - 1);
  void* p = mremap(old, old_bytes, bytes, MREMAP_MAYMOVE | MREMAP_FIXED, reinterpret_cast<void*>(at));
  if (p == MAP_FAILED) {
    munmap(reserve, span);
    return MAP_FAILED;
  }
  // The reservation's head and tail around the moved mapping are given back.
  if (at > lo) munmap(reserve, at - lo);
  if (lo + span > at + bytes) munmap(reinterpret_cast<void*>(at + bytes), lo + span - (at + bytes));
  return p;
}
#endif

}  // namespace

void advise_huge_pages(void* data, std::size_t bytes) {
#if defined(__linux__) && defined(MADV_HUGEPAGE)
  const auto begin = reinterpret_cast<std::uintptr_t>(data);
  const std::uintptr_t lo = (begin + kHugePageBytes - 1) & ~(kHugePageBytes - 1);
  const std::uintptr_t hi = (begin + bytes) & ~(kHugePageBytes - 1);
  if (hi > lo) madvise(reinterpret_cast<void*>(lo), hi - lo, MADV_HUGEPAGE);  // advisory only
#else
  (void)data;
  (void)bytes;
#endif
}

void LargeBufferFree::operator()(void* p) const {
#if defined(__linux__)
  if (bytes >= kMapThresholdBytes) {
    munmap(p, bytes);
    return;
  }
#endif
  std::free(p);
}

LargeBytes allocate_zeroed_bytes(std::size_t bytes) {
#if defined(__linux__)
  if (bytes >= kMapThresholdBytes) {
    // mmap returns page-aligned memory; the kernel aligns large anonymous maps to 2 MiB when
    // transparent huge pages are on, so the advice covers (nearly) all of it.
    void* p = mmap(nullptr, bytes, PROT_READ | PROT_WRITE, MAP_PRIVATE | MAP_ANONYMOUS, -1, 0);
    if (p == MAP_FAILED) throw std::bad_alloc();
    advise_huge_pages(p, bytes);
    return LargeBytes(p, LargeBufferFree{bytes});
  }
#endif
  // Small buffers: aligned_alloc (64 bytes for SIMD loads) and a clear, cheap at this size.
  const std::size_t rounded = (bytes + 63) / 64 * 64;
  void* p = std::aligned_alloc(64, rounded == 0 ? 64 : rounded);
  if (p == nullptr) throw std::bad_alloc();
  std::memset(p, 0, rounded == 0 ? 64 : rounded);
  return LargeBytes(p, LargeBufferFree{0});
}

LargeBytes reuse_bytes(LargeBytes spent, std::size_t bytes, std::size_t* stale_bytes) {
  *stale_bytes = 0;
#if defined(__linux__) && defined(MREMAP_MAYMOVE)
  const std::size_t old_bytes = spent ? spent.get_deleter().bytes : 0;
  if (old_bytes >= kMapThresholdBytes && bytes >= kMapThresholdBytes) {
    void* p = bytes <= old_bytes ? mremap(spent.get(), old_bytes, bytes, 0)  // shrinks in place
                                 : grow_aligned(spent.get(), old_bytes, bytes);
    if (p != MAP_FAILED) {
      (void)spent.release();  // the mapping now lives at p with the new size
      // The kept part holds the old values; a grown part arrives zero from the kernel.
      *stale_bytes = std::min(old_bytes, bytes);
      advise_huge_pages(p, bytes);
      return LargeBytes(p, LargeBufferFree{bytes});
    }
  }
#endif
  spent.reset();  // given back first, so the fresh memory does not add to it
  return allocate_zeroed_bytes(bytes);
}

}  // namespace cuspmap

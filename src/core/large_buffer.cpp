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

#if defined(__linux__)
// `bytes` of anonymous memory (readable and writable when `prot` says so) starting on a 2 MiB
// boundary: a larger range is mapped and its head and tail given back. The kernel aligns only
// anonymous maps whose length is a multiple of 2 MiB, and an unaligned buffer's ends take
// 4 KiB pages (a fault each). MAP_FAILED on failure.
void* map_aligned(std::size_t bytes, int prot) {
  const std::size_t span = bytes + kHugePageBytes;
  // A range only to be moved into is not charged against the commit limit; a buffer is.
  const int flags = MAP_PRIVATE | MAP_ANONYMOUS | (prot == PROT_NONE ? MAP_NORESERVE : 0);
  void* reserve = mmap(nullptr, span, prot, flags, -1, 0);
  if (reserve == MAP_FAILED) return MAP_FAILED;
  const auto lo = reinterpret_cast<std::uintptr_t>(reserve);
  const std::uintptr_t at = (lo + kHugePageBytes - 1) & ~(kHugePageBytes - 1);
  if (at > lo) munmap(reserve, at - lo);
  const std::uintptr_t end = at + (bytes + 4095) / 4096 * 4096;  // munmap needs a page boundary
  if (lo + span > end) munmap(reinterpret_cast<void*>(end), lo + span - end);
  return reinterpret_cast<void*>(at);
}
#endif

#if defined(__linux__) && defined(MREMAP_MAYMOVE) && defined(MREMAP_FIXED)
// Moves a mapping to a 2 MiB-aligned range of `bytes` (mremap): its huge pages move whole (page
// table entries, no copy); at an address the kernel chooses they would be split into 4 KiB
// pages, and the column passes of the transforms, which stride across rows, then miss the TLB
// (measured: the 48 M-cell texture report slower than with fresh memory). MAP_FAILED on failure.
void* grow_aligned(void* old, std::size_t old_bytes, std::size_t bytes) {
  void* at = map_aligned(bytes, PROT_NONE);  // a range to move into (replaced by the move)
  if (at == MAP_FAILED) return MAP_FAILED;
  void* p = mremap(old, old_bytes, bytes, MREMAP_MAYMOVE | MREMAP_FIXED, at);
  if (p == MAP_FAILED) munmap(at, bytes);
  return p;
}
#endif

#if defined(__linux__)
// Advises a whole mapping (map_aligned or mremap) into huge pages, its last partial 2 MiB
// included: advising only the aligned part would split the mapping into two with different
// flags, and mremap refuses a range spanning two mappings (EFAULT: measured, every reuse of a
// buffer whose size is not a multiple of 2 MiB fell back to fresh, cleared memory).
void advise_mapping(void* p, std::size_t bytes) {
#if defined(MADV_HUGEPAGE)
  constexpr std::size_t kPage = 4096;
  madvise(p, (bytes + kPage - 1) / kPage * kPage, MADV_HUGEPAGE);  // advisory only
#else
  (void)p;
  (void)bytes;
#endif
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
    // On a 2 MiB boundary, so that the advice covers all of it.
    void* p = map_aligned(bytes, PROT_READ | PROT_WRITE);
    if (p == MAP_FAILED) throw std::bad_alloc();
    advise_mapping(p, bytes);
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
      advise_mapping(p, bytes);
      return LargeBytes(p, LargeBufferFree{bytes});
    }
  }
#endif
  spent.reset();  // given back first, so the fresh memory does not add to it
  return allocate_zeroed_bytes(bytes);
}

}  // namespace cuspmap

// Large zeroed buffers from fresh kernel pages, advised into transparent huge pages.
// Inputs: a byte count; output: 64-byte aligned zeroed memory. Cost O(1) until first touch.
// Method: anonymous mmap (pages arrive zero-filled) + madvise(MADV_HUGEPAGE), Linux man-pages.
#include "core/large_buffer.h"

#include <sys/mman.h>

#include <cstdint>
#include <cstdlib>
#include <cstring>
#include <new>

namespace cuspmap {
namespace {

constexpr std::uintptr_t kHugePageBytes = std::uintptr_t{2} << 20;
// Below one huge page, mmap would round a small buffer up to whole pages: calloc instead.
constexpr std::size_t kMapThresholdBytes = kHugePageBytes;

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

std::unique_ptr<void, LargeBufferFree> allocate_zeroed_bytes(std::size_t bytes) {
#if defined(__linux__)
  if (bytes >= kMapThresholdBytes) {
    // mmap returns page-aligned memory; the kernel aligns large anonymous maps to 2 MiB when
    // transparent huge pages are on, so the advice covers (nearly) all of it.
    void* p = mmap(nullptr, bytes, PROT_READ | PROT_WRITE, MAP_PRIVATE | MAP_ANONYMOUS, -1, 0);
    if (p == MAP_FAILED) throw std::bad_alloc();
    advise_huge_pages(p, bytes);
    return std::unique_ptr<void, LargeBufferFree>(p, LargeBufferFree{bytes});
  }
#endif
  // Small buffers: aligned_alloc (64 bytes for SIMD loads) and a clear, cheap at this size.
  const std::size_t rounded = (bytes + 63) / 64 * 64;
  void* p = std::aligned_alloc(64, rounded == 0 ? 64 : rounded);
  if (p == nullptr) throw std::bad_alloc();
  std::memset(p, 0, rounded == 0 ? 64 : rounded);
  return std::unique_ptr<void, LargeBufferFree>(p, LargeBufferFree{0});
}

}  // namespace cuspmap

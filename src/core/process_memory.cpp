// One malloc arena that keeps what it frees, and a heap advised into transparent huge pages.
// Input: none; output: process state (mallopt, sbrk, madvise). Cost: a few system calls.
// Method: glibc mallopt(3) and madvise(2) (Linux man-pages); sizes derived in process_memory.h.
#include "core/process_memory.h"

#include <cstdint>
#include <cstdlib>
#include <vector>

#include "core/large_buffer.h"

#if defined(__GLIBC__)
#include <malloc.h>
#include <unistd.h>
#endif

namespace cuspmap {

void tune_process_memory() {
#if defined(__GLIBC__) && defined(__linux__)
  // One arena: worker threads' buffers come from the same (advised) heap, not from per-thread
  // heaps of 4 KiB pages. The threads allocate only large, short-lived buffers, so there is
  // no lock contention to speak of.
  mallopt(M_ARENA_MAX, 1);
  // Blocks up to 32 MiB (glibc's largest threshold) come from the heap and are reused when
  // freed; the heap is never trimmed during a run (the pages stay for the next buffer).
  constexpr int kMmapThresholdBytes = 32 << 20;
  mallopt(M_MMAP_THRESHOLD, kMmapThresholdBytes);
  mallopt(M_TRIM_THRESHOLD, 1 << 30);
  // Grow the heap by the reservation in blocks below the threshold, give them back to malloc
  // (kept: no trimming), and advise the whole range. Nothing is touched, so nothing is resident.
  void* const start = sbrk(0);
  constexpr std::size_t kBlockBytes = std::size_t{30} << 20;
  std::vector<void*> blocks;
  blocks.reserve(kReservedHeapBytes / kBlockBytes + 1);
  for (std::size_t got = 0; got < kReservedHeapBytes; got += kBlockBytes) {
    void* p = std::malloc(kBlockBytes);
    if (p == nullptr) break;
    blocks.push_back(p);
  }
  for (auto it = blocks.rbegin(); it != blocks.rend(); ++it) std::free(*it);
  void* const end = sbrk(0);
  const auto lo = reinterpret_cast<std::uintptr_t>(start);
  const auto hi = reinterpret_cast<std::uintptr_t>(end);
  if (start != reinterpret_cast<void*>(-1) && hi > lo) {
    advise_huge_pages(start, static_cast<std::size_t>(hi - lo));
  }
#endif
}

}  // namespace cuspmap

// Process-wide memory set-up for short runs over large grids: fewer first-touch page faults.
// Input: none (called once at the start of main, before any thread); output: malloc settings and
// a heap advised into transparent huge pages. Method: glibc mallopt (M_ARENA_MAX, M_MMAP_THRESHOLD,
// M_TRIM_THRESHOLD) and madvise(MADV_HUGEPAGE) (Linux man-pages); measured in docs/performance.md.
#pragma once

#include <cstddef>

namespace cuspmap {

/// Heap reserved (address space only: no page is touched) and advised at start, bytes. Grids and
/// pictures of up to ~10 M cells are carved from it in 2 MiB pages; larger buffers are mapped on
/// their own (glibc's mmap threshold) and advised where they are made (core/large_buffer.h).
inline constexpr std::size_t kReservedHeapBytes = std::size_t{256} << 20;

/// Sets malloc up so that large buffers freed during a run are reused instead of returned to the
/// kernel and faulted in again (one arena, no trimming, mmap only above 32 MiB), grows the heap
/// by kReservedHeapBytes and advises it into huge pages. A 12 mm floor at 10 um then takes
/// ~3 k page faults instead of ~12 k. Does nothing where glibc's malloc is not the allocator
/// (sanitizers) or the advice is not supported.
void tune_process_memory();

}  // namespace cuspmap

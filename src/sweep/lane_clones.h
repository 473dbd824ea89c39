// CUSPMAP_CLONES: marks a row kernel (a plain counted loop over contiguous arrays) to be compiled
// for AVX-512, AVX2 and the x86-64 baseline, the loader picking the clone the CPU runs, so a
// portable build still uses the wide units. Off under AddressSanitizer and on other targets.
// Method: GCC/Clang `target_clones` (function multi-versioning through an ifunc resolver).
#pragma once

#if defined(__x86_64__) && (defined(__GNUC__) || defined(__clang__)) && \
    !defined(__SANITIZE_ADDRESS__)
#define CUSPMAP_CLONES __attribute__((target_clones("avx512f", "avx2", "default")))
#else
#define CUSPMAP_CLONES
#endif

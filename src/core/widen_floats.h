// Two consecutive floats widened to a pair of doubles in one SSE2 register (cvtps2pd: each
// float converted exactly, as a scalar double{f} is). Input: a pointer to 2 floats (no alignment
// needed: the 8 bytes are read with movq through a may_alias type); output: __m128d {p[0], p[1]}.
// Method: Intel intrinsics guide (_mm_loadl_epi64, _mm_cvtps_pd); SSE2 builds only.
#pragma once

#if defined(__SSE2__)
#include <emmintrin.h>

namespace cuspmap {

inline __m128d widen_two_floats(const float* p) {
  return _mm_cvtps_pd(_mm_castsi128_ps(_mm_loadl_epi64(reinterpret_cast<const __m128i*>(p))));
}

}  // namespace cuspmap
#endif

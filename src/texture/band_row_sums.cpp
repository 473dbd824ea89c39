// Row kernels of the streamed statistics (see band_row_sums.h): eight double lanes per step
// (GCC/Clang vector extensions, cloned for AVX-512, AVX2 and the baseline and picked at load
// time), unreached cells masked to zero instead of branched over, lanes added in lane order at
// the end of the row. Built with -ffp-contract=off (CMakeLists.txt) so that every clone rounds
// alike. Method: see band_row_sums.h.
#include "texture/band_row_sums.h"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <cstring>

#if defined(__x86_64__) && (defined(__GNUC__) || defined(__clang__)) && \
    !defined(__SANITIZE_ADDRESS__)
#include <immintrin.h>
#define CUSPMAP_CLONES __attribute__((target_clones("avx512f", "avx2", "default")))
#define CUSPMAP_GATHER 1
#define CUSPMAP_INLINE __attribute__((always_inline)) inline
#else
#define CUSPMAP_CLONES
#define CUSPMAP_GATHER 0
#define CUSPMAP_INLINE inline
#endif

namespace cuspmap {
namespace {

constexpr int kLanes = 8;
using Lanes = double __attribute__((vector_size(kLanes * sizeof(double))));
using FloatLanes = float __attribute__((vector_size(kLanes * sizeof(float))));
using IntLanes = std::int32_t __attribute__((vector_size(kLanes * sizeof(std::int32_t))));

// Overview blocks summed side by side: independent running sums hide the addition latency.
constexpr int kBlockChains = 8;

double lane_sum(const Lanes& v) {
  double s = 0.0;
  for (int l = 0; l < kLanes; ++l) s += v[l];
  return s;
}
double lane_min(const FloatLanes& v) {
  double m = v[0];
  for (int l = 1; l < kLanes; ++l) m = std::fmin(m, v[l]);
  return m;
}
double lane_max(const FloatLanes& v) {
  double m = v[0];
  for (int l = 1; l < kLanes; ++l) m = std::fmax(m, v[l]);
  return m;
}
bool any_lane(const IntLanes& v) {
  for (int l = 0; l < kLanes; ++l) {
    if (v[l] != 0) return true;
  }
  return false;
}

// Plane sums and extremes of z[0 .. count), added to `sums`. Masked: NaN cells skipped, n, sx,
// sxx summed per cell. Unmasked (a row's common case): every cell summed, n, sx, sxx left to the
// caller, and false returned (sums untouched) when a cell is NaN.
template <bool kMasked>
CUSPMAP_INLINE bool plane_sums_lanes(const float* z, const double* x_mm, int count,
                                     RowPlaneSums& sums) {
  const Lanes zero = {};
  const Lanes one = zero + 1.0;
  const FloatLanes fzero = {};
  const FloatLanes inf = fzero + std::numeric_limits<float>::infinity();
  Lanes n = zero, sx = zero, sxx = zero, sz = zero, sxz = zero;
  FloatLanes lo = inf, hi = -inf;
  IntLanes nan_seen = {};
  int i = 0;
  for (; i + kLanes <= count; i += kLanes) {
    FloatLanes f;
    std::memcpy(&f, z + i, sizeof f);
    Lanes x;
    std::memcpy(&x, x_mm + i, sizeof x);
    const Lanes v = __builtin_convertvector(f, Lanes);
    if constexpr (kMasked) {
      const auto ok = v == v;  // false for NaN (unreached)
      const Lanes xk = ok ? x : zero, vk = ok ? v : zero;
      n += ok ? one : zero;
      sx += xk;
      sxx += xk * xk;
      sz += vk;
      sxz += xk * vk;
    } else {
      nan_seen |= f != f;
      sz += v;
      sxz += x * v;
    }
    // A NaN is left out by replacing it before the ordered comparisons: those raise the
    // invalid-operation flag on a NaN (IEEE 754-2008 5.11), which traps where it is unmasked
    // (the test runner's debug builds); == and != are quiet.
    const auto finite = f == f;
    const FloatLanes f_lo = finite ? f : inf, f_hi = finite ? f : -inf;
    lo = f_lo < lo ? f_lo : lo;
    hi = f_hi > hi ? f_hi : hi;
  }
  RowPlaneSums r;
  for (; i < count; ++i) {
    const double v = z[i], x = x_mm[i];
    if (std::isnan(v)) {
      if (!kMasked) return false;
      continue;
    }
    if (kMasked) {
      r.n += 1.0;
      r.sx += x;
      r.sxx += x * x;
    }
    r.sz += v;
    r.sxz += x * v;
    r.lo = std::fmin(r.lo, v);
    r.hi = std::fmax(r.hi, v);
  }
  if (!kMasked && any_lane(nan_seen)) return false;
  sums.n += lane_sum(n) + r.n;
  sums.sx += lane_sum(sx) + r.sx;
  sums.sxx += lane_sum(sxx) + r.sxx;
  sums.sz += lane_sum(sz) + r.sz;
  sums.sxz += lane_sum(sxz) + r.sxz;
  sums.lo = std::fmin(sums.lo, std::fmin(lane_min(lo), r.lo));
  sums.hi = std::fmax(sums.hi, std::fmax(lane_max(hi), r.hi));
  return true;
}

// Residual moments of z[0 .. count) about the plane, added to `moments`. Masked: NaN cells
// skipped. Unmasked: false returned (moments untouched) when a cell is NaN.
// sum |r| = 2 sum max(r, 0) - sum r: one maximum per cell instead of an absolute value.
template <bool kMasked>
CUSPMAP_INLINE bool residual_lanes(const float* z, const double* plane_x_um, int count,
                                   double y_part_um, ArealMoments& moments) {
  const Lanes zero = {};
  const Lanes one = zero + 1.0;
  const FloatLanes fzero = {};
  const FloatLanes inf = fzero + std::numeric_limits<float>::infinity();
  Lanes n = zero, sp = zero, s1 = zero, s2 = zero, s3 = zero, s4 = zero;
  FloatLanes lo = inf, hi = -inf;
  IntLanes nan_seen = {};
  int i = 0;
  for (; i + kLanes <= count; i += kLanes) {
    FloatLanes f;
    std::memcpy(&f, z + i, sizeof f);
    Lanes q;
    std::memcpy(&q, plane_x_um + i, sizeof q);
    // Plane::at(x, y) = (z0 + gx (x - x0)) + gy (y - y0), rounded to float as remove_plane does.
    const FloatLanes rf =
        __builtin_convertvector(__builtin_convertvector(f, Lanes) - (q + y_part_um), FloatLanes);
    Lanes r = __builtin_convertvector(rf, Lanes);
    // NaN exactly where the height is; replaced before any ordered comparison (quiet ==, see
    // plane_sums_lanes). Unmasked, a row with a NaN is discarded whatever its sums.
    const auto ok = r == r;
    r = ok ? r : zero;
    const auto rf_ok = rf == rf;
    const FloatLanes rf_lo = rf_ok ? rf : inf, rf_hi = rf_ok ? rf : -inf;
    if constexpr (kMasked) {
      n += ok ? one : zero;
    } else {
      nan_seen |= f != f;
    }
    const Lanes r2 = r * r;
    sp += r > zero ? r : zero;
    s1 += r;
    s2 += r2;
    s3 += r2 * r;
    s4 += r2 * r2;
    lo = rf_lo < lo ? rf_lo : lo;
    hi = rf_hi > hi ? rf_hi : hi;
  }
  ArealMoments m;
  for (int t = i; t < count; ++t) {
    if (std::isnan(z[t])) {
      if (!kMasked) return false;
      continue;
    }
    m.add(static_cast<float>(z[t] - (plane_x_um[t] + y_part_um)));
  }
  if (!kMasked && any_lane(nan_seen)) return false;
  m.count += kMasked ? static_cast<std::int64_t>(lane_sum(n)) : i;
  const double lanes_sum = lane_sum(s1);
  m.sum_abs_um = 2.0 * lane_sum(sp) - lanes_sum + m.sum_abs_um;
  m.sum_um += lanes_sum;
  m.sum_um2 += lane_sum(s2);
  m.sum_um3 += lane_sum(s3);
  m.sum_um4 += lane_sum(s4);
  m.min_um = std::fmin(m.min_um, lane_min(lo));
  m.max_um = std::fmax(m.max_um, lane_max(hi));
  moments.merge(m);
  return true;
}

// The kernels' instances, cloned per instruction set (a template cannot be; the template is
// inlined into each clone and compiled for its target).
CUSPMAP_CLONES bool plane_sums_unmasked(const float* z, const double* x_mm, int count,
                                        RowPlaneSums& sums) {
  return plane_sums_lanes<false>(z, x_mm, count, sums);
}
CUSPMAP_CLONES void plane_sums_masked(const float* z, const double* x_mm, int count,
                                      RowPlaneSums& sums) {
  plane_sums_lanes<true>(z, x_mm, count, sums);
}
CUSPMAP_CLONES bool residual_unmasked(const float* z, const double* plane_x_um, int count,
                                      double y_part_um, ArealMoments& moments) {
  return residual_lanes<false>(z, plane_x_um, count, y_part_um, moments);
}
CUSPMAP_CLONES void residual_masked(const float* z, const double* plane_x_um, int count,
                                    double y_part_um, ArealMoments& moments) {
  residual_lanes<true>(z, plane_x_um, count, y_part_um, moments);
}

// Blocks [0, blocks) of whole k-cell blocks, kBlockChains at a time, the chains side by side;
// returns the blocks done.
int block_sums_chains(const float* z, int blocks, int k, double* sums, int* counts) {
  int b = 0;
  // Each block's cells still added in order: adding +0.0 for a skipped cell leaves a running
  // sum unchanged (it starts at +0.0 and round-to-nearest never makes -0.0 from it), so the
  // sums equal a sequential loop's bit for bit.
  for (; b + kBlockChains <= blocks; b += kBlockChains) {
    double s[kBlockChains];
    int c[kBlockChains];
    for (int g = 0; g < kBlockChains; ++g) {
      s[g] = sums[b + g];
      c[g] = counts[b + g];
    }
    const float* base = z + static_cast<std::int64_t>(b) * k;
    for (int t = 0; t < k; ++t) {
      for (int g = 0; g < kBlockChains; ++g) {
        const float v = base[static_cast<std::int64_t>(g) * k + t];
        const bool ok = std::isfinite(v);  // quiet: no invalid-operation flag on a NaN
        s[g] += ok ? static_cast<double>(v) : 0.0;
        c[g] += ok ? 1 : 0;
      }
    }
    for (int g = 0; g < kBlockChains; ++g) {
      sums[b + g] = s[g];
      counts[b + g] = c[g];
    }
  }
  return b;
}

#if CUSPMAP_GATHER
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic push
// GCC 12's AVX-512 conversion intrinsics start from _mm512_undefined_*: a false positive.
#pragma GCC diagnostic ignored "-Wmaybe-uninitialized"
#endif
// The same chains, 16 blocks at a time in two AVX-512 registers: each block's next 8 cells are
// loaded as one row of an 8 x 8 tile, the tile transposed so that each vector holds one cell of
// each of 8 blocks, then added step by step (a masked add skips a non-finite cell exactly as
// the sequential loop does); the last k % 8 cells of each block are gathered (stride k).
__attribute__((target("avx512f,avx512vl"))) int block_sums_tiles(const float* z, int blocks, int k,
                                                                 double* sums, int* counts) {
  // Cell offsets of 8 neighbouring blocks; the gather indices are 32-bit.
  if (static_cast<std::int64_t>(k) * 16 > std::numeric_limits<int>::max()) return 0;
  const __m256i offsets =
      _mm256_mullo_epi32(_mm256_setr_epi32(0, 1, 2, 3, 4, 5, 6, 7), _mm256_set1_epi32(k));
  const __m256 largest = _mm256_set1_ps(std::numeric_limits<float>::max());
  const __m256 magnitude = _mm256_castsi256_ps(_mm256_set1_epi32(0x7fffffff));
  const __m256i one = _mm256_set1_epi32(1);
  int b = 0;
  for (; b + 16 <= blocks; b += 16) {
    __m512d s[2] = {_mm512_loadu_pd(sums + b), _mm512_loadu_pd(sums + b + 8)};
    __m256i c[2] = {_mm256_loadu_si256(reinterpret_cast<const __m256i*>(counts + b)),
                    _mm256_loadu_si256(reinterpret_cast<const __m256i*>(counts + b + 8))};
    const float* base[2] = {z + static_cast<std::int64_t>(b) * k,
                            z + static_cast<std::int64_t>(b + 8) * k};
#define CUSPMAP_ADD_CELLS(h, cells)                                                             \
  do {                                                                                          \
    const __m256 v_ = (cells);                                                                  \
    const __mmask8 ok_ = _mm256_cmp_ps_mask(_mm256_and_ps(v_, magnitude), largest, _CMP_LE_OQ); \
    s[h] = _mm512_mask_add_pd(s[h], ok_, s[h], _mm512_cvtps_pd(v_));                            \
    c[h] = _mm256_mask_add_epi32(c[h], ok_, c[h], one);                                         \
  } while (false)
    int t = 0;
    for (; t + 8 <= k; t += 8) {
      for (int h = 0; h < 2; ++h) {
        __m256 r[8];
        for (int g = 0; g < 8; ++g)
          r[g] = _mm256_loadu_ps(base[h] + static_cast<std::int64_t>(g) * k + t);
        const __m256 t0 = _mm256_unpacklo_ps(r[0], r[1]), t1 = _mm256_unpackhi_ps(r[0], r[1]);
        const __m256 t2 = _mm256_unpacklo_ps(r[2], r[3]), t3 = _mm256_unpackhi_ps(r[2], r[3]);
        const __m256 t4 = _mm256_unpacklo_ps(r[4], r[5]), t5 = _mm256_unpackhi_ps(r[4], r[5]);
        const __m256 t6 = _mm256_unpacklo_ps(r[6], r[7]), t7 = _mm256_unpackhi_ps(r[6], r[7]);
        const __m256 u0 = _mm256_shuffle_ps(t0, t2, 0x44), u1 = _mm256_shuffle_ps(t0, t2, 0xEE);
        const __m256 u2 = _mm256_shuffle_ps(t1, t3, 0x44), u3 = _mm256_shuffle_ps(t1, t3, 0xEE);
        const __m256 u4 = _mm256_shuffle_ps(t4, t6, 0x44), u5 = _mm256_shuffle_ps(t4, t6, 0xEE);
        const __m256 u6 = _mm256_shuffle_ps(t5, t7, 0x44), u7 = _mm256_shuffle_ps(t5, t7, 0xEE);
        CUSPMAP_ADD_CELLS(h, _mm256_permute2f128_ps(u0, u4, 0x20));  // cell t of each block
        CUSPMAP_ADD_CELLS(h, _mm256_permute2f128_ps(u1, u5, 0x20));
        CUSPMAP_ADD_CELLS(h, _mm256_permute2f128_ps(u2, u6, 0x20));
        CUSPMAP_ADD_CELLS(h, _mm256_permute2f128_ps(u3, u7, 0x20));
        CUSPMAP_ADD_CELLS(h, _mm256_permute2f128_ps(u0, u4, 0x31));
        CUSPMAP_ADD_CELLS(h, _mm256_permute2f128_ps(u1, u5, 0x31));
        CUSPMAP_ADD_CELLS(h, _mm256_permute2f128_ps(u2, u6, 0x31));
        CUSPMAP_ADD_CELLS(h, _mm256_permute2f128_ps(u3, u7, 0x31));  // cell t + 7
      }
    }
    for (; t < k; ++t) {
      for (int h = 0; h < 2; ++h)
        CUSPMAP_ADD_CELLS(h, _mm256_i32gather_ps(base[h] + t, offsets, 4));
    }
#undef CUSPMAP_ADD_CELLS
    _mm512_storeu_pd(sums + b, s[0]);
    _mm512_storeu_pd(sums + b + 8, s[1]);
    _mm256_storeu_si256(reinterpret_cast<__m256i*>(counts + b), c[0]);
    _mm256_storeu_si256(reinterpret_cast<__m256i*>(counts + b + 8), c[1]);
  }
  return b;
}
#if defined(__GNUC__) && !defined(__clang__)
#pragma GCC diagnostic pop
#endif
#endif

}  // namespace

void positions_about(const RowAxis& axis, int count, double* x_mm) {
  for (int i = 0; i < count; ++i)
    x_mm[i] = (axis.origin_mm + (i + 0.5) * axis.cell_mm) - axis.centre_mm;
}

CUSPMAP_CLONES AxisSums axis_sums(const double* x_mm, int count) {
  const Lanes zero = {};
  Lanes sx = zero, sxx = zero;
  int i = 0;
  for (; i + kLanes <= count; i += kLanes) {
    Lanes x;
    std::memcpy(&x, x_mm + i, sizeof x);
    sx += x;
    sxx += x * x;
  }
  AxisSums a;
  a.n = count;
  double tx = 0.0, txx = 0.0;
  for (; i < count; ++i) {
    tx += x_mm[i];
    txx += x_mm[i] * x_mm[i];
  }
  a.sx = lane_sum(sx) + tx;
  a.sxx = lane_sum(sxx) + txx;
  return a;
}

void row_plane_sums(const float* z, const double* x_mm, int count, const AxisSums& all_finite,
                    RowPlaneSums& sums) {
  // Unmasked first; a run with an unreached cell is summed again, masked (rare: edges).
  if (plane_sums_unmasked(z, x_mm, count, sums)) {
    sums.n += all_finite.n;
    sums.sx += all_finite.sx;
    sums.sxx += all_finite.sxx;
    return;
  }
  plane_sums_masked(z, x_mm, count, sums);
}

void row_block_sums(const float* z, int count, int k, double* sums, int* counts) {
  const int whole = count / k;
  int b = 0;
#if CUSPMAP_GATHER
  static const bool tiles = __builtin_cpu_supports("avx512f") && __builtin_cpu_supports("avx512vl");
  if (tiles) b = block_sums_tiles(z, whole, k, sums, counts);
#endif
  b += block_sums_chains(z + static_cast<std::int64_t>(b) * k, whole - b, k, sums + b, counts + b);
  for (; static_cast<std::int64_t>(b) * k < count; ++b) {  // the rest, one block at a time
    double s = sums[b];
    int c = counts[b];
    const int end = static_cast<int>(std::min<std::int64_t>(count, std::int64_t{b + 1} * k));
    for (int i = b * k; i < end; ++i) {
      const float v = z[i];
      if (!std::isfinite(v)) continue;
      s += v;
      ++c;
    }
    sums[b] = s;
    counts[b] = c;
  }
}

void row_residual_moments(const float* z, const double* plane_x_um, int count, double y_part_um,
                          ArealMoments& moments) {
  // Unmasked first; a row with an unreached cell is summed again, masked (rare: edges).
  if (!residual_unmasked(z, plane_x_um, count, y_part_um, moments)) {
    residual_masked(z, plane_x_um, count, y_part_um, moments);
  }
}

}  // namespace cuspmap

// Row kernels of the level-distance sweep (see nearest_rows.h). Plain counted loops over
// contiguous arrays that the compiler turns into SIMD lanes; each kernel is cloned for AVX-512,
// AVX2 and the baseline and the loader picks the clone the CPU runs (GCC/Clang target_clones),
// so a portable build still uses the wide units. Built with -fno-math-errno (CMakeLists.txt) so
// that sqrt stays a lane instruction. Method: see nearest_rows.h.
#include "sweep/nearest_rows.h"

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>

#include "sweep/lane_clones.h"

#if defined(__SSE2__)
#include <immintrin.h>
#endif

namespace cuspmap {
namespace {

constexpr float kUmPerMm = 1000.0f;
constexpr float kUnreachedF = std::numeric_limits<float>::quiet_NaN();

}  // namespace

CUSPMAP_CLONES void fill_cells(float value, int count, float* out) {
  for (int n = 0; n < count; ++n) out[n] = value;
}

void fill_cells_stream(float value, int count, float* out) {
#if defined(__SSE2__)
  int n = 0;
  for (; n < count && (reinterpret_cast<std::uintptr_t>(out + n) & 15u) != 0; ++n) out[n] = value;
  const __m128 lanes = _mm_set1_ps(value);
  for (; n + 4 <= count; n += 4) _mm_stream_ps(out + n, lanes);
  for (; n < count; ++n) out[n] = value;
#else
  fill_cells(value, count, out);
#endif
}

void copy_cells_stream(const float* in, int count, float* out) {
#if defined(__SSE2__)
  int n = 0;
  for (; n < count && (reinterpret_cast<std::uintptr_t>(out + n) & 15u) != 0; ++n) out[n] = in[n];
  for (; n + 4 <= count; n += 4) _mm_stream_ps(out + n, _mm_loadu_ps(in + n));
  for (; n < count; ++n) out[n] = in[n];
#else
  std::copy(in, in + count, out);
#endif
}

void stream_fence() {
#if defined(__SSE2__)
  _mm_sfence();
#endif
}

CUSPMAP_CLONES void line_d2_min(const LineRow& row, int count, float* d2) {
  const float ua = row.ua, ub = row.ub, du = row.du, w0 = row.w, dw = row.dw;
  for (int n = 0; n < count; ++n) {
    const float nf = static_cast<float>(n);
    const float before = -(ua + nf * du);  // > 0 before the start
    const float after = ub + nf * du;      // > 0 past the end
    const float t = std::max(std::max(before, after), 0.0f);
    const float w = w0 + nf * dw;
    const float d = w * w + t * t;
    d2[n] = std::min(d2[n], d);
  }
}

CUSPMAP_CLONES void band_d2_min(float w, float dw, int count, float* d2) {
  for (int n = 0; n < count; ++n) {
    const float v = w + static_cast<float>(n) * dw;
    d2[n] = std::min(d2[n], v * v);
  }
}

CUSPMAP_CLONES void arc_d2_min(const ArcRow& row, int count, float* d2) {
  const double vy2 = row.vy * row.vy, ay2 = row.ay * row.ay, by2 = row.by * row.by;
  const double mid_y_part = row.vy * row.mid_y;
  for (int n = 0; n < count; ++n) {
    const double s = static_cast<double>(n) * row.step;
    const double vx = row.vx + s;
    const double rho = std::sqrt(vx * vx + vy2);
    const double radial = rho - row.radius;
    const double ax = row.ax + s, bx = row.bx + s;
    const double ends = std::min(ax * ax + ay2, bx * bx + by2);
    const bool inside = vx * row.mid_x + mid_y_part >= rho * row.cos_half;
    const float d = static_cast<float>(inside ? radial * radial : ends);
    d2[n] = std::min(d2[n], d);
  }
}

CUSPMAP_CLONES void profile_heights(const float* d2, int count, float base_um, float flat_mm,
                                    float corner_mm, float reach2, float* out) {
  // rc - sqrt(rc^2 - u^2) written as u^2 / (rc + sqrt(rc^2 - u^2)): no cancellation, so the
  // height keeps float's relative precision down to the pass itself (the difference form loses
  // an ulp of rc, 1.2e-4 um at rc = 1 mm, against cusps of a few nm near a pass).
  const float c2 = corner_mm * corner_mm;
  if (corner_mm == 0.0f) {
    // Flat end: level within the reach.
    for (int n = 0; n < count; ++n) out[n] = d2[n] <= reach2 ? base_um : kUnreachedF;
    return;
  }
  if (flat_mm == 0.0f) {
    // Ball: u = d, so u^2 = d2 and no square root of d2 is needed.
    for (int n = 0; n < count; ++n) {
      const float u2 = std::min(d2[n], c2);
      const float h = base_um + kUmPerMm * (u2 / (corner_mm + std::sqrt(c2 - u2)));
      out[n] = d2[n] <= reach2 ? h : kUnreachedF;
    }
    return;
  }
  for (int n = 0; n < count; ++n) {
    const float u = std::min(std::max(std::sqrt(d2[n]) - flat_mm, 0.0f), corner_mm);
    const float h = base_um + kUmPerMm * (u * u / (corner_mm + std::sqrt(c2 - u * u)));
    out[n] = d2[n] <= reach2 ? h : kUnreachedF;
  }
}

namespace {

// Cells a piece other than the last runs on to a multiple of: the widest lane count (AVX-512
// floats), so the vector loop needs no scalar tail; the extra cells belong to later pieces of
// the row, which overwrite them.
constexpr int kPieceRound = 16;

// The row's distances into out (each piece's loop run on as above), then out[n] = height(out[n])
// over the whole row: the height loop, the costly one, has one tail per row, not one per piece.
template <class Height>
inline void run_pieces(const RasterPiece* pieces, int count, float dw, Height height,
                       float* out) {
  const int width = pieces[count - 1].end;
  for (int q = 0; q < count; ++q) {
    const int s = pieces[q].start;
    int cells = pieces[q].end - s;
    if (q + 1 < count) cells = std::min((cells + kPieceRound - 1) / kPieceRound * kPieceRound,
                                        width - s);
    const float a = pieces[q].a, b = pieces[q].b;
    float* o = out + s;
    for (int n = 0; n < cells; ++n) {
      const float t = static_cast<float>(n) * dw;
      o[n] = std::min(std::abs(a + t), std::abs(b + t));
    }
  }
  for (int n = 0; n < width; ++n) out[n] = height(out[n]);
}

}  // namespace

CUSPMAP_CLONES void raster_row_heights(const RasterPiece* pieces, int count, float dw,
                                       const RowProfile& profile, float* out) {
  const float base_um = profile.base_um, flat = profile.flat_mm, rc = profile.corner_mm;
  const float reach2 = profile.reach2;
  if (rc == 0.0f) {
    run_pieces(pieces, count, dw,
               [=](float d) { return d * d <= reach2 ? base_um : kUnreachedF; }, out);
    return;
  }
  const float c2 = rc * rc;
  if (!profile.series) {
    // The cancellation-free form of profile_heights.
    run_pieces(
        pieces, count, dw,
        [=](float d) {
          const float u = std::min(std::max(d - flat, 0.0f), rc);
          const float h = base_um + kUmPerMm * (u * u / (rc + std::sqrt(c2 - u * u)));
          return d * d <= reach2 ? h : kUnreachedF;
        },
        out);
    return;
  }
  // 1 - sqrt(1 - x) = sum_k C(2k, k) / ((2k - 1) 4^k) x^k (the binomial series of (1 - x)^(1/2)),
  // k = 1..6: every term positive, so no cancellation either.
  constexpr float k1 = 1.0f / 2, k2 = 1.0f / 8, k3 = 1.0f / 16, k4 = 5.0f / 128, k5 = 7.0f / 256,
                  k6 = 21.0f / 1024;
  const float inv_c2 = 1.0f / c2, scale = kUmPerMm * rc;
  if (profile.in_reach) {
    // The same values without the reach test and the clamp at rc, which can then change none
    // (u^2 <= rc^2 / 16 and d^2 < reach2 everywhere).
    run_pieces(
        pieces, count, dw,
        [=](float d) {
          const float u = std::max(d - flat, 0.0f);
          const float x = u * u * inv_c2;
          const float poly = ((((k6 * x + k5) * x + k4) * x + k3) * x + k2) * x + k1;
          return base_um + scale * (x * poly);
        },
        out);
    return;
  }
  run_pieces(
      pieces, count, dw,
      [=](float d) {
        const float u = std::min(std::max(d - flat, 0.0f), rc);
        const float x = u * u * inv_c2;
        const float poly = ((((k6 * x + k5) * x + k4) * x + k3) * x + k2) * x + k1;
        const float h = base_um + scale * (x * poly);
        return d * d <= reach2 ? h : kUnreachedF;
      },
      out);
}

}  // namespace cuspmap

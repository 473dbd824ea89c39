// Tests of the streamed statistics' row kernels against plain scalar loops (the definitions they
// vectorise), with unreached cells in the lanes and the tail, and of StreamedTexture's
// independence of the thread count.
// Method: sums of ISO 25178-2:2012 §4.1 / §3.1.8 taken cell by cell in double (derived).
#include "texture/band_row_sums.h"

#include <cmath>
#include <cstring>
#include <random>
#include <vector>

#include "test_support.h"
#include "texture/streamed_texture.h"

namespace cuspmap {
namespace {

// Sums of ~1000 terms in another order: double rounding stays far below 1e-12 of the value.
constexpr double kOrderRel = 1e-12;

void check_rel(double a, double b) { REQUIRE_NEAR(a, b, kOrderRel * std::abs(b) + 1e-300); }

// A row of random heights (um) with NaN at the given cells.
std::vector<float> row_with_gaps(int n, const std::vector<int>& gaps, unsigned seed) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<float> height(-3.0f, 5.0f);
  std::vector<float> z(n);
  for (float& v : z) v = height(rng);
  for (int g : gaps) z[g] = kUnreached;
  return z;
}

}  // namespace

TEST_CASE("row_plane_sums: equal the cell-by-cell sums, NaN cells skipped", "[texture]") {
  const int n = 1003;  // 125 lanes of 8 and a tail of 3
  for (const std::vector<int>& gaps :
       {std::vector<int>{}, std::vector<int>{0, 9, 500}, std::vector<int>{1001}}) {
    CAPTURE(gaps.size());
    const std::vector<float> z = row_with_gaps(n, gaps, 7u + gaps.size());
    std::vector<double> x(n);
    positions_about({-2.0, 0.004, 1.5}, n, x.data());
    RowPlaneSums got;
    row_plane_sums(z.data(), x.data(), n, axis_sums(x.data(), n), got);
    RowPlaneSums want;
    for (int i = 0; i < n; ++i) {
      if (std::isnan(z[i])) continue;
      // derived: Heightfield::x_mm(i) - centre, the plane's normal-equation sums.
      const double xi = (-2.0 + (i + 0.5) * 0.004) - 1.5, v = z[i];
      want.n += 1.0;
      want.sx += xi;
      want.sxx += xi * xi;
      want.sz += v;
      want.sxz += xi * v;
      want.lo = std::min(want.lo, v);
      want.hi = std::max(want.hi, v);
    }
    CHECK(got.n == want.n);
    check_rel(got.sx, want.sx);
    check_rel(got.sxx, want.sxx);
    check_rel(got.sz, want.sz);
    check_rel(got.sxz, want.sxz);
    CHECK(got.lo == want.lo);
    CHECK(got.hi == want.hi);
  }
}

TEST_CASE("row_residual_moments: equal ArealMoments::add of remove_plane's residuals",
          "[texture]") {
  const int n = 1005;
  for (const std::vector<int>& gaps : {std::vector<int>{}, std::vector<int>{3, 4, 1004}}) {
    CAPTURE(gaps.size());
    const std::vector<float> z = row_with_gaps(n, gaps, 11u + gaps.size());
    std::vector<double> q(n);
    positions_about({0.0, 0.005, 2.5}, n, q.data());
    for (double& v : q) v = 0.7 + 0.31 * v;  // z0 + gx (x - x0)
    ArealMoments got;
    row_residual_moments(z.data(), q.data(), n, -0.05, got);
    ArealMoments want;
    for (int i = 0; i < n; ++i) {
      if (!std::isnan(z[i])) want.add(static_cast<float>(z[i] - (q[i] + -0.05)));
    }
    CHECK(got.count == want.count);
    check_rel(got.sum_abs_um, want.sum_abs_um);
    check_rel(got.sum_um, want.sum_um);
    check_rel(got.sum_um2, want.sum_um2);
    check_rel(got.sum_um3, want.sum_um3);
    check_rel(got.sum_um4, want.sum_um4);
    CHECK(got.min_um == want.min_um);
    CHECK(got.max_um == want.max_um);
  }
}

TEST_CASE("row_block_sums: bit for bit the sequential block sums", "[texture]") {
  // k = 1 .. 19 covers blocks of fewer than 8 cells, whole 8 x 8 tiles plus a remainder, and
  // 16-block groups followed by single blocks; 613 cells leave a partial last block.
  const int n = 613;
  const std::vector<float> z = row_with_gaps(n, {0, 17, 18, 200, 611}, 5u);
  for (int k = 1; k < 20; ++k) {
    CAPTURE(k);
    const int blocks = (n + k - 1) / k;
    std::vector<double> sums(blocks, 0.25), want(blocks, 0.25);  // running sums carried in
    std::vector<int> counts(blocks, 3), want_counts(blocks, 3);
    row_block_sums(z.data(), n, k, sums.data(), counts.data());
    for (int i = 0; i < n; ++i) {
      if (!std::isfinite(z[i])) continue;
      want[i / k] += z[i];
      ++want_counts[i / k];
    }
    CHECK(std::memcmp(sums.data(), want.data(), sums.size() * sizeof(double)) == 0);
    CHECK(counts == want_counts);
  }
}

TEST_CASE("StreamedTexture: the same report for any thread count", "[texture]") {
  Heightfield band;
  band.nx = 2100;
  band.ny = 40;
  band.cell_mm = 0.01;
  band.z_um.resize(band.ny, band.nx);
  std::mt19937 rng(3u);
  std::uniform_real_distribution<float> height(0.0f, 4.0f);
  for (int j = 0; j < band.ny; ++j) {
    for (int i = 0; i < band.nx; ++i) band.z_um(j, i) = height(rng) + 0.001f * i;
  }
  band.z_um(5, 9) = kUnreached;
  const int bands = 3;
  auto run = [&](int threads, Heightfield& overview) {
    StreamedTexture texture(band.nx, band.ny * bands, band.cell_mm, 0.0, 0.0, TextureOptions{},
                            threads);
    for (int pass = 0; pass < 2; ++pass) {
      for (int b = 0; b < bands; ++b) {
        band.origin_y_mm = b * band.ny * band.cell_mm;
        if (pass == 0) texture.add_first_pass(band, b * band.ny);
        if (pass == 1) texture.add_second_pass(band);
      }
      if (pass == 0) texture.finish_first_pass();
    }
    overview = texture.overview();
    return texture.report().areal.parameters;
  };
  Heightfield o1, o3;
  const ArealParameters a = run(1, o1), b = run(3, o3);
  CHECK(a.sa_um == b.sa_um);
  CHECK(a.sq_um == b.sq_um);
  CHECK(a.sp_um == b.sp_um);
  CHECK(a.sv_um == b.sv_um);
  CHECK(a.ssk == b.ssk);
  CHECK(a.sku == b.sku);
  REQUIRE(o1.z_um.size() == o3.z_um.size());
  CHECK(std::memcmp(o1.z_um.data(), o3.z_um.data(), o1.z_um.size() * sizeof(float)) == 0);
}

}  // namespace cuspmap

// Tests for io/reduce_blocks: block mean / minimum, NaN cells ignored, partial edge blocks.
#include "report/reduce_blocks.h"

#include <cstring>
#include <numbers>
#include <random>
#include <vector>

#include "test_support.h"

using namespace cuspmap;

TEST_CASE("cells_per_pixel_for: ceil of the longest side over the limit", "[report]") {
  REQUIRE(cells_per_pixel_for(1000, 200, 1000) == 1);
  REQUIRE(cells_per_pixel_for(1001, 200, 1000) == 2);
  REQUIRE(cells_per_pixel_for(300, 3000, 1000) == 3);
  REQUIRE(cells_per_pixel_for(10, 10, 0) == 10);
}

TEST_CASE("reduce_blocks: mean and minimum of 2 x 2 blocks with a partial edge", "[report]") {
  // 3 rows x 5 columns (row 0 first):
  //   1 2 | 3 4 | 5
  //   3 4 | N 6 | 7      N = NaN (not reached)
  //   ----+-----+--
  //   9 8 | N N | 1
  HeightGrid z(3, 5);
  const float n = kUnreached;
  z << 1, 2, 3, 4, 5, 3, 4, n, 6, 7, 9, 8, n, n, 1;
  const HeightGrid mean = reduce_blocks(z, 2, BlockReduce::Mean);
  REQUIRE(mean.rows() == 2);
  REQUIRE(mean.cols() == 3);
  REQUIRE_NEAR(mean(0, 0), 2.5, 1e-6);
  REQUIRE_NEAR(mean(0, 1), 13.0 / 3.0, 1e-6);  // NaN left out: (3 + 4 + 6) / 3
  REQUIRE_NEAR(mean(0, 2), 6.0, 1e-6);         // partial block: (5 + 7) / 2
  REQUIRE_NEAR(mean(1, 0), 8.5, 1e-6);
  REQUIRE(std::isnan(mean(1, 1)));  // no finite cell
  REQUIRE_NEAR(mean(1, 2), 1.0, 1e-6);
  const HeightGrid low = reduce_blocks(z, 2, BlockReduce::Min);
  REQUIRE_NEAR(low(0, 0), 1.0, 0.0);
  REQUIRE_NEAR(low(0, 1), 3.0, 0.0);
  REQUIRE_NEAR(low(1, 0), 8.0, 0.0);
  REQUIRE(std::isnan(low(1, 1)));
  const HeightGrid same = reduce_blocks(z, 1, BlockReduce::Mean);
  REQUIRE(same.rows() == 3);
  REQUIRE_NEAR(same(2, 4), 1.0, 0.0);
}

TEST_CASE("reduce_blocks: the anti-aliased mean turns marks finer than a pixel into flat gray",
          "[report]") {
  // Stripes along X of period p cells, amplitude 1, reduced by k = 10 (p / k pixels per period).
  // Sampling theorem (Gonzalez & Woods, 3rd ed., 4.5): above 0.5 cycles per pixel a pattern can
  // only fold into a false coarser one, so it must average out. Gaussian response
  // exp(-2 pi^2 sigma^2 f^2), sigma = 0.6 px (derived): f = 1/0.7 -> 1e-7; f = 1/1.5 -> 0.042;
  // a plain block mean passes |sinc(f)|: 0.22 and 0.41 (derived), which the first checks catch.
  const auto stripes = [](double period_cells) {
    HeightGrid z(60, 400);
    for (int j = 0; j < 60; ++j) {
      for (int i = 0; i < 400; ++i) {
        z(j, i) = static_cast<float>(std::sin(2.0 * std::numbers::pi * i / period_cells));
      }
    }
    return z;
  };
  // Away from the two outermost pixel columns, where the kernel is cut by the grid's edge.
  const auto worst = [](const HeightGrid& g) {
    return g.middleCols(2, g.cols() - 4).cwiseAbs().maxCoeff();
  };
  REQUIRE(worst(reduce_blocks(stripes(7.0), 10, BlockReduce::AntiAlias)) < 0.01);
  REQUIRE(worst(reduce_blocks(stripes(15.0), 10, BlockReduce::AntiAlias)) < 0.06);
  REQUIRE(worst(reduce_blocks(stripes(7.0), 10, BlockReduce::Mean)) > 0.15);
  REQUIRE(worst(reduce_blocks(stripes(15.0), 10, BlockReduce::Mean)) > 0.3);
  // Marks 8 pixels apart stay: response exp(-2 pi^2 0.36 / 64) = 0.895, sampled at block
  // centres 4.5 + 10 b cells whose nearest to a crest is 20.25 deg off it: 0.895 x cos(20.25 deg)
  // = 0.840 (derived).
  const HeightGrid coarse = reduce_blocks(stripes(80.0), 10, BlockReduce::AntiAlias);
  REQUIRE(worst(coarse) > 0.83);
}

TEST_CASE("reduce_blocks: the anti-aliased mean keeps the block mean's size and unreached rule",
          "[report]") {
  HeightGrid z(3, 5);
  const float n = kUnreached;
  z << 1, 2, 3, 4, 5, 3, 4, n, 6, 7, 9, 8, n, n, 1;
  const HeightGrid a = reduce_blocks(z, 2, BlockReduce::AntiAlias);
  REQUIRE(a.rows() == 2);
  REQUIRE(a.cols() == 3);
  REQUIRE(std::isnan(a(1, 1)));  // no finite cell in the block: not reached, as in every mode
  for (int j = 0; j < 2; ++j) {
    for (int i = 0; i < 3; ++i) {
      if (i == 1 && j == 1) continue;
      REQUIRE(std::isfinite(a(j, i)));
      REQUIRE(a(j, i) >= 1.0f);  // a weighted mean stays within the finite values' range
      REQUIRE(a(j, i) <= 9.0f);
    }
  }
  HeightGrid flat = HeightGrid::Constant(30, 40, 2.5f);
  const HeightGrid f = reduce_blocks(flat, 4, BlockReduce::AntiAlias);
  REQUIRE(f.cwiseAbs().maxCoeff() == Approx(2.5).epsilon(1e-6));
  REQUIRE(f.minCoeff() == Approx(2.5).epsilon(1e-6));
}

namespace {

// The anti-aliased mean computed directly from its definition (reduce_blocks.h): per output, the
// Gaussian taps of each axis (centre of the block, sigma = 0.6 k cells, cut at 3 sigma), rows
// first into float sums and weights of the finite cells, then columns, every sum in double taken
// over the taps in order. No shared weights, no interior shortcut: the oracle for the fast paths.
struct DirectTaps {
  int first = 0;
  std::vector<double> w;
};

std::vector<DirectTaps> direct_taps(int n, int k) {
  std::vector<DirectTaps> taps;
  const double sigma = kAntiAliasSigmaPx * k, reach = kAntiAliasCutoffSigmas * sigma;
  for (int b = 0; b * k < n; ++b) {
    const double centre = 0.5 * (b * k + std::min(n, (b + 1) * k) - 1);
    DirectTaps t;
    t.first = std::max(0, static_cast<int>(std::ceil(centre - reach)));
    const int last = std::min(n - 1, static_cast<int>(std::floor(centre + reach)));
    for (int i = t.first; i <= last; ++i) {
      const double u = (i - centre) / sigma;
      t.w.push_back(std::exp(-0.5 * u * u));
    }
    taps.push_back(t);
  }
  return taps;
}

HeightGrid direct_anti_alias(const HeightGrid& z, int k) {
  const int ny = static_cast<int>(z.rows()), nx = static_cast<int>(z.cols());
  const std::vector<DirectTaps> tx = direct_taps(nx, k), ty = direct_taps(ny, k);
  const int out_nx = static_cast<int>(tx.size()), out_ny = static_cast<int>(ty.size());
  HeightGrid sum(ny, out_nx), weight(ny, out_nx);
  for (int j = 0; j < ny; ++j) {
    for (int bi = 0; bi < out_nx; ++bi) {
      double s = 0.0, w = 0.0;
      for (std::size_t q = 0; q < tx[bi].w.size(); ++q) {
        const float v = z(j, tx[bi].first + static_cast<int>(q));
        if (!std::isfinite(v)) continue;
        s += tx[bi].w[q] * v;
        w += tx[bi].w[q];
      }
      sum(j, bi) = static_cast<float>(s);
      weight(j, bi) = static_cast<float>(w);
    }
  }
  HeightGrid out(out_ny, out_nx);
  for (int bj = 0; bj < out_ny; ++bj) {
    for (int bi = 0; bi < out_nx; ++bi) {
      double s = 0.0, w = 0.0;
      for (std::size_t q = 0; q < ty[bj].w.size(); ++q) {
        const int j = ty[bj].first + static_cast<int>(q);
        s += ty[bj].w[q] * sum(j, bi);
        w += ty[bj].w[q] * weight(j, bi);
      }
      bool any = false;
      for (int j = bj * k; j < std::min(ny, (bj + 1) * k); ++j) {
        for (int i = bi * k; i < std::min(nx, (bi + 1) * k); ++i) any |= std::isfinite(z(j, i));
      }
      out(bj, bi) = any && w > 0.0 ? static_cast<float>(s / w) : kUnreached;
    }
  }
  return out;
}

bool same_bits(const HeightGrid& a, const HeightGrid& b) {
  if (a.rows() != b.rows() || a.cols() != b.cols()) return false;
  return std::memcmp(a.data(), b.data(), sizeof(float) * static_cast<std::size_t>(a.size())) == 0;
}

}  // namespace

TEST_CASE("reduce_blocks: the anti-aliased mean equals its direct definition bit for bit",
          "[report]") {
  // The fast paths (rows split into phases, kLanes outputs at a time, the column weight sums
  // shared between all-finite rows) must give the direct sums' exact floats (derived: the same
  // operations in the same order), on odd sizes, with NaN cells, rows and columns, k = 1..5.
  std::mt19937 rng(15);
  std::uniform_real_distribution<float> height(-3.0f, 5.0f);
  const int sizes[][2] = {{97, 203}, {64, 64}, {131, 47}, {5, 300}, {250, 9}, {1, 1}, {3, 17}};
  for (const auto& size : sizes) {
    for (int k = 1; k <= 5; ++k) {
      for (int holes = 0; holes < 4; ++holes) {
        HeightGrid z(size[0], size[1]);
        for (int j = 0; j < z.rows(); ++j) {
          for (int i = 0; i < z.cols(); ++i) z(j, i) = height(rng);
        }
        if (holes >= 1) z(z.rows() / 2, z.cols() / 3) = kUnreached;             // one cell
        if (holes >= 2) z.row(z.rows() / 3).setConstant(kUnreached);             // a whole row
        if (holes >= 3) z.col(z.cols() - 1).setConstant(kUnreached);             // the last column
        if (holes >= 3 && z.rows() > 6) z.middleRows(1, 4).setConstant(kUnreached);  // a band
        CAPTURE(size[0], size[1], k, holes);
        const HeightGrid fast = reduce_blocks(z, k, BlockReduce::AntiAlias);
        const HeightGrid direct = k == 1 ? z : direct_anti_alias(z, k);
        REQUIRE(same_bits(fast, direct));
      }
    }
  }
}

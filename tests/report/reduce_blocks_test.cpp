// Tests for io/reduce_blocks: block mean / minimum, NaN cells ignored, partial edge blocks.
#include "report/reduce_blocks.h"

#include <numbers>

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

// Tests for io/reduce_blocks: block mean / minimum, NaN cells ignored, partial edge blocks.
#include "report/reduce_blocks.h"

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

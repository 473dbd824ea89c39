// Hardening tests of grid sizing: any finite patch gives a grid count without integer overflow,
// and a grid past the memory limit is refused with the estimate before anything is allocated.
#include "core/heightfield.h"

#include <regex>

#include "core/input_error.h"
#include "test_support.h"

using namespace cuspmap;

TEST_CASE("grid_dimensions: huge size over tiny cell saturates instead of overflowing", "[core]") {
  Patch patch;
  patch.size_x_mm = 1e300;
  patch.size_y_mm = 10.0;
  patch.cell_mm = 1e-300;  // size / cell = inf in double arithmetic
  std::int64_t nx = 0, ny = 0;
  grid_dimensions(patch, nx, ny);
  CHECK(nx >= std::int64_t{1000000000000000});  // the saturation value, far past any memory
  CHECK(ny >= 1);
  CHECK(heightfield_bytes(patch) > (std::int64_t{1} << 50));
}

TEST_CASE("make_heightfield: refuses a grid over the limit with the estimate", "[core]") {
  Patch patch;
  patch.size_x_mm = 1000.0;
  patch.size_y_mm = 1000.0;
  patch.cell_mm = 0.001;  // 1e6 x 1e6 cells = 4e12 bytes = 3.6 TiB
  try {
    make_heightfield(patch, std::int64_t{1} << 30);
    FAIL("no error");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()) ==
          "grid of 1000000 x 1000000 cells needs 3.6 TiB, over the memory limit of 1 GiB; use a "
          "larger cell, a smaller patch or --max-memory");
  }
}

TEST_CASE("make_heightfield: a saturated grid is refused, not allocated", "[core]") {
  Patch patch;
  patch.size_x_mm = 1e300;
  patch.size_y_mm = 1e300;
  patch.cell_mm = 1e-300;
  CHECK_THROWS_AS(make_heightfield(patch, 0), InputError);
}

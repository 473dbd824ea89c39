// Heightfield dimensions, NaN fill, cell centres, and the memory-limit error verbatim.
#include "core/heightfield.h"

#include <cmath>
#include <string>

#include "core/input_error.h"
#include "test_support.h"

namespace {
cuspmap::Patch patch(double sx, double sy, double cell) {
  cuspmap::Patch p;
  p.size_x_mm = sx;
  p.size_y_mm = sy;
  p.cell_mm = cell;
  return p;
}
}  // namespace

TEST_CASE("grid_dimensions: whole cells, a partial cell counts as one", "[core]") {
  std::int64_t nx = 0, ny = 0;
  cuspmap::grid_dimensions(patch(10.0, 5.0, 0.01), nx, ny);
  REQUIRE(nx == 1000);  // exactly 1000, not 1001 from rounding of 10 / 0.01
  REQUIRE(ny == 500);
  cuspmap::grid_dimensions(patch(10.005, 0.3, 0.01), nx, ny);
  REQUIRE(nx == 1001);
  REQUIRE(ny == 30);
  cuspmap::grid_dimensions(patch(0.001, 0.001, 0.01), nx, ny);
  REQUIRE(nx == 1);
  REQUIRE(ny == 1);
  REQUIRE(cuspmap::heightfield_bytes(patch(10.0, 5.0, 0.01)) == 1000 * 500 * 4);
}

TEST_CASE("make_heightfield: NaN-filled grid with cell centres", "[core]") {
  cuspmap::Patch p = patch(2.0, 1.0, 0.5);
  p.origin_x_mm = 10.0;
  p.origin_y_mm = -1.0;
  const cuspmap::Heightfield hf = cuspmap::make_heightfield(p, 1 << 20);
  REQUIRE(hf.nx == 4);
  REQUIRE(hf.ny == 2);
  REQUIRE(hf.cells() == 8);
  REQUIRE(hf.z_um.rows() == 2);
  REQUIRE(hf.z_um.cols() == 4);
  REQUIRE(hf.x_mm(0) == 10.25);
  REQUIRE(hf.y_mm(1) == -0.25);
  REQUIRE(cuspmap::reached_cells(hf) == 0);
  cuspmap::Heightfield h2 = hf;
  h2.z_um(1, 3) = 2.5f;
  h2.z_um(0, 0) = 0.0f;
  REQUIRE(cuspmap::reached_cells(h2) == 2);
}

TEST_CASE("make_heightfield: memory limit error names the estimate and the limit", "[core]") {
  try {
    cuspmap::make_heightfield(patch(10.0, 10.0, 0.01), 1 << 20);
    FAIL("expected an InputError");
  } catch (const cuspmap::InputError& e) {
    // 1000 x 1000 floats = 4,000,000 bytes = 3.8 MiB; limit 1,048,576 bytes = 1 MiB.
    REQUIRE(std::string(e.what()) ==
            "grid of 1000 x 1000 cells needs 3.8 MiB, over the memory limit of 1 MiB; use a "
            "larger cell, a smaller patch or --max-memory");
  }
  // A dimension past 2^31 - 1 cells is refused whatever the limit.
  REQUIRE_THROWS_AS(cuspmap::make_heightfield(patch(3e9, 1.0, 1.0), INT64_MAX),
                    cuspmap::InputError);
  REQUIRE(cuspmap::physical_memory_bytes() > 0);
}

// Tests of the band-streamed sweep: bands reassemble into simulate_floor's grid bit for bit
// (envelope at an angle, a tilted dished flat, tooth-resolved), each band's grid stays within
// the planned bytes and the plan within the memory limit, and an impossible limit is refused.
// Method: agreement with the in-memory sweep (the same tile kernels; the minimum is
// order-independent), and the band size rule of plan_bands (simulate_bands.h).
#include "sweep/simulate_bands.h"

#include <cmath>
#include <cstring>

#include "core/input_error.h"
#include "path/raster.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// Runs simulate_bands and copies the bands into one grid, checking their order and memory.
Heightfield assemble(const Cutter& c, const Toolpath& path, const CutSpec& cut,
                     const Patch& patch, const SimSpec& sim, const BandPlan& plan) {
  Heightfield all = make_heightfield(patch, 0);
  int next_row = 0;
  simulate_bands(c, path, cut, patch, sim, plan, [&](const Heightfield& band, int j0) {
    REQUIRE(j0 == next_row);
    REQUIRE(band.nx == all.nx);
    REQUIRE(static_cast<std::int64_t>(band.z_um.size() * sizeof(float)) <= plan.band_bytes);
    REQUIRE_NEAR(band.y_mm(0), all.y_mm(j0), 1e-12);  // origin + j0 cell vs (j0 + 0.5) cell
    all.z_um.middleRows(j0, band.ny) = band.z_um;
    next_row += band.ny;
  });
  REQUIRE(next_row == all.ny);
  return all;
}

// Bitwise equality (NaN equals NaN): the bands run the same kernels on the same cells.
bool same_bits(const Heightfield& a, const Heightfield& b) {
  return a.z_um.size() == b.z_um.size() &&
         std::memcmp(a.z_um.data(), b.z_um.data(), a.z_um.size() * sizeof(float)) == 0;
}

void check_against_floor(const Cutter& c, const CutSpec& cut, const Patch& patch,
                         const PathSpec& spec, bool teeth) {
  const Toolpath path = raster_path(spec, cut, patch, c);
  SimSpec sim;
  sim.tooth_marks = teeth;
  sim.threads = 2;
  // A limit whose quarter holds two tile rows of this grid: several bands.
  std::int64_t nx = 0, ny = 0;
  grid_dimensions(patch, nx, ny);
  const BandPlan plan = plan_bands(patch, 4 * 2 * 32 * nx * 4);
  REQUIRE(plan.bands > 2);
  REQUIRE(plan.band_rows == 64);
  const Heightfield whole = simulate_floor(c, path, cut, patch, sim);
  const Heightfield banded = assemble(c, path, cut, patch, sim, plan);
  CHECK(same_bits(whole, banded));
}

}  // namespace

TEST_CASE("simulate_bands: bands reproduce simulate_floor bit for bit", "[sweep]") {
  Patch patch;
  patch.size_x_mm = 6.0;
  patch.size_y_mm = 7.3;  // a partial last band
  patch.cell_mm = 0.02;
  CutSpec cut;
  PathSpec spec;
  spec.direction = RasterDirection::Zigzag;
  SECTION("ball envelope, raster at 30 deg") {
    Cutter ball;
    ball.shape = CutterShape::Ball;
    ball.diameter_mm = 4.0;
    spec.stepover_mm = 0.3;
    spec.angle_deg = 30.0;
    check_against_floor(ball, cut, patch, spec, false);
  }
  SECTION("tilted dished flat, tooth by tooth") {
    Cutter flat;
    flat.shape = CutterShape::Flat;
    flat.diameter_mm = 3.0;
    flat.dish_deg = 1.0;
    flat.teeth = 3;
    flat.tilt_deg = 0.05;
    flat.tilt_toward_deg = 90.0;
    cut.rpm = 10000.0;
    cut.feed_mm_per_min = 1500.0;
    spec.stepover_mm = 1.0;
    check_against_floor(flat, cut, patch, spec, true);
  }
}

TEST_CASE("plan_bands: one band stays within a quarter of the memory limit", "[sweep]") {
  Patch patch;
  patch.size_x_mm = 200.0;
  patch.size_y_mm = 200.0;
  patch.cell_mm = 0.002;  // 10^10 cells, 40 GB as one grid
  const std::int64_t limit = std::int64_t{2} << 30;
  const BandPlan plan = plan_bands(patch, limit);
  CHECK(plan.nx == 100000);
  CHECK(plan.ny == 100000);
  CHECK(plan.band_bytes <= limit / 4);
  CHECK(plan.band_bytes <= kMaxBandBytes);
  CHECK(plan.band_bytes == std::int64_t{plan.band_rows} * plan.nx * 4);
  CHECK(plan.band_rows % 32 == 0);
  CHECK(std::int64_t{plan.bands} * plan.band_rows >= plan.ny);
  CHECK(std::int64_t{plan.bands - 1} * plan.band_rows < plan.ny);
}

TEST_CASE("plan_bands: a limit below one tile row is refused", "[sweep]") {
  Patch patch;
  patch.size_x_mm = 100.0;
  patch.size_y_mm = 1.0;
  patch.cell_mm = 0.001;  // 100000 columns x 32 rows x 4 B = 12.8 MB per tile row
  REQUIRE_THROWS_AS(plan_bands(patch, 10'000'000), InputError);
}

}  // namespace cuspmap

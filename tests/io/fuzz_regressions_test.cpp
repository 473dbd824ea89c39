// Reproducers of past fuzz findings in the heightmap readers (tests/fuzz/regressions/): each must
// give one InputError line naming the file, never a crash, undefined behaviour or huge allocation.
// Sources: ISO 25178-71:2012 record 1 (SDF counts are 16-bit, at most 65535), ISO 25178-72
// (X3P: main.xml + data.bin of SizeX x SizeY samples); the cell limits are common practice.
#include <string>

#include "core/input_error.h"
#include "io/read_heightmap.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

// The message read_heightmap throws for a reproducer, or "" when it does not throw.
std::string reproducer_error(const std::string& path) {
  try {
    read_heightmap(path, HeightmapReadOptions{});
  } catch (const InputError& e) {
    return e.what();
  }
  return "";
}

std::string reproducer(const std::string& name) {
  return test::source_path("tests/fuzz/regressions/" + name);
}

}  // namespace

TEST_CASE("issue_8: SDF header counts above 65535 are refused before any reserve", "[io]") {
  const std::string path = reproducer("fuzz_sdf/header_count_reserved_before_data_check.sdf");
  REQUIRE_THROWS_AS(read_heightmap(path, HeightmapReadOptions{}), InputError);
  CHECK(reproducer_error(path) ==
        path + ":5: NumPoints 1.012e+10 is out of range; SDF allows 1 to 65535");
}

TEST_CASE("issue_8: SDF NumPoints of 3e54 is refused before the integer cast", "[io]") {
  const std::string path = reproducer("fuzz_sdf/point_count_double_to_long.sdf");
  REQUIRE_THROWS_AS(read_heightmap(path, HeightmapReadOptions{}), InputError);
  CHECK(reproducer_error(path) ==
        path + ":3: NumPoints 3.33333e+54 is out of range; SDF allows 1 to 65535");
}

TEST_CASE("issue_8: X3P malformed offset throws without leaking the archive", "[io]") {
  const std::string path = reproducer("fuzz_x3p/zip_leaked_on_malformed_offset.x3p");
  REQUIRE_THROWS_AS(read_heightmap(path, HeightmapReadOptions{}), InputError);
  CHECK(reproducer_error(path) == path + ": main.xml CX Offset '0.00-00-' is not a number");
}

TEST_CASE("issue_8: X3P entry declaring 4 GB is refused before reading", "[io]") {
  const std::string path = reproducer("fuzz_x3p/declared_entry_size_4gb.x3p");
  REQUIRE_THROWS_AS(read_heightmap(path, HeightmapReadOptions{}), InputError);
  CHECK(reproducer_error(path) ==
        path + ": X3P entry main.xml declares 4244637270 bytes; at most 16777216 are allowed");
}

TEST_CASE("issue_8: XYZ of 4 points spanning 46001 x 46001 cells is refused", "[io]") {
  const std::string path = reproducer("fuzz_xyz/four_points_two_billion_cells.xyz");
  REQUIRE_THROWS_AS(read_heightmap(path, HeightmapReadOptions{}), InputError);
  CHECK(reproducer_error(path) ==
        path +
            ": grid of 46001 x 46001 cells (cell 0.001 mm) is over the limit of 268435456 cells");
}

TEST_CASE("issue_8: XYZ coordinate of 6.7e41 mm is refused before integer counts", "[io]") {
  const std::string path = reproducer("fuzz_xyz/grid_count_signed_overflow.xyz");
  REQUIRE_THROWS_AS(read_heightmap(path, HeightmapReadOptions{}), InputError);
  CHECK(reproducer_error(path) ==
        path +
            ": grid of 6.66667e+43 x 6 cells (cell 0.01 mm) is over the limit of 268435456 cells");
}

TEST_CASE("issue_8: XYZ grid of over 64 cells per point is refused", "[io]") {
  // 6 points on a 0.01 mm grid 20 x 20 cells wide: 400 cells > 64 x 6 = 384.
  test::TempDir dir;
  const std::string path = dir.file("corners.xyz");
  test::write_text(path, "0 0 1\n0.19 0 1\n0 0.19 1\n0.19 0.19 1\n0.01 0 1\n0 0.01 1\n");
  REQUIRE_THROWS_AS(read_heightmap(path, HeightmapReadOptions{}), InputError);
  CHECK(reproducer_error(path) == path +
                                      ": grid of 20 x 20 cells (cell 0.01 mm) for 6 points; at "
                                      "most 64 cells per point are allowed "
                                      "(is a point far off the scan?)");
}

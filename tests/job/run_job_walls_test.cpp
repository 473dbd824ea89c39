// Offset floors: an open edge finishes the same floor a raster does (no wall fillets in the
// statistics), and a walled pocket's band within R of the wall is left out of the floor and
// reported apart. Also the job key that chooses between them.
// Method: run_job on a 20 x 20 mm patch; handbook cusp h = R - sqrt(R^2 - (s/2)^2).
#include <cmath>

#include "core/input_error.h"
#include "job/run_job.h"
#include "test_support.h"

namespace cuspmap {
namespace {

Job floor_job(PathKind kind) {
  Job job;
  job.name = "floor";
  job.patch.size_x_mm = job.patch.size_y_mm = 12.0;
  job.patch.cell_mm = 0.02;
  job.cutter.shape = CutterShape::Ball;
  job.cutter.diameter_mm = 6.0;
  job.path.kind = kind;
  job.path.stepover_mm = 0.5;
  return job;
}

}  // namespace

TEST_CASE("issue_13: an open-edge offset floor and a raster floor are the same floor", "[job]") {
  const JobRun raster = run_job(floor_job(PathKind::Raster), RunOptions{});
  const JobRun offset = run_job(floor_job(PathKind::Offset), RunOptions{});
  // Handbook cusp of a 6 mm ball at 0.5 mm: 10.44 um. The rings' convex corners leave at most
  // the diagonal gap, 0.5 s sqrt2 / (1 + sqrt2) ... s/(1 + sin 45 deg) = 0.293 mm from a pass
  // (derived): 14.3 um. On main the walls' fillets made the offset floor's Sz ~3000 um.
  const double h_um = (3.0 - std::sqrt(9.0 - 0.25 * 0.25)) * 1000.0;
  const double corner_um = (3.0 - std::sqrt(9.0 - std::pow(0.5 / (1.0 + std::sqrt(0.5)), 2))) * 1000.0;
  CHECK(raster.texture.areal.parameters.sz_um <= h_um * 1.01);
  CHECK(offset.texture.areal.parameters.sz_um <= corner_um * 1.01);
  CHECK(offset.texture.reached_cells == raster.texture.reached_cells);  // every cell, both
  CHECK_FALSE(offset.walled);
}

TEST_CASE("issue_13: a walled pocket's wall band is left out of the floor and reported apart",
          "[job]") {
  Job job = floor_job(PathKind::Offset);
  job.path.edge = OffsetEdge::Wall;
  const JobRun run = run_job(job, RunOptions{});
  REQUIRE(run.walled);
  // Derived: the tool-centre region is the 6 x 6 mm square 3 mm inside; the wall band holds the
  // other 144 - 36 mm^2 of the patch less the four corners beyond the ball's reach,
  // 4 (3^2 - pi 3^2 / 4) mm^2; 2500 cells per mm^2 at 20 um.
  const double band_mm2 = 108.0 - 4.0 * (9.0 - 9.0 * std::acos(-1.0) / 4.0);
  CHECK(static_cast<double>(run.walls.cells) == Approx(band_mm2 * 2500).epsilon(0.01));
  // Derived: the cells nearest the wall lie 2.99 mm from ring 0, z = R - sqrt(R^2 - 2.99^2).
  CHECK(run.walls.highest_point_um >= (3.0 - std::sqrt(9.0 - 2.99 * 2.99)) * 1000.0 - 1.0);
  CHECK(run.texture.reached_cells == 36 * 2500);
  // Handbook cusp bound as above (10.44 um; corner gaps 14.3 um): the floor has no fillet.
  CHECK(run.texture.areal.parameters.sz_um < 15.0);
  CHECK(run.highest_point_um < 15.0);
}

TEST_CASE("parse_job: path.edge chooses open or wall, offset only", "[job]") {
  const std::string head = R"(
[patch]
size = [12, 12]
cell = 0.02
[tool]
shape = "ball"
diameter = 6
[cut]
rpm = 10000
feed = 1000
[path]
stepover = 0.5
)";
  CHECK(parse_job(head + "kind = \"offset\"\n", "j.toml", ".").path.edge == OffsetEdge::Open);
  CHECK(parse_job(head + "kind = \"offset\"\nedge = \"wall\"\n", "j.toml", ".").path.edge ==
        OffsetEdge::Wall);
  const Job raster = parse_job(head + "kind = \"raster\"\nedge = \"wall\"\n", "j.toml", ".");
  REQUIRE(raster.ignored_keys.size() == 1);
  CHECK(raster.ignored_keys[0] == "path.edge (offset only)");
  CHECK_THROWS_AS(parse_job(head + "kind = \"offset\"\nedge = \"walls\"\n", "j.toml", "."),
                  InputError);
}

}  // namespace cuspmap

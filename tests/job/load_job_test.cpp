// Tests of the job-file reader: schema, units, defaults, ignored keys and verbatim errors.
#include "job/job.h"

#include "core/input_error.h"
#include "job/nearest_key.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

const char* kRasterJob = R"(
units = "mm"
[patch]
size = [12, 8]
cell = 0.01
[tool]
shape = "ball"
diameter = 6
[cut]
rpm = 12000
feed = 1500
[path]
kind = "raster"
stepover = 0.3
)";

std::string error_of(const std::string& text) {
  try {
    parse_job(text, "job.toml", ".");
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

}  // namespace

TEST_CASE("parse_job: reads a raster job with DESIGN.md defaults", "[job]") {
  const Job job = parse_job(kRasterJob, "pump.toml", ".");
  CHECK(job.name == "pump");
  CHECK(job.patch.size_x_mm == 12.0);
  CHECK(job.patch.size_y_mm == 8.0);
  CHECK(job.patch.cell_mm == 0.01);
  CHECK(job.cutter.shape == CutterShape::Ball);
  CHECK(job.cutter.diameter_mm == 6.0);
  CHECK(job.cut.rpm == 12000.0);
  CHECK(job.cut.feed_mm_per_min == 1500.0);
  CHECK(job.path.kind == PathKind::Raster);
  CHECK(job.path.stepover_mm == 0.3);
  // Defaults named in DESIGN.md "Job file": angle 0, one-way, envelope mode, mm.
  CHECK(job.path.angle_deg == 0.0);
  CHECK(job.path.direction == RasterDirection::OneWay);
  CHECK_FALSE(job.sim.tooth_marks);
  CHECK(job.units == LengthUnit::Millimetre);
  CHECK(job.ignored_keys.empty());
}

TEST_CASE("parse_job: inch units and suffixed strings convert to mm", "[job]") {
  const Job job = parse_job(R"(
units = "in"
[patch]
size = [0.5, "10mm"]
cell = "0.4thou"
[tool]
shape = "flat"
diameter = 0.25
dish_deg = "1deg"
tilt_deg = 0.01
axial_offsets = ["2um", 0.0]
teeth = 2
[cut]
rpm = 10000
feed = 40
[path]
kind = "raster"
stepover = 0.02
direction = "zigzag"
)",
                            "j.toml", ".");
  // 1 in = 25.4 mm exactly (international inch, 1959).
  REQUIRE_NEAR(job.patch.size_x_mm, 12.7, 1e-12);
  REQUIRE_NEAR(job.patch.size_y_mm, 10.0, 1e-12);
  REQUIRE_NEAR(job.patch.cell_mm, 0.01016, 1e-12);
  REQUIRE_NEAR(job.cutter.diameter_mm, 6.35, 1e-12);
  REQUIRE_NEAR(job.cut.feed_mm_per_min, 1016.0, 1e-9);
  REQUIRE_NEAR(job.path.stepover_mm, 0.508, 1e-12);
  REQUIRE(job.cutter.axial_offsets_um.size() == 2);
  REQUIRE_NEAR(job.cutter.axial_offsets_um[0], 2.0, 1e-9);
  CHECK(job.cutter.dish_deg == 1.0);
  CHECK(job.path.direction == RasterDirection::Zigzag);
}

TEST_CASE("parse_job: issue_13 fractional inch strings", "[job]") {
  // Strings take the flags' length rules, fractions included; 1 in = 25.4 mm exactly.
  std::string text = kRasterJob;
  const std::string key = "diameter = ";
  const auto at = text.find(key);
  REQUIRE(at != std::string::npos);
  text.replace(at, text.find('\n', at) - at, "diameter = \"1/4in\"");
  const Job job = parse_job(text, "j.toml", ".");
  REQUIRE_NEAR(job.cutter.diameter_mm, 6.35, 1e-12);
}

TEST_CASE("parse_job: a key that does not apply to the shape is listed as ignored", "[job]") {
  std::string text = kRasterJob;
  text.replace(text.find("diameter = 6"), 12, "diameter = 6\ndish_deg = 1");
  const Job job = parse_job(text, "j.toml", ".");
  REQUIRE(job.ignored_keys == std::vector<std::string>{"tool.dish_deg (ball)"});
}

TEST_CASE("parse_job: errors name the value, its place and what is allowed", "[job]") {
  std::string text = kRasterJob;
  text.replace(text.find("diameter = 6"), 12, "diamter = 6");
  CHECK(error_of(text) == "job.toml:8:1: unknown key 'tool.diamter'; did you mean 'tool.diameter'?");

  text = kRasterJob;
  text.replace(text.find("shape = \"ball\""), 14, "shape = \"sphere\"");
  CHECK(error_of(text) ==
        "job.toml:7:9: tool.shape 'sphere': allowed values are ball, bullnose, flat");

  text = kRasterJob;
  text.replace(text.find("diameter = 6"), 12, "diameter = -6");
  CHECK(error_of(text) == "job.toml: tool.diameter -6 mm: must be > 0");

  text = kRasterJob;
  text.replace(text.find("stepover = 0.3"), 14, "stepover = \"0.3furlong\"");
  CHECK(error_of(text) ==
        "job.toml:14:12: path.stepover '0.3furlong': unknown unit; allowed suffixes are mm, um, "
        "in, thou, uin");

  text = kRasterJob;
  text.replace(text.find("stepover = 0.3"), 14, "stepover = 0");
  CHECK(error_of(text) == "job.toml:14:12: path.stepover 0 mm: must be > 0");

  CHECK(error_of("[patch\nsize=1") .rfind("job.toml:1:", 0) == 0);
  CHECK(error_of("") == "job.toml: missing table [path]");
}

TEST_CASE("parse_job: gcode path resolves the file next to the job and may omit the patch size",
          "[job]") {
  const Job job = parse_job(R"(
[patch]
cell = 0.01
[tool]
shape = "ball"
diameter = 3
[cut]
rpm = 20000
feed = 800
[path]
kind = "gcode"
file = "floor.nc"
stepover = 0.2
)",
                            "jobs/a.toml", "jobs");
  CHECK(job.path.file == "jobs/floor.nc");
  CHECK(job.patch_from_program);
  CHECK(job.ignored_keys == std::vector<std::string>{"path.stepover (gcode)"});
}

TEST_CASE("edit_distance: Levenshtein's classic examples", "[job]") {
  // kitten -> sitting = 3 (Levenshtein 1966; the textbook example, e.g. Wikipedia/Navarro 2001).
  CHECK(edit_distance("kitten", "sitting") == 3);
  CHECK(edit_distance("", "abc") == 3);
  CHECK(edit_distance("flaw", "lawn") == 2);
  CHECK(nearest_key("tool.diamter", {"tool.diameter", "tool.teeth"}) == "tool.diameter");
  CHECK(nearest_key("zzzzzz", {"tool.diameter"}).empty());
}

TEST_CASE("describe_tool and describe_path: short labels", "[job]") {
  Cutter c;
  c.shape = CutterShape::Flat;
  c.diameter_mm = 6;
  c.dish_deg = 1;
  CHECK(describe_tool(c, LengthUnit::Millimetre) == "6 mm flat, 1 deg dish");
  PathSpec p;
  p.stepover_mm = 0.508;
  p.direction = RasterDirection::Zigzag;
  CHECK(describe_path(p, LengthUnit::Inch) == "raster zigzag 0.02 in @ 0 deg");
}

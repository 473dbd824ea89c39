// Cutter and patch range checks: each message verbatim, in flag and job-key style.
#include "job/validate_cutter.h"

#include <cmath>
#include <limits>
#include <string>

#include "core/input_error.h"
#include "test_support.h"

namespace {
using cuspmap::NameStyle;

std::string cutter_error(const cuspmap::Cutter& c, NameStyle style) {
  try {
    cuspmap::validate_cutter(c, style);
  } catch (const cuspmap::InputError& e) {
    return e.what();
  }
  return "(accepted)";
}

std::string patch_error(const cuspmap::Patch& p, NameStyle style) {
  try {
    cuspmap::validate_patch(p, style);
  } catch (const cuspmap::InputError& e) {
    return e.what();
  }
  return "(accepted)";
}

cuspmap::Cutter ball6() {
  cuspmap::Cutter c;
  c.diameter_mm = 6.0;
  return c;
}
}  // namespace

TEST_CASE("validate_cutter: a plain cutter passes", "[job]") {
  REQUIRE(cutter_error(ball6(), NameStyle::Flag) == "(accepted)");
  cuspmap::Cutter c = ball6();
  c.corner_radius_mm = 100.0;  // ignored for a ball
  c.tilt_deg = -1.0;           // the limit itself is allowed
  REQUIRE(cutter_error(c, NameStyle::JobKey) == "(accepted)");
}

TEST_CASE("validate_cutter: each limit, verbatim", "[job]") {
  cuspmap::Cutter c = ball6();
  c.diameter_mm = -3.0;
  REQUIRE(cutter_error(c, NameStyle::Flag) == "--diameter -3 mm: must be > 0");
  REQUIRE(cutter_error(c, NameStyle::JobKey) == "tool.diameter -3 mm: must be > 0");
  c.diameter_mm = std::numeric_limits<double>::quiet_NaN();
  REQUIRE(cutter_error(c, NameStyle::Flag) == "--diameter: must be a finite number");

  c = ball6();
  c.shape = cuspmap::CutterShape::BullNose;
  c.corner_radius_mm = 0.0;
  REQUIRE(cutter_error(c, NameStyle::Flag) ==
          "--corner-radius 0 mm: must be > 0 and <= the tool radius 3 mm");
  c.corner_radius_mm = 3.5;
  REQUIRE(cutter_error(c, NameStyle::JobKey) ==
          "tool.corner_radius 3.5 mm: must be > 0 and <= the tool radius 3 mm");

  c = ball6();
  c.dish_deg = 45.0;
  REQUIRE(cutter_error(c, NameStyle::Flag) == "--dish 45 deg: must be >= 0 and < 45 deg");
  c.dish_deg = -0.5;
  REQUIRE(cutter_error(c, NameStyle::JobKey) ==
          "tool.dish_deg -0.5 deg: must be >= 0 and < 45 deg");

  c = ball6();
  c.teeth = 0;
  REQUIRE(cutter_error(c, NameStyle::Flag) == "--teeth 0: must be a whole number >= 1");

  c = ball6();
  c.tilt_deg = 1.5;
  REQUIRE(cutter_error(c, NameStyle::JobKey) ==
          "tool.tilt_deg 1.5 deg: must be within +-1 deg (the first-order tilt model's limit)");

  c = ball6();
  c.runout_mm = 3.0;
  REQUIRE(cutter_error(c, NameStyle::Flag) ==
          "--runout 3 mm: must be >= 0 and smaller than the tool radius");

  // issue_2: a NaN tilt direction or runout phase used to pass and turn every height into NaN.
  c = ball6();
  c.tilt_toward_deg = std::numeric_limits<double>::quiet_NaN();
  REQUIRE(cutter_error(c, NameStyle::JobKey) == "tool.tilt_toward_deg: must be a finite number");
  c = ball6();
  c.runout_phase_deg = std::numeric_limits<double>::infinity();
  REQUIRE(cutter_error(c, NameStyle::Flag) == "--runout-phase: must be a finite number");

  c = ball6();
  c.axial_offsets_um = {1.0, 2.0, 3.0};
  REQUIRE(cutter_error(c, NameStyle::JobKey) ==
          "tool.axial_offsets: has 3 values, needs one per tooth (2)");
  c.axial_offsets_um = {1.0, std::numeric_limits<double>::infinity()};
  REQUIRE(cutter_error(c, NameStyle::Flag) == "--axial-offsets: must be a finite number");
}

TEST_CASE("validate_patch: sizes and cell, verbatim", "[job]") {
  cuspmap::Patch p;
  REQUIRE(patch_error(p, NameStyle::JobKey) == "(accepted)");
  p.size_x_mm = 0.0;
  REQUIRE(patch_error(p, NameStyle::JobKey) == "patch.size[0] 0 mm: must be > 0");
  p = cuspmap::Patch{};
  p.size_y_mm = -1.0;
  REQUIRE(patch_error(p, NameStyle::Flag) == "--size[1] -1 mm: must be > 0");
  p = cuspmap::Patch{};
  p.cell_mm = 20.0;
  REQUIRE(patch_error(p, NameStyle::JobKey) == "patch.cell 20 mm: must not exceed the patch size");
  p = cuspmap::Patch{};
  p.floor_z_mm = std::numeric_limits<double>::quiet_NaN();
  REQUIRE(patch_error(p, NameStyle::JobKey) == "patch.floor_z: must be a finite number");
}

TEST_CASE("value_name: flag and job styles", "[job]") {
  REQUIRE(cuspmap::value_name(NameStyle::Flag, "tool", "corner_radius", "corner-radius") ==
          "--corner-radius");
  REQUIRE(cuspmap::value_name(NameStyle::JobKey, "tool", "corner_radius", "corner-radius") ==
          "tool.corner_radius");
}

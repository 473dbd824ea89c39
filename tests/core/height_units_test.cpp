// Edge parsing for inch shops (issue 13 item 5): fractional lengths ("1/4", "1-1/4in"), bare
// height targets in um or uin, ISO 1302:1992 grades as Ra targets, and the error lines verbatim.
#include "core/height_units.h"

#include <string>

#include "core/input_error.h"
#include "core/units.h"
#include "test_support.h"

namespace {
using cuspmap::LengthUnit;

std::string error_line(const char* text, bool grade) {
  try {
    if (grade) {
      cuspmap::parse_ra_target_um(text, LengthUnit::Inch, "--target-ra");
    } else {
      cuspmap::parse_length_mm(text, LengthUnit::Inch, "--diameter");
    }
  } catch (const cuspmap::InputError& e) {
    return e.what();
  }
  return "(no error)";
}
}  // namespace

TEST_CASE("parse_length_mm: issue_13 fractional inches as shops write them", "[core]") {
  // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959).
  REQUIRE_NEAR(cuspmap::parse_length_mm("1/4", LengthUnit::Inch, "--diameter"), 6.35, 1e-15);
  REQUIRE_NEAR(cuspmap::parse_length_mm("3/8in", LengthUnit::Millimetre, "--d"), 9.525, 1e-14);
  REQUIRE_NEAR(cuspmap::parse_length_mm("1-1/4", LengthUnit::Inch, "--d"), 31.75, 1e-14);
  REQUIRE_NEAR(cuspmap::parse_length_mm("-1-1/4", LengthUnit::Inch, "--d"), -31.75, 1e-14);
  REQUIRE_NEAR(cuspmap::parse_length_mm("1/2 thou", LengthUnit::Inch, "--d"), 0.0127, 1e-16);
  REQUIRE(cuspmap::parse_length_mm("1/2", LengthUnit::Millimetre, "--d") == 0.5);
  REQUIRE(error_line("1/0", false) == "--diameter '1/0': a fraction needs a denominator > 0");
  REQUIRE(error_line("1.5-1/4", false) ==
          "--diameter '1.5-1/4': the whole part of a mixed fraction must be a whole number");
  REQUIRE(error_line("1/x", false) ==
          "--diameter '1/x': not a number (fractions are written 1/4 or 1-1/4)");
  // A range-like text is not a fraction: it stays an unknown suffix as before.
  REQUIRE(error_line("0.1-0.5", false) ==
          "--diameter '0.1-0.5': unknown unit; allowed suffixes are mm, um, in, thou, uin");
}

TEST_CASE("parse_height_um: issue_13 bare targets are um, or uin with --units in", "[core]") {
  // Trade convention (common practice, no source): inch prints say Ra 32, 63, 125 (uin).
  // 1 uin = 0.0254 um exactly.
  REQUIRE_NEAR(cuspmap::parse_height_um("32", LengthUnit::Inch, "--target-ra"), 0.8128, 1e-15);
  REQUIRE_NEAR(cuspmap::parse_height_um("125", LengthUnit::Inch, "--target-ra"), 3.175, 1e-14);
  REQUIRE(cuspmap::parse_height_um("0.8", LengthUnit::Millimetre, "--target-ra") == 0.8);
  // Suffixes win over the bare unit.
  REQUIRE_NEAR(cuspmap::parse_height_um("0.8um", LengthUnit::Inch, "--t"), 0.8, 1e-15);
  REQUIRE_NEAR(cuspmap::parse_height_um("0.2thou", LengthUnit::Millimetre, "--t"), 5.08, 1e-13);
  REQUIRE_NEAR(cuspmap::parse_height_um("0.001mm", LengthUnit::Inch, "--t"), 1.0, 1e-15);
  REQUIRE(cuspmap::parse_height_um("-1", LengthUnit::Millimetre, "--t") == -1.0);  // sign kept
}

TEST_CASE("parse_ra_target_um: issue_13 ISO 1302:1992 grades as Ra targets", "[core]") {
  // ISO 1302:1992 table of roughness grade numbers (from memory): N6 = 0.8 um, N7 = 1.6 um,
  // N8 = 3.2 um; the target is the standard's micrometre value in either unit system.
  REQUIRE(cuspmap::parse_ra_target_um("N6", LengthUnit::Inch, "--target-ra") == 0.8);
  REQUIRE(cuspmap::parse_ra_target_um("n7", LengthUnit::Millimetre, "--target-ra") == 1.6);
  REQUIRE(cuspmap::parse_ra_target_um(" N8 ", LengthUnit::Millimetre, "--target-ra") == 3.2);
  REQUIRE(cuspmap::parse_ra_target_um("N1", LengthUnit::Millimetre, "--target-ra") == 0.025);
  REQUIRE(error_line("N13", true) ==
          "--target-ra 'N13': unknown roughness grade; ISO 1302:1992 grades are N1 to N12");
  REQUIRE(error_line("N0", true) ==
          "--target-ra 'N0': unknown roughness grade; ISO 1302:1992 grades are N1 to N12");
}

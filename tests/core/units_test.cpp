// Unit parsing at the edge: every length suffix, bare numbers in mm and in, angles, plain
// numbers, and the error messages verbatim.
#include "core/units.h"

#include <stdexcept>
#include <string>

#include "core/input_error.h"
#include "test_support.h"

namespace {
using cuspmap::LengthUnit;

std::string error_of(void (*f)()) {
  try {
    f();
  } catch (const cuspmap::InputError& e) {
    return e.what();
  }
  return "(no error)";
}

double mm(const char* text, LengthUnit bare = LengthUnit::Millimetre) {
  return cuspmap::parse_length_mm(text, bare, "--x");
}
}  // namespace

TEST_CASE("parse_length_mm: every suffix", "[core]") {
  // 1 in = 25.4 mm exactly (international yard and pound agreement, 1959); 1 thou = 0.001 in.
  REQUIRE(mm("6mm") == 6.0);
  REQUIRE_NEAR(mm("300um"), 0.3, 1e-15);
  REQUIRE_NEAR(mm("300\xC2\xB5m"), 0.3, 1e-15);  // "µm"
  REQUIRE_NEAR(mm("0.25in"), 6.35, 1e-15);
  REQUIRE_NEAR(mm("20thou"), 0.508, 1e-15);
  REQUIRE_NEAR(mm("20mil"), 0.508, 1e-15);
  REQUIRE_NEAR(mm("40uin"), 0.001016, 1e-18);
  REQUIRE_NEAR(mm("1e-3in"), 0.0254, 1e-17);
  REQUIRE(mm(" 6 mm ") == 6.0);  // spaces around and before the suffix
  REQUIRE(mm("+3") == 3.0);
  REQUIRE(mm("-3") == -3.0);  // the sign is kept: callers check ranges
  REQUIRE(mm(".5mm") == 0.5);
}

TEST_CASE("parse_length_mm: bare numbers take the --units choice", "[core]") {
  REQUIRE(mm("6") == 6.0);
  REQUIRE_NEAR(mm("0.25", LengthUnit::Inch), 6.35, 1e-15);
  // A suffix wins over the bare unit.
  REQUIRE(mm("6mm", LengthUnit::Inch) == 6.0);
  REQUIRE_NEAR(mm("1in", LengthUnit::Millimetre), 25.4, 1e-15);
}

TEST_CASE("parse_length_mm: errors name the value", "[core]") {
  REQUIRE(error_of([] { mm(""); }) == "--x is empty: expected a number");
  REQUIRE(error_of([] { mm("   "); }) == "--x is empty: expected a number");
  REQUIRE(error_of([] { mm("abc"); }) == "--x 'abc': not a number");
  REQUIRE(error_of([] { mm("mm"); }) == "--x 'mm': not a number");
  REQUIRE(error_of([] { mm("inf"); }) == "--x 'inf': must be a finite number");
  REQUIRE(error_of([] { mm("nan"); }) == "--x 'nan': must be a finite number");
  // Past double range: out of range (hardening, issue 8), not "not a number".
  REQUIRE(error_of([] { mm("1e999"); }) == "--x '1e999': out of range");
  REQUIRE(error_of([] { mm("5ft"); }) ==
          "--x '5ft': unknown unit; allowed suffixes are mm, um, in, thou, uin");
  REQUIRE(error_of([] { mm("1,5"); }) ==
          "--x '1,5': unknown unit; allowed suffixes are mm, um, in, thou, uin");
}

TEST_CASE("parse_angle_deg: degrees only", "[core]") {
  REQUIRE(cuspmap::parse_angle_deg("1.5", "--a") == 1.5);
  REQUIRE(cuspmap::parse_angle_deg("1.5deg", "--a") == 1.5);
  REQUIRE(cuspmap::parse_angle_deg("-30\xC2\xB0", "--a") == -30.0);  // "°"
  REQUIRE(error_of([] { cuspmap::parse_angle_deg("2rad", "--a"); }) ==
          "--a '2rad': unknown angle unit; allowed suffix is deg");
  REQUIRE(error_of([] { cuspmap::parse_angle_deg("x", "--a"); }) == "--a 'x': not a number");
}

TEST_CASE("parse_number and parse_length_unit", "[core]") {
  REQUIRE(cuspmap::parse_number("3", "--n") == 3.0);
  REQUIRE(error_of([] { cuspmap::parse_number("3mm", "--n"); }) ==
          "--n '3mm': expected a plain number");
  REQUIRE(cuspmap::parse_length_unit("mm", "--units") == LengthUnit::Millimetre);
  REQUIRE(cuspmap::parse_length_unit("in", "--units") == LengthUnit::Inch);
  REQUIRE(cuspmap::parse_length_unit("inch", "--units") == LengthUnit::Inch);
  REQUIRE(error_of([] { cuspmap::parse_length_unit("cm", "--units"); }) ==
          "--units 'cm': allowed units are mm, in");
}

TEST_CASE("format_number: six significant digits, no locale", "[core]") {
  REQUIRE(cuspmap::format_number(0.3) == "0.3");
  REQUIRE(cuspmap::format_number(-3.0) == "-3");
  REQUIRE(cuspmap::format_number(1e-5) == "1e-05");
  REQUIRE(cuspmap::format_number(123456789.0) == "1.23457e+08");
  REQUIRE(cuspmap::format_number(2.0 / 3.0) == "0.666667");
}

TEST_CASE("unit constants", "[core]") {
  // ISO 1302 and trade tables: 1 um = 39.37 uin.
  REQUIRE_NEAR(cuspmap::kUinPerUm, 39.37, 0.001);
  REQUIRE(cuspmap::kMmPerInch == 25.4);
}

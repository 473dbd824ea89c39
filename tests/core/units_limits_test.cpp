// Hardening tests of unit parsing: values that overflow once scaled, or cannot be held at all,
// are refused with InputError naming the text, never returned as infinity.
#include "core/input_error.h"
#include "core/units.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

std::string error_of_length(const std::string& text, LengthUnit bare) {
  try {
    parse_length_mm(text, bare, "--diameter");
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

}  // namespace

TEST_CASE("parse_length_mm: a bare inch value that overflows mm is out of range", "[core]") {
  // 1e308 in * 25.4 exceeds the largest double (~1.8e308, IEEE 754 binary64).
  CHECK(error_of_length("1e308", LengthUnit::Inch) == "--diameter '1e308': out of range");
  CHECK(error_of_length("1e308in", LengthUnit::Millimetre) ==
        "--diameter '1e308in': out of range");
  // The same number is representable in mm, so it passes the parser (ranges are callers' job).
  CHECK(parse_length_mm("1e308", LengthUnit::Millimetre, "--diameter") == 1e308);
}

TEST_CASE("parse_length_mm: a number beyond double range is out of range, not 'not a number'",
          "[core]") {
  CHECK(error_of_length("1e400", LengthUnit::Millimetre) == "--diameter '1e400': out of range");
  CHECK(error_of_length("-1e400mm", LengthUnit::Millimetre) ==
        "--diameter '-1e400mm': out of range");
}

TEST_CASE("parse_number: infinity and NaN spelled out are refused", "[core]") {
  for (const char* text : {"inf", "-inf", "nan", "infinity"}) {
    CAPTURE(text);
    CHECK_THROWS_AS(parse_number(text, "--teeth"), InputError);
  }
}

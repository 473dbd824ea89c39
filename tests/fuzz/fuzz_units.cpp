// libFuzzer target: unit-suffixed lengths, angles, plain numbers and unit names (core/units).
// Input: first byte picks the parser and the bare unit, the rest is the text as typed.
// Findings: any exception but InputError, a non-finite result, a crash, a leak or UB.
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "core/units.h"
#include "fuzz_check.h"

using namespace cuspmap;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  if (size == 0) return 0;
  const std::uint8_t selector = data[0];
  const std::string_view text(reinterpret_cast<const char*>(data + 1), size - 1);
  const LengthUnit bare = (selector & 4) != 0 ? LengthUnit::Inch : LengthUnit::Millimetre;
  fuzz::run_one([&] {
    switch (selector & 3) {
      case 0:
        fuzz::require_finite(parse_length_mm(text, bare, "--diameter"), "parse_length_mm");
        break;
      case 1:
        fuzz::require_finite(parse_angle_deg(text, "--dish"), "parse_angle_deg");
        break;
      case 2: {
        const double v = parse_number(text, "--teeth");
        fuzz::require_finite(v, "parse_number");
        // format_number must render every finite value it is given, without the locale.
        fuzz::require(format_number(v) != "?", "format_number failed on a finite value");
        break;
      }
      default: {
        const LengthUnit u = parse_length_unit(text, "--units");
        fuzz::require(u == LengthUnit::Millimetre || u == LengthUnit::Inch, "bad LengthUnit");
        break;
      }
    }
  });
  return 0;
}

// Range check of a strategy's length parameter (see check_length.h). Cost O(1).
// Inputs mm; throws InputError.
// Method: CONVENTIONS.md error tiers.
#include "path/check_length.h"

#include <cmath>
#include <string>

#include "core/input_error.h"
#include "core/units.h"

namespace cuspmap {

void check_length_mm(double value_mm, const char* key, bool zero_for_default) {
  const bool ok = std::isfinite(value_mm) && (value_mm > 0.0 || (zero_for_default && value_mm == 0.0));
  if (!ok) {
    throw InputError(std::string(key) + " " + format_number(value_mm) + ": must be > 0 mm" +
                     (zero_for_default ? " (or 0 for the default)" : ""));
  }
}

}  // namespace cuspmap

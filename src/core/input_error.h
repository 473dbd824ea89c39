// The one error type for bad user input: a value that came in from a flag, job file, G-code
// program or heightmap file and is not allowed. cli/main prints it as one line and exits 2.
// Method: ninja's error tiers (bug -> assert, bad input -> this, anything else -> exit 1).
#pragma once

#include <stdexcept>
#include <string>

namespace cuspmap {

/// Bad user input. The message names the offending value, where it came from (flag, or
/// file:line:col) and what is allowed, e.g. "--diameter -3: must be > 0 mm".
class InputError : public std::runtime_error {
 public:
  explicit InputError(const std::string& message) : std::runtime_error(message) {}
};

}  // namespace cuspmap

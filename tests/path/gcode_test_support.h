// Helpers of the G-code reader tests: read a program as "part.nc" over the test patch with the
// 6 mm test ball, or get the one-line error it gives.
#pragma once

#include <string>

#include "path/gcode_reader.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap::test {

/// The program read from memory as "part.nc" (test_patch, test_ball).
inline BuiltPath read_part(const std::string& text, const GcodeReadOptions& options = {}) {
  return read_gcode_text(text, "part.nc", CutSpec{}, test_patch(), test_ball(), options);
}

/// The InputError message read_part gives, or "(no error)".
inline std::string part_error(const std::string& text) {
  return input_error_of([&] { read_part(text); });
}

}  // namespace cuspmap::test

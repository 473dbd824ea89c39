// libFuzzer target: the RS-274 program reader (path/read_gcode_text) with the limits of
// path/path_limits.h. Input: program text. Accepted programs must give valid moves
// (fuzz_path_check.h). Findings: an exception but InputError, NaN/inf or a degenerate move, a
// crash, a leak or UB.
// fuzz-requires: src/path/gcode_reader.h
// fuzz-requires: src/path/gcode_reader.cpp
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "fuzz_path_check.h"
#include "path/gcode_reader.h"

using namespace cuspmap;

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  // The examples' conditions: a 6 mm ball over a 10 x 10 mm patch with its floor at Z 0.
  const Cutter cutter;
  const CutSpec cut;
  const Patch patch;
  // Loops that never end stop after this many lines, well inside the fuzzer's 10 s timeout.
  GcodeReadOptions options;
  options.max_lines_run = 100'000;
  fuzz::run_one([&] {
    fuzz::require_path(read_gcode_text(text, "fuzz.nc", cut, patch, cutter, options));
  });
  return 0;
}

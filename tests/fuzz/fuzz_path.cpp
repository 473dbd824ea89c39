// libFuzzer target: job files through to built-in toolpaths (job/parse_job, then
// path/build_toolpath for raster, offset, spiral, trochoidal): whatever the loader accepts must
// build a bounded, valid path or be refused with InputError, never run away in moves or time.
// Findings: an exception but InputError, an invalid move (fuzz_path_check.h), a crash, a leak,
// UB, a timeout or memory beyond libFuzzer's limit.
// fuzz-requires: src/path/build_toolpath.cpp
// fuzz-requires: src/path/raster.cpp
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "core/heightfield.h"
#include "fuzz_path_check.h"
#include "job/job.h"

using namespace cuspmap;

namespace {

// Only patches whose grid would fit in this many bytes (the examples' 10 x 10 mm at 10 um: 4 MB)
// are built: keeps one execution fast; since stepover and advance are at least one cell, it
// also bounds the passes.
constexpr std::int64_t kFuzzGridBytes = 16 << 20;

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  fuzz::run_one([&] {
    const Job job = parse_job(text, "fuzz.toml", "/nonexistent");
    if (job.path.kind == PathKind::Gcode || job.patch_from_program) return;
    if (heightfield_bytes(job.patch) > kFuzzGridBytes) return;
    fuzz::require_path(build_toolpath(job.path, job.cut, job.patch, job.cutter));
  });
  return 0;
}

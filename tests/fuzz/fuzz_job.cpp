// libFuzzer target: the TOML job loader's schema checks (job/parse_job), beyond toml++ itself.
// Input: job text. Accepted jobs must hold finite, in-range values; the patch's grid must be
// refused with InputError or allocated within a small memory limit, never overflow.
// Findings: any exception but InputError, NaN/inf in a Job, a crash, a leak or UB.
#include <cstddef>
#include <cstdint>
#include <string_view>

#include "core/heightfield.h"
#include "fuzz_check.h"
#include "job/job.h"

using namespace cuspmap;

namespace {

// Grid memory allowed per input: big enough for the examples' coarse grids, small enough that
// an execution stays well under a millisecond of filling.
constexpr std::int64_t kFuzzGridBytes = 1 << 20;

void check_job(const Job& job) {
  const Cutter& c = job.cutter;
  fuzz::require_finite(c.diameter_mm, "tool.diameter");
  fuzz::require(c.diameter_mm > 0, "tool.diameter <= 0 accepted");
  fuzz::require_finite(c.corner_radius_mm, "tool.corner_radius");
  fuzz::require_finite(c.dish_deg, "tool.dish_deg");
  fuzz::require_finite(c.tilt_deg, "tool.tilt_deg");
  fuzz::require(std::abs(c.tilt_deg) <= kMaxTiltDeg, "tilt beyond the model's limit accepted");
  fuzz::require_finite(c.tilt_toward_deg, "tool.tilt_toward_deg");
  fuzz::require_finite(c.runout_mm, "tool.runout");
  fuzz::require_finite(c.runout_phase_deg, "tool.runout_phase_deg");
  fuzz::require(c.teeth >= 1, "teeth < 1 accepted");
  for (double v : c.axial_offsets_um) fuzz::require_finite(v, "tool.axial_offsets");
  const CutSpec& cut = job.cut;
  fuzz::require_finite(cut.rpm, "cut.rpm");
  fuzz::require(cut.rpm > 0, "cut.rpm <= 0 accepted");
  fuzz::require_finite(cut.feed_mm_per_min, "cut.feed");
  fuzz::require(cut.feed_mm_per_min > 0, "cut.feed <= 0 accepted");
  fuzz::require_finite(cut.depth_mm, "cut.depth");
  fuzz::require_finite(cut.rapid_mm_per_min, "cut.rapid_feed");
  fuzz::require_finite(cut.retract_mm, "cut.retract");
  const PathSpec& p = job.path;
  if (p.kind != PathKind::Gcode) {
    fuzz::require_finite(p.stepover_mm, "path.stepover");
    fuzz::require(p.stepover_mm > 0, "path.stepover <= 0 accepted");
  }
  fuzz::require_finite(p.angle_deg, "path.angle_deg");
  fuzz::require_finite(p.loop_diameter_mm, "path.loop_diameter");
  fuzz::require_finite(p.advance_mm, "path.advance");
  for (const auto& v : p.boundary_mm) {
    fuzz::require_finite(v.x(), "path.boundary x");
    fuzz::require_finite(v.y(), "path.boundary y");
  }
  const Patch& patch = job.patch;
  for (double v : {patch.size_x_mm, patch.size_y_mm, patch.cell_mm, patch.origin_x_mm,
                   patch.origin_y_mm, patch.floor_z_mm}) {
    fuzz::require_finite(v, "patch value");
  }
  if (!job.patch_from_program) {
    fuzz::require(patch.cell_mm > 0 && patch.size_x_mm > 0 && patch.size_y_mm > 0,
                  "empty patch accepted");
    const Heightfield hf = make_heightfield(patch, kFuzzGridBytes);
    fuzz::require(hf.nx >= 1 && hf.ny >= 1 && hf.cells() * 4 <= kFuzzGridBytes,
                  "grid outside the memory limit");
  }
  // Labels must be producible for any accepted job.
  fuzz::require(!describe_tool(c, job.units).empty(), "empty tool description");
  fuzz::require(!describe_path(p, job.units).empty(), "empty path description");
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string_view text(reinterpret_cast<const char*>(data), size);
  fuzz::run_one([&] { check_job(parse_job(text, "fuzz.toml", "/nonexistent")); });
  return 0;
}

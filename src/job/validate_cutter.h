// Range checks for a Cutter and a Patch read from flags or a job file: one InputError naming the
// value (in mm or deg) and what is allowed. Shared by job/ and every cli command that takes tools.
// Method: limits of the geometric model (DESIGN.md "Geometry"; tool/cutter.h kMaxTiltDeg).
#pragma once

#include <string_view>

#include "core/heightfield.h"
#include "tool/cutter.h"

namespace cuspmap {

/// How the names of values appear in messages: "--diameter" for flags, "tool.diameter" for jobs.
enum class NameStyle {
  Flag,     ///< "--corner-radius"
  JobKey,   ///< "tool.corner_radius"
};

/// Throws InputError on the first value out of range: diameter <= 0, bull-nose corner radius not
/// in (0, R], diameter > kMaxJobLengthMm, dish < 0 or >= 45 deg, teeth < 1, |tilt| > kMaxTiltDeg, runout < 0 or >= R,
/// per-tooth axial offsets not one per tooth, any NaN/inf (tilt direction and runout phase too).
void validate_cutter(const Cutter& cutter, NameStyle style);

/// Throws InputError when a patch size or cell is <= 0 or not finite, the cell is larger than
/// the patch, or a size, origin or floor_z lies beyond +-1e6 mm (1 km).
void validate_patch(const Patch& patch, NameStyle style);

/// The message name of a value: key_flag ("corner-radius") for flags -> "--corner-radius",
/// table + "." + key_job for jobs -> "tool.corner_radius".
std::string value_name(NameStyle style, std::string_view table, std::string_view key_job,
                       std::string_view key_flag);

}  // namespace cuspmap

// Expands one job into several that differ in one parameter (compare --stepover 0.2,0.3,0.5 ...),
// so users need not write a job file per value. Values parse like the job file's own keys.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "job/job.h"

namespace cuspmap {

/// Parameters `vary_job` can vary.
inline constexpr std::string_view kVariableParameters[] = {"stepover", "angle", "raster-direction",
                                                           "tilt", "dish"};

/// One copy of `base` per value, each renamed "<parameter> <value> | <name>".
/// @param[in] base       validated job
/// @param[in] parameter  one of kVariableParameters
/// @param[in] values     the values as typed (lengths with optional suffix, angles in deg,
///                       directions one-way|zigzag); at least one
/// @param[in] unit       unit of bare lengths
/// @throws InputError naming the flag ("--stepover") and value when a value is malformed or out
///         of range for that job.
std::vector<Job> vary_job(const Job& base, std::string_view parameter,
                          const std::vector<std::string>& values, LengthUnit unit);

}  // namespace cuspmap

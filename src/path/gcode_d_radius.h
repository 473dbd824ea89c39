// D-word table of cutter radius compensation (G41/G42 D..): tool offset numbers mapped to tool
// radii, as the user gives them ("1=3mm,2=2.5" on the command line, or a job-file table), with
// their range checks. Inputs: text or numbers in the user's length unit; output radii in mm.
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.5.10: D names the tool table entry
// whose radius compensation uses; here the user's table stands for the control's.
#pragma once

#include <map>
#include <string>
#include <string_view>

#include "core/units.h"

namespace cuspmap {

/// Largest D number read: controls' tool offset tables number their entries with at most 4-5
/// digits (common practice, no source); the bound also keeps garbage numbers finite.
inline constexpr int kMaxDNumber = 99999;

/// Checks one table entry.
/// @param[in] d_number   D number as given
/// @param[in] radius_mm  tool radius, mm
/// @param[in] where      what gave it, for messages ("--d-radius", "job.toml:4:12: path.d_radius")
/// @throws InputError "<where> D<n>: ..." unless 0 <= d_number <= kMaxDNumber and
///         0 <= radius_mm <= kMaxJobLengthMm.
void check_d_radius(long long d_number, double radius_mm, const std::string& where);

/// Parses "D=RADIUS" pairs separated by commas, e.g. "1=3mm,2=2.5" (bare numbers in
/// `bare_unit`; an optional leading 'D' before each number).
/// @return D number -> radius, mm
/// @throws InputError naming `flag` and the offending pair for a malformed pair, a D given twice
///         or an entry check_d_radius refuses.
std::map<int, double> parse_d_radius_list(std::string_view text, LengthUnit bare_unit,
                                          const std::string& flag);

}  // namespace cuspmap

// Parses lengths and angles with unit suffixes at the edge of the program and converts them to
// the core's units: millimetres for lengths, micrometres for heights, degrees for angles.
// Suffixes: mm, um, in, thou, uin (lengths), deg (angles); bare numbers take the --units choice.
// Method: exact factors 1 in = 25.4 mm (international yard and pound, 1959), 1 thou = 0.001 in.
#pragma once

#include <string>
#include <string_view>

namespace cuspmap {

/// Millimetres per inch (exact by definition since 1959).
inline constexpr double kMmPerInch = 25.4;
/// Micrometres per millimetre.
inline constexpr double kUmPerMm = 1000.0;
/// Largest magnitude of any length a job, flag or program may give, mm (1 km): far beyond any
/// machine table or tool, and small enough that sums of lengths (passes from -R to size + R,
/// plunges from retract to depth) stay finite and cell centres keep sub-nanometre resolution in a
/// double. Shared by job/, path/ (G-code words) and cli/.
inline constexpr double kMaxJobLengthMm = 1e6;
/// Micro-inches per micrometre (1 um = 39.37 uin, ISO 1302 tables round the same way).
inline constexpr double kUinPerUm = 1.0 / (kMmPerInch * 1e-3);

/// The unit a bare number (no suffix) is read in, and the unit human output is shown in.
enum class LengthUnit {
  Millimetre,  ///< bare numbers are mm; heights shown in um
  Inch,        ///< bare numbers are inches; heights shown in uin (and thou)
};

/// Parses "mm" or "in" (also "inch") as given to --units or a job's `units` key.
/// @param[in] text  the value; @param[in] what  the flag or key name used in the error
/// @throws InputError naming the value when it is neither.
LengthUnit parse_length_unit(std::string_view text, std::string_view what);

/// Parses a length such as "6", "6mm", "0.25in", "20thou", "300um", "40uin" into millimetres.
/// @param[in] text        number with optional suffix (no spaces inside the number)
/// @param[in] bare_unit   unit of a bare number
/// @param[in] what        flag or key name for the error message (e.g. "--diameter")
/// @return millimetres; finite. Sign is kept: callers check ranges.
/// @throws InputError on an empty string, a malformed number, NaN/inf or an unknown suffix.
double parse_length_mm(std::string_view text, LengthUnit bare_unit, std::string_view what);

/// parse_length_mm that also requires the result to be > 0.
/// @throws InputError "<what> <text>: must be > 0" otherwise.
double parse_positive_length_mm(std::string_view text, LengthUnit bare_unit, std::string_view what);

/// Parses an angle "1.5", "1.5deg" or "1.5°" into degrees (bare numbers are degrees).
/// @throws InputError on malformed numbers, NaN/inf or a suffix other than deg.
double parse_angle_deg(std::string_view text, std::string_view what);

/// Parses a plain finite number (no unit), e.g. a count or a rate, with std::from_chars.
/// @throws InputError naming `what` when malformed or not finite.
double parse_number(std::string_view text, std::string_view what);

/// Formats a double for messages with up to 6 significant digits ("0.3", "1e-05"),
/// independent of the C locale.
std::string format_number(double value);

}  // namespace cuspmap

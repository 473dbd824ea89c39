// Range check of a length a path strategy takes from the job ([path] stepover, loop diameter,
// advance): one InputError naming the key, the value and what is allowed.
// Method: the error tiers of CONVENTIONS.md (bad input -> InputError with the value).
#pragma once

namespace cuspmap {

/// Throws InputError "<key> <value>: must be > 0 mm" (with " (or 0 for the default)" when
/// zero_for_default) unless value_mm is finite and > 0 (or exactly 0 when zero_for_default).
void check_length_mm(double value_mm, const char* key, bool zero_for_default);

}  // namespace cuspmap

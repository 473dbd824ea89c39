// "Nice" numbers for axes and scale bars: tick steps of 1, 2 or 5 times a power of ten, the tick
// values inside a range, the longest nice length below a limit, and locale-free labels.
// Cost: O(ticks).
// Method: Heckbert, "Nice numbers for graph labels", Graphics Gems I, 1990 (1-2-5 series).
#pragma once

#include <string>
#include <vector>

namespace cuspmap {

/// The smallest step of the form {1, 2, 5} x 10^k with span / step <= max_intervals.
/// @param[in] span           range to cover, > 0 and finite (otherwise returns 1)
/// @param[in] max_intervals  most intervals wanted, >= 1
double nice_step(double span, int max_intervals);

/// The multiples of nice_step(hi - lo, max_intervals) that lie in [lo, hi] (a tick within
/// 1e-9 of a step of an end counts as inside), ascending. lo == hi gives {lo}.
std::vector<double> nice_ticks(double lo, double hi, int max_intervals);

/// The largest {1, 2, 5} x 10^k that is <= max_length (> 0, finite; otherwise returns 0).
double nice_length_at_most(double max_length);

/// Decimals needed to show multiples of `step` exactly (0 for step >= 1; 2 for 0.05).
int decimals_for_step(double step);

/// `value` with `decimals` digits after the point ("0.25", "-3", "1200"), independent of the C
/// locale; -0 prints as 0; NaN prints as "nan".
std::string format_fixed(double value, int decimals);

/// `value` rounded to `digits` significant digits in fixed notation ("0.253", "12.5", "1250"),
/// locale-free; 0 prints as "0"; NaN as "nan".
std::string format_significant(double value, int digits);

}  // namespace cuspmap

// Text for one quantity in human output (terminal tables, summaries, HTML, SVG, captions): three
// significant figures, 0 below the quantity's resolution floor, and the unit --units chooses.
// Inputs in the core's units (mm, um, mm^2, mm^3, s); outputs locale-free strings. JSON and CSV
// never pass through here: they keep full precision. Method: ISO 80000-1 Annex B rounding to
// significant figures; 1 in = 25.4 mm exactly; ASME B46.1 inch cut-offs beside ISO 4288's mm.
#pragma once

#include <string>
#include <vector>

#include "core/units.h"

namespace cuspmap {

/// Significant figures of human output (DESIGN.md rule: inputs of a cusp estimate are rarely
/// known better than this).
inline constexpr int kDisplayDigits = 3;

/// `value` to `digits` significant figures, trailing zeros dropped ("0.966", "348", "7.39",
/// "2.5"); |value| < floor prints "0"; values >= 10^digits print as whole numbers ("1235").
/// NaN prints "nan". Locale-free.
std::string display_number(double value, double floor, int digits = kDisplayDigits);

/// A roughness or height (Ra, Sz, cusp, scratch depth): "0.966 um" (mm) or "38 uin" (in).
/// Below 1e-4 um (0.1 nm, far under any measurable mark) it prints 0.
std::string display_roughness(double um, LengthUnit unit);

/// A stock, allowance or tolerance: "25.7 um" (mm) or "1.01 thou" (in).
std::string display_stock(double um, LengthUnit unit);

/// A length (path, stepover, size, diameter): "348 mm" (mm) or "13.7 in" (in).
std::string display_length(double mm, LengthUnit unit);

/// A profile cut-off or other ISO filter wavelength: "0.8 mm" (mm), "0.8 mm (0.03 in)" (in,
/// the conventional inch value of ASME B46.1 for the ISO 4288 series, else 3 figures).
std::string display_cutoff(double mm, LengthUnit unit);

/// An area: "9600 mm^2" or "14.9 in^2".
std::string display_area(double mm2, LengthUnit unit);

/// A volume: "12.3 mm^3" or "0.000751 in^3".
std::string display_volume(double mm3, LengthUnit unit);

/// The unit a column of durations is shown in.
enum class TimeUnit {
  Second,  ///< "s"
  Minute,  ///< "min"
  Hour,    ///< "h"
};

/// The one unit for a column whose largest duration is `max_seconds`: s below 2 min, min below
/// 2 h, h beyond (so every entry of the column reads in the same unit).
TimeUnit time_unit_for(double max_seconds);

/// The largest of `seconds` through time_unit_for.
TimeUnit time_unit_for(const std::vector<double>& seconds);

/// Symbol of a time unit ("s", "min", "h").
const char* time_unit_symbol(TimeUnit unit);

/// A duration in a given unit, with its symbol: "7.39 s", "118 min", "2.34 h".
std::string display_time(double seconds, TimeUnit unit);

/// A lone duration in the unit time_unit_for picks for it.
std::string display_time(double seconds);

/// A duration in a given unit, number only (for a column whose header names the unit).
std::string display_time_number(double seconds, TimeUnit unit);

/// Symbol of the roughness unit: "um" or "uin".
const char* roughness_symbol(LengthUnit unit);

/// Symbol of the length unit: "mm" or "in".
const char* length_symbol(LengthUnit unit);

/// A roughness, number only, in roughness_symbol(unit).
std::string display_roughness_number(double um, LengthUnit unit);

/// A length, number only, in length_symbol(unit).
std::string display_length_number(double mm, LengthUnit unit);

}  // namespace cuspmap

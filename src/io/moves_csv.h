// Encodes a toolpath as CSV, one row per move (tip positions mm, feed mm/min, arc centre and
// direction), so a user can check any strategy's moves in a spreadsheet. Pure: returns the text.
// Method: RFC 4180 (LF line ends, no field needs quoting); numbers via std::to_chars (shortest
// round-trip, locale-independent).
#pragma once

#include <string>

#include "path/move.h"

namespace cuspmap {

/// Header row (units in the column names) then one row per move in execution order:
/// index, kind (line | arc_cw | arc_ccw), rapid (1 = G0), start_x_mm, start_y_mm, start_z_mm,
/// end_x_mm, end_y_mm, end_z_mm, centre_x_mm, centre_y_mm (empty for lines), length_mm,
/// feed_mm_per_min, source_line (G-code line, 0 for built-in strategies).
/// @param[in] path  any toolpath (empty: the header only)
std::string encode_moves_csv(const Toolpath& path);

}  // namespace cuspmap

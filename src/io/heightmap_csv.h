// CSV grid heightmaps: one line per row of cells, row 0 first (lowest Y, as in .npy), values
// separated by commas (or semicolons, tabs, spaces); NaN, nan, BAD or an empty field is an
// unreached cell; '#' starts a comment line. Heights as stored (cuspmap writes um).
// Inputs/outputs: Heightfield <-> text. Cost O(cells).
// Method: RFC 4180 field layout without quoting (numbers only).
#pragma once

#include <string>
#include <string_view>

#include "core/heightfield.h"

namespace cuspmap {

/// Encodes the grid: ny lines of nx comma-separated heights, shortest round-trip text, NaN as
/// "NaN", '\n' line ends, no header.
/// @param[in] hf heightfield; @return the text
std::string encode_csv_grid(const Heightfield& hf);

/// Decodes a CSV grid. The returned heightfield has cell_mm = 0 (the file does not say) and
/// origin 0.
/// @param[in] text the whole file; @param[in] name file name for messages
/// @throws InputError "<name>:<line>: <what>" for a non-number field, a row whose length differs
///         from the first row's, or a file without data
Heightfield decode_csv_grid(std::string_view text, const std::string& name);

}  // namespace cuspmap

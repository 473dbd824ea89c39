// ASCII X Y Z point lists on a regular square grid: one point per line (X and Y in mm, Z as
// stored, um for cuspmap's files), separated by blanks, commas or semicolons; '#' comments.
// The reader infers the cell from the coordinates and rejects points off the grid; grid
// positions without a point are unreached (NaN).
// Inputs/outputs: Heightfield <-> text. Cost O(points log points).
// Method: unique sorted coordinates, spacing = smallest gap, every coordinate an integer
// number of cells from the first.
#pragma once

#include <string>
#include <string_view>

#include "core/heightfield.h"

namespace cuspmap {

/// Grid positions may sit this many cells off an exact multiple (coordinates printed with 6
/// significant digits on a 1000-cell grid are off by up to 5e-4 cells).
inline constexpr double kXyzGridToleranceCells = 1e-3;

/// Encodes the finite cells as "x y z" lines (cell centres in mm, heights um); unreached cells
/// are left out.
/// @param[in] hf heightfield; @return the text
std::string encode_xyz(const Heightfield& hf);

/// Decodes a point list into a heightfield whose cell centres are the grid points.
/// @param[in] text the whole file; @param[in] name file name for messages
/// @throws InputError "<name>:<line>: <what>" for a line without exactly three numbers, a
///         duplicate point, a point off the regular grid, unequal X and Y spacing, or a file with
///         fewer than two distinct coordinates to infer the cell from
Heightfield decode_xyz(std::string_view text, const std::string& name);

}  // namespace cuspmap

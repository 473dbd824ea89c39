// Number tokens of text heightmaps (CSV grid, XYZ list, ASCII SDF): locale-free parsing that
// reads NaN spellings as unreached cells, and shortest round-trip formatting.
// Inputs: tokens; outputs: doubles / text. Cost O(length).
// Method: std::from_chars / std::to_chars (shortest representation that reads back exactly).
#pragma once

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

namespace cuspmap {

/// Most cells a heightmap file may declare (XYZ, SDF, X3P), checked in double before any
/// integer conversion or allocation: 2^28 cells = 1 GiB of float heights, a 16384 x 16384 scan,
/// beyond the frames of common areal instruments (common practice, no source) and far inside
/// int grid sides; a larger declaration is a damaged or hostile header, not a surface.
inline constexpr std::int64_t kMaxHeightmapCells = std::int64_t{1} << 28;

/// Parses one height token: a decimal number, or NaN / nan / BAD (ISO 25178-71's invalid
/// point) / an empty field, which give NaN.
/// @param[in] token text without surrounding blanks
/// @param[out] value the number or NaN
/// @return false when the token is neither a number nor a NaN spelling (or is infinite)
bool parse_height_value(std::string_view token, double& value);

/// Shortest text that reads back as the same float ("NaN" for NaN), locale-free.
std::string format_height(float value);
/// Shortest text that reads back as the same double, locale-free.
std::string format_coordinate(double value);

/// Splits a line into fields at commas, semicolons, tabs or runs of spaces; a comma- or
/// semicolon-separated line keeps empty fields (they read as NaN).
std::vector<std::string_view> split_fields(std::string_view line);

/// Splits text into lines (\n, \r\n or \r endings); the last line may lack an ending.
std::vector<std::string_view> split_lines(std::string_view text);

}  // namespace cuspmap

// Reads a heightmap file of any supported format into a Heightfield (um over mm cells), and
// encodes one into the format its file name asks for.
// Formats by extension, else by content: .npy (NumPy), .csv (grid), .xyz/.txt/.asc (X Y Z list),
// .sdf (ASCII SDF), .x3p (X3P). Cost O(file size).
// Method: dispatch only; each format's reader cites its standard.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/heightfield.h"

namespace cuspmap {

/// What to assume where the file is silent.
struct HeightmapReadOptions {
  std::optional<double> cell_mm;       ///< cell size for .npy and .csv (else report.json beside it)
  std::optional<std::string> z_units;  ///< unit of heights in .npy/.csv/.xyz: um (default), nm,
                                       ///< mm or m; SDF and X3P carry their own scale
};

/// A heightfield read from disk with where its cell size came from.
struct HeightmapFile {
  Heightfield field;        ///< heights um, cell mm
  std::string format;       ///< "npy", "csv", "xyz", "sdf" or "x3p"
  std::string cell_source;  ///< "--cell", "report.json", "file"
};

/// Reads `path`.
/// @param[in] path     file to read
/// @param[in] options  cell and z units where the format needs them
/// @throws InputError "<path>[:line]: <what>" when the file cannot be opened, its format is
///         unknown, it is malformed, the cell size is unknown (npy/csv without --cell or
///         report.json), --cell disagrees with a file that states its cell, --z-units is given
///         for SDF/X3P, or a value is not finite
HeightmapFile read_heightmap(const std::string& path, const HeightmapReadOptions& options);

/// Encodes `hf` in the format named by `path`'s extension (.npy, .csv, .xyz, .sdf, .x3p).
/// @throws InputError naming the path when the extension is none of those
std::string encode_heightmap(const Heightfield& hf, const std::string& path);

/// The bytes of a file.
/// @throws InputError "<path>: cannot open the file"
std::string read_all(const std::string& path);

/// Micrometres per unit of a --z-units value: um 1, nm 1e-3, mm 1e3, m 1e6.
/// @throws InputError naming the value when it is none of those
double z_units_to_um(const std::string& units);

}  // namespace cuspmap

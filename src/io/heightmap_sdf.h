// ASCII Surface Data File (SDF) heightmaps: header "aBCR-1.0" (also read: "aISO-1.0") with
// NumPoints, NumProfiles, Xscale, Yscale, Zscale in metres, then the points profile by profile
// (X fastest), '*' after each section; BAD (or NaN) marks an invalid point.
// Inputs/outputs: Heightfield (um, mm) <-> text. Cost O(cells).
// Method: ISO 25178-71:2012 (SDF, record 1 header keys, record 2 data, record 3 trailer);
// EUNA 15178 ("BCR" legacy magic).
#pragma once

#include <string>
#include <string_view>

#include "core/heightfield.h"

namespace cuspmap {

/// Encodes the heightfield as ASCII SDF: aBCR-1.0, Xscale = Yscale = cell in m, Zscale = 1e-6
/// (values written in um), DataType 7 (double), unreached cells as BAD, empty trailer.
/// @param[in] hf heightfield (nx, ny <= 65535, the format's limit)
/// @throws InputError when a dimension exceeds 65535
std::string encode_sdf(const Heightfield& hf);

/// Decodes an ASCII SDF into heights in um over square cells in mm (origin 0).
/// @param[in] text whole file; @param[in] name file name for messages
/// @throws InputError "<name>:<line>: <what>" for a bad magic (binary SDF is not read), a missing
///         or malformed header key, Compression other than 0, unequal X and Y scales, or a data
///         count other than NumPoints x NumProfiles
Heightfield decode_sdf(std::string_view text, const std::string& name);

}  // namespace cuspmap

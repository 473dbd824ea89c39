// X3P heightmaps (ISO 25178-72 / ISO 5436-2 XML format): a zip holding main.xml (axes, matrix
// size, data link, MD5 of the point data), bindata/data.bin (little-endian points, X fastest)
// and md5checksum.hex (MD5 of main.xml). Lengths in the file are metres.
// Inputs/outputs: Heightfield (um over mm cells) <-> zip bytes. Cost O(cells).
// Method: ISO 25178-72:2017 (X3P), ISO 5436-2:2012 (main.xml records 1-4); zip via libzip,
// XML via pugixml, MD5 per RFC 1321.
#pragma once

#include <string>
#include <string_view>

#include "core/heightfield.h"

namespace cuspmap {

/// Encodes an X3P: feature type SUR, CX/CY incremental axes with Increment = cell in m, CZ
/// absolute with DataType D (float64 metres), unreached cells stored as NaN, MD5 checksums of
/// data.bin (in main.xml) and of main.xml (md5checksum.hex).
/// @param[in] hf heightfield; @return the zip file's bytes
/// @throws std::runtime_error (internal error) if libzip fails in memory
std::string encode_x3p(const Heightfield& hf);

/// Decodes an X3P surface (SUR) with binary point data of type I, L, F or D.
/// @param[in] bytes whole file; @param[in] name file name for messages
/// @return heights in um (value * CZ increment + offset, metres -> um), cell in mm, origin from
///         the CX/CY offsets
/// @throws InputError "<name>: <what>" for a non-zip file, a missing or malformed main.xml, a
///         feature type other than SUR, inline XML point lists, unequal X/Y increments, a
///         data.bin of the wrong size, or an MD5 that does not match the data
Heightfield decode_x3p(std::string_view bytes, const std::string& name);

}  // namespace cuspmap

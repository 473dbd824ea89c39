// NumPy .npy encoding and decoding of height grids: float32 C-order v1.0 out; float32/float64,
// either byte order, C order, 1-D or 2-D, format versions 1.0-3.0 in.
// Inputs/outputs: rows along Y (row 0 at the lowest Y), heights as stored (um for cuspmap's own
// files); NaN stays NaN. Cost O(cells).
// Method: NumPy Enhancement Proposal 1 / numpy.lib.format ("A Simple File Format for NumPy
// Arrays": magic, version, little-endian header length, Python-literal header dict, data).
#pragma once

#include <string>
#include <string_view>

#include "core/heightfield.h"

namespace cuspmap {

/// Encodes the heights as a version 1.0 .npy: dtype '<f4', fortran_order False, shape (ny, nx),
/// header padded with spaces to a multiple of 64 bytes and ended by '\n'.
/// @param[in] hf heightfield (um); NaN cells are written as NaN
/// @return the file's bytes
std::string encode_npy(const Heightfield& hf);

/// Decodes a .npy holding a 1-D (one row) or 2-D float array.
/// @param[in] bytes  the whole file
/// @param[in] name   file name for error messages
/// @return ny x nx grid of the stored values (as float)
/// @throws InputError "<name>: <what is wrong>" for a bad magic, header, dtype (only float32 and
///         float64 are read), Fortran order, a shape of other rank, or a size mismatch
HeightGrid decode_npy(std::string_view bytes, const std::string& name);

}  // namespace cuspmap

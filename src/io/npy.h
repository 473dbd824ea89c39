// NumPy .npy encoding and decoding of height grids: float32 C-order v1.0 out; float32/float64,
// either byte order, C order, 1-D or 2-D, format versions 1.0-3.0 in.
// Inputs/outputs: rows along Y (row 0 at the lowest Y), heights as stored (um for cuspmap's own
// files); NaN stays NaN. Cost O(cells).
// Method: NumPy Enhancement Proposal 1 / numpy.lib.format ("A Simple File Format for NumPy
// Arrays": magic, version, little-endian header length, Python-literal header dict, data).
#pragma once

#include <cstdint>
#include <string>
#include <string_view>
#include <vector>

#include "core/heightfield.h"

namespace cuspmap {

/// Encodes the heights as a version 1.0 .npy: dtype '<f4', fortran_order False, shape (ny, nx),
/// header padded with spaces to a multiple of 64 bytes and ended by '\n'.
/// @param[in] hf heightfield (um); NaN cells are written as NaN
/// @return the file's bytes
std::string encode_npy(const Heightfield& hf);

/// The part of encode_npy before the data: magic, version 1.0, header length and the dict
/// {'descr': '<f4', 'fortran_order': False, 'shape': (ny, nx), } padded to 64 bytes.
/// @param[in] ny, nx  rows (along Y) and columns (along X), >= 0
/// @return the header bytes; encode_npy(hf) == encode_npy_header(hf.ny, hf.nx) + the values
std::string encode_npy_header(std::int64_t ny, std::int64_t nx);

/// Appends heights as the .npy data: little-endian float32, in the order given (row-major rows
/// of a Heightfield, row 0 first), NaN kept.
/// @param[in] z_um    `count` heights, um
/// @param[in] count   number of values
/// @param[out] out    bytes appended (4 per value)
void append_npy_values(const float* z_um, std::int64_t count, std::string& out);

/// The file encode_npy would write, as views: the header (kept in `header`) and the grid's own
/// memory on a little-endian host (no copy of the values; else a byte-swapped copy kept in
/// `swapped`). The views live as long as hf, header and swapped.
/// @param[in]  hf       heightfield (um)
/// @param[out] header   storage for the header bytes
/// @param[out] swapped  storage for the values on a big-endian host (untouched otherwise)
/// @return the parts in file order; their concatenation == encode_npy(hf)
std::vector<std::string_view> npy_file_parts(const Heightfield& hf, std::string& header,
                                             std::string& swapped);

/// Size of the file encode_npy writes for an ny x nx grid: header + 4 nx ny bytes.
std::int64_t npy_file_bytes(std::int64_t ny, std::int64_t nx);

/// Decodes a .npy holding a 1-D (one row) or 2-D float array.
/// @param[in] bytes  the whole file
/// @param[in] name   file name for error messages
/// @return ny x nx grid of the stored values (as float)
/// @throws InputError "<name>: <what is wrong>" for a bad magic, header, dtype (only float32 and
///         float64 are read), Fortran order, a shape of other rank, or a size mismatch
HeightGrid decode_npy(std::string_view bytes, const std::string& name);

}  // namespace cuspmap

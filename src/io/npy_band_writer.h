// height.npy of a floor that arrives in bands: the header first, then each band's rows as they
// come, through an AtomicFileStream, so the file equals encode_npy of the whole floor byte for
// byte while memory holds one band plus a 1 MiB encoding buffer. Cost O(cells) + disk writes.
// Method: numpy.lib.format v1.0 (NEP 1): C-order data follows the header, row 0 first.
#pragma once

#include <cstdint>
#include <string>

#include "core/atomic_file_stream.h"
#include "core/heightfield.h"

namespace cuspmap {

/// Writes an ny x nx float32 .npy band by band; the file appears only on commit().
class NpyBandWriter {
 public:
  /// Opens the temp file and writes the header.
  /// @param[in] path    destination (its folder must exist)
  /// @param[in] nx, ny  grid columns and rows of the whole floor, >= 1
  /// @throws std::runtime_error when the file cannot be opened or written
  NpyBandWriter(const std::string& path, int nx, int ny);

  /// Appends a band: rows j0 .. j0 + band.ny - 1 of the floor (um, NaN = unreached). Bands must
  /// come in order, each starting where the last ended, with band.nx == nx.
  /// @throws std::runtime_error when the disk refuses (the temp file is removed)
  void append(const Heightfield& band, int j0);

  /// Publishes the file (fsync, rename). All ny rows must have been appended.
  void commit();

  /// Rows appended so far.
  int rows_written() const { return next_row_; }

 private:
  AtomicFileStream file_;
  int nx_, ny_;
  int next_row_ = 0;
  std::string buffer_;  // encoding buffer, reused
};

}  // namespace cuspmap

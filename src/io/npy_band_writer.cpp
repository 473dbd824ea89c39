// Band-by-band .npy writer: header, then bands encoded in 1 MiB pieces and appended in order.
// Inputs: bands (um); output: height.npy identical to encode_npy of the whole floor.
// Method: see npy_band_writer.h.
#include "io/npy_band_writer.h"

#include <algorithm>
#include <cassert>

#include "io/npy.h"

namespace cuspmap {
namespace {

// Values encoded per write: 1 MiB of float32, large enough that write(2) calls are few (a 64 MiB
// band takes 64), small enough that the copy never matters next to the band.
constexpr std::int64_t kValuesPerWrite = std::int64_t{1} << 18;

}  // namespace

NpyBandWriter::NpyBandWriter(const std::string& path, int nx, int ny)
    : file_(path), nx_(nx), ny_(ny) {
  assert(nx >= 1 && ny >= 1 && "a floor has at least one cell");
  file_.append(encode_npy_header(ny, nx));
}

void NpyBandWriter::append(const Heightfield& band, [[maybe_unused]] int j0) {
  assert(band.nx == nx_ && j0 == next_row_ && j0 + band.ny <= ny_ &&
         "bands arrive whole-row, in order, without gaps");
  // Band rows are stored row-major, row 0 (lowest Y) first: the .npy's C order.
  const float* z = band.z_um.data();
  const std::int64_t count = band.cells();
  for (std::int64_t k = 0; k < count; k += kValuesPerWrite) {
    buffer_.clear();
    append_npy_values(z + k, std::min(kValuesPerWrite, count - k), buffer_);
    file_.append(buffer_);
  }
  next_row_ += band.ny;
}

void NpyBandWriter::commit() {
  assert(next_row_ == ny_ && "every row appended before the file is published");
  file_.commit();
}

}  // namespace cuspmap

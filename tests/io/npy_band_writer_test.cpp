// height.npy written band by band equals encode_npy of the whole grid byte for byte; an
// abandoned writer leaves nothing. Source: numpy.lib.format (NEP 1): C-order data directly after
// the 64-byte-aligned v1.0 header, so rows appended in order reproduce the whole array's bytes.
#include "io/npy_band_writer.h"

#include <cmath>

#include "io/npy.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

// 7 rows x 5 columns, values k/4 - 3 (exact in float) with two NaN cells:
//   row 6  . . . . .
//   ...
//   row 2  . . N . .
//   row 0  . . . . N
Heightfield grid_7x5() {
  Heightfield hf;
  hf.nx = 5;
  hf.ny = 7;
  hf.cell_mm = 0.02;
  hf.z_um.resize(7, 5);
  for (int k = 0; k < 35; ++k) hf.z_um.data()[k] = 0.25f * static_cast<float>(k) - 3.0f;
  hf.z_um(0, 4) = kUnreached;
  hf.z_um(2, 2) = kUnreached;
  return hf;
}

Heightfield rows_of(const Heightfield& hf, int j0, int rows) {
  Heightfield band = hf;
  band.ny = rows;
  band.origin_y_mm = hf.origin_y_mm + j0 * hf.cell_mm;
  band.z_um = hf.z_um.middleRows(j0, rows);
  return band;
}

}  // namespace

TEST_CASE("encode_npy_header: the header plus the values is encode_npy", "[io]") {
  const Heightfield hf = grid_7x5();
  std::string split = encode_npy_header(hf.ny, hf.nx);
  CHECK(split.size() % 64 == 0);  // NEP 1: data starts on a 64-byte boundary
  append_npy_values(hf.z_um.data(), hf.cells(), split);
  CHECK(split == encode_npy(hf));
  CHECK(npy_file_bytes(hf.ny, hf.nx) == static_cast<std::int64_t>(split.size()));
  // 100 x 100 mm at 5 um: 20000 x 20000 cells; header 128 bytes (10 + dict padded to 64).
  CHECK(npy_file_bytes(20000, 20000) == 128 + std::int64_t{4} * 20000 * 20000);
}

TEST_CASE("NpyBandWriter: bands of uneven height give encode_npy's bytes", "[io]") {
  const Heightfield hf = grid_7x5();
  test::TempDir dir;
  const std::string path = dir.file("height.npy");
  {
    NpyBandWriter writer(path, hf.nx, hf.ny);
    writer.append(rows_of(hf, 0, 3), 0);
    writer.append(rows_of(hf, 3, 1), 3);
    writer.append(rows_of(hf, 4, 3), 4);
    CHECK(writer.rows_written() == 7);
    CHECK(dir.list().size() == 1);  // only the temp name so far
    CHECK(dir.list()[0] != "height.npy");
    writer.commit();
  }
  CHECK(test::read_text(path) == encode_npy(hf));
  CHECK(dir.list() == std::vector<std::string>{"height.npy"});
  const HeightGrid back = decode_npy(test::read_text(path), "height.npy");
  CHECK(std::isnan(back(2, 2)));
  CHECK(back(6, 4) == 0.25f * 34.0f - 3.0f);
}

TEST_CASE("NpyBandWriter: a run that stops before commit leaves no file", "[io]") {
  const Heightfield hf = grid_7x5();
  test::TempDir dir;
  {
    NpyBandWriter writer(dir.file("height.npy"), hf.nx, hf.ny);
    writer.append(rows_of(hf, 0, 3), 0);
  }
  CHECK(dir.list().empty());
}

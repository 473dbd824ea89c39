// .npy round trip and malformed files.
// Source: numpy.lib.format (NEP 1): magic "\x93NUMPY", version 1.0, 2-byte little-endian header
// length, header padded so the data starts on a 64-byte boundary.
#include "io/npy.h"

#include <bit>
#include <cmath>
#include <cstring>

#include "core/input_error.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

Heightfield sample_field() {
  Heightfield hf;
  hf.nx = 4;
  hf.ny = 3;
  hf.cell_mm = 0.01;
  hf.z_um.resize(3, 4);
  for (int k = 0; k < 12; ++k) hf.z_um.data()[k] = 0.25f * static_cast<float>(k) - 1.0f;
  hf.z_um(1, 2) = kUnreached;
  return hf;
}

// A v1.0 file with the given header dict and raw data.
std::string npy_file(const std::string& dict, const std::string& data) {
  std::string header = dict;
  while ((10 + header.size() + 1) % 64 != 0) header += ' ';
  header += '\n';
  std::string out = "\x93NUMPY";
  out += '\x01';
  out += '\x00';
  out += static_cast<char>(header.size() & 0xff);
  out += static_cast<char>(header.size() >> 8);
  return out + header + data;
}

}  // namespace

TEST_CASE("encode_npy: v1.0 header, 64-byte aligned, float32 rows along Y", "[io]") {
  const std::string bytes = encode_npy(sample_field());
  REQUIRE(bytes.substr(0, 8) == std::string("\x93NUMPY\x01\x00", 8));
  const size_t header_len =
      static_cast<unsigned char>(bytes[8]) | (static_cast<unsigned char>(bytes[9]) << 8);
  REQUIRE((10 + header_len) % 64 == 0);
  REQUIRE(bytes.find("'descr': '<f4', 'fortran_order': False, 'shape': (3, 4), }") !=
          std::string::npos);
  REQUIRE(bytes.size() == 10 + header_len + 12 * 4);
  float first = 0.0f;
  std::memcpy(&first, bytes.data() + 10 + header_len, 4);
  REQUIRE(first == -1.0f);
}

TEST_CASE("npy_file_parts: the parts joined are encode_npy's file, values not copied", "[io]") {
  const Heightfield hf = sample_field();
  std::string header, swapped;
  const std::vector<std::string_view> parts = npy_file_parts(hf, header, swapped);
  std::string joined;
  for (std::string_view part : parts) joined += part;
  REQUIRE(joined == encode_npy(hf));
  REQUIRE(parts.size() == 2);
  if constexpr (std::endian::native == std::endian::little) {
    CHECK(parts[1].data() == reinterpret_cast<const char*>(hf.z_um.data()));  // a view, no copy
  }
}

TEST_CASE("decode_npy: round trip keeps values and NaN", "[io]") {
  const Heightfield hf = sample_field();
  const HeightGrid back = decode_npy(encode_npy(hf), "a.npy");
  REQUIRE(back.rows() == 3);
  REQUIRE(back.cols() == 4);
  for (int k = 0; k < 12; ++k) {
    CAPTURE(k);
    if (k == 6) {
      REQUIRE(std::isnan(back.data()[k]));
    } else {
      REQUIRE(back.data()[k] == hf.z_um.data()[k]);
    }
  }
}

TEST_CASE("decode_npy: float64 and 1-D arrays", "[io]") {
  std::string data(16, '\0');
  const double v[2] = {1.5, -2.25};
  std::memcpy(data.data(), v, 16);
  const HeightGrid g = decode_npy(
      npy_file("{'descr': '<f8', 'fortran_order': False, 'shape': (2,), }", data), "p.npy");
  REQUIRE(g.rows() == 1);
  REQUIRE(g.cols() == 2);
  REQUIRE(g(0, 1) == -2.25f);
}

TEST_CASE("decode_npy: malformed files give one-line errors", "[io]") {
  REQUIRE_THROWS_WITH(decode_npy("hello world", "x.npy"),
                      "x.npy: not a .npy file (it does not start with \\x93NUMPY)");
  REQUIRE_THROWS_WITH(
      decode_npy(npy_file("{'descr': '<i4', 'fortran_order': False, 'shape': (1, 1), }", "abcd"),
                 "x.npy"),
      "x.npy: npy dtype '<i4' is not supported; expected float32 or float64 ('<f4', '<f8')");
  REQUIRE_THROWS_WITH(
      decode_npy(npy_file("{'descr': '<f4', 'fortran_order': True, 'shape': (1, 1), }", "abcd"),
                 "x.npy"),
      "x.npy: npy fortran_order True is not supported; save the array in C order");
  REQUIRE_THROWS_WITH(
      decode_npy(npy_file("{'descr': '<f4', 'fortran_order': False, 'shape': (1, 1, 1), }", "abcd"),
                 "x.npy"),
      "x.npy: npy array has 3 dimensions; expected 1 (a profile) or 2 (rows along Y)");
  REQUIRE_THROWS_WITH(
      decode_npy(npy_file("{'descr': '<f4', 'fortran_order': False, 'shape': (2, 2), }", "abcd"),
                 "x.npy"),
      "x.npy: npy data holds 4 bytes, the header's shape needs 16");
}

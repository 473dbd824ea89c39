// .npy encoder (float32, v1.0) and decoder (float32/float64, v1-3, C order).
// Inputs/outputs: heightfield grids; file bytes. Cost O(cells).
// Method: numpy.lib.format specification (NEP 1).
#include "io/npy.h"

#include <bit>
#include <charconv>
#include <cstdint>
#include <cstring>
#include <vector>

#include "core/input_error.h"

namespace cuspmap {
namespace {

constexpr char kMagic[] = "\x93NUMPY";
constexpr size_t kMagicLen = 6;
// numpy pads the header so the data starts on a 64-byte boundary (numpy >= 1.9 convention).
constexpr size_t kHeaderAlign = 64;

template <typename T>
T load_le(const char* p, bool big_endian) {
  T v;
  std::memcpy(&v, p, sizeof(T));
  const bool swap = big_endian != (std::endian::native == std::endian::big);
  if (swap) {
    char b[sizeof(T)];
    std::memcpy(b, &v, sizeof(T));
    for (size_t i = 0; i < sizeof(T) / 2; ++i) std::swap(b[i], b[sizeof(T) - 1 - i]);
    std::memcpy(&v, b, sizeof(T));
  }
  return v;
}

// Value text after 'key': in the header dict, up to the next ',' at depth 0 or '}'.
std::string_view dict_value(std::string_view header, std::string_view key,
                            const std::string& name) {
  // Built by appending: GCC 12 warns falsely (-Wrestrict) on "'" + std::string(...).
  std::string quoted1(1, '\''), quoted2(1, '"');
  quoted1.append(key).push_back('\'');
  quoted2.append(key).push_back('"');
  size_t at = header.find(quoted1);
  if (at == std::string_view::npos) at = header.find(quoted2);
  if (at == std::string_view::npos) {
    throw InputError(name + ": npy header has no '" + std::string(key) + "' entry");
  }
  size_t p = header.find(':', at);
  if (p == std::string_view::npos)
    throw InputError(name + ": npy header is malformed near '" + std::string(key) + "'");
  ++p;
  int depth = 0;
  size_t end = p;
  for (; end < header.size(); ++end) {
    const char c = header[end];
    if (c == '(' || c == '[') ++depth;
    if (c == ')' || c == ']') --depth;
    if (depth == 0 && (c == ',' || c == '}')) break;
  }
  std::string_view v = header.substr(p, end - p);
  while (!v.empty() && (v.front() == ' ')) v.remove_prefix(1);
  while (!v.empty() && (v.back() == ' ')) v.remove_suffix(1);
  return v;
}

std::vector<long> parse_shape(std::string_view v, const std::string& name) {
  if (v.size() < 2 || v.front() != '(' || v.back() != ')') {
    throw InputError(name + ": npy shape '" + std::string(v) + "' is not a tuple");
  }
  std::vector<long> dims;
  std::string_view s = v.substr(1, v.size() - 2);
  while (!s.empty()) {
    while (!s.empty() && (s.front() == ' ' || s.front() == ',')) s.remove_prefix(1);
    if (s.empty()) break;
    long d = 0;
    const auto [ptr, ec] = std::from_chars(s.data(), s.data() + s.size(), d);
    if (ec != std::errc() || d < 0) {
      throw InputError(name + ": npy shape '" + std::string(v) + "' is not a tuple of sizes");
    }
    dims.push_back(d);
    s.remove_prefix(static_cast<size_t>(ptr - s.data()));
  }
  return dims;
}

}  // namespace

std::string encode_npy_header(std::int64_t ny, std::int64_t nx) {
  std::string header = "{'descr': '<f4', 'fortran_order': False, 'shape': (" +
                       std::to_string(ny) + ", " + std::to_string(nx) + "), }";
  const size_t preamble = kMagicLen + 2 + 2;
  const size_t total = preamble + header.size() + 1;
  header.append((kHeaderAlign - total % kHeaderAlign) % kHeaderAlign, ' ');
  header += '\n';
  std::string out(kMagic, kMagicLen);
  out += '\x01';
  out += '\x00';
  out += static_cast<char>(header.size() & 0xff);
  out += static_cast<char>((header.size() >> 8) & 0xff);
  out += header;
  return out;
}

void append_npy_values(const float* z_um, std::int64_t count, std::string& out) {
  const size_t start = out.size();
  out.resize(start + static_cast<size_t>(count) * 4);
  char* p = out.data() + start;
  for (std::int64_t k = 0; k < count; ++k) {
    // Byte by byte: little-endian whatever the host's order.
    const std::uint32_t bits = std::bit_cast<std::uint32_t>(z_um[k]);
    for (int b = 0; b < 4; ++b) *p++ = static_cast<char>((bits >> (8 * b)) & 0xff);
  }
}

std::int64_t npy_file_bytes(std::int64_t ny, std::int64_t nx) {
  return static_cast<std::int64_t>(encode_npy_header(ny, nx).size()) + 4 * ny * nx;
}

std::vector<std::string_view> npy_file_parts(const Heightfield& hf, std::string& header,
                                             std::string& swapped) {
  header = encode_npy_header(hf.ny, hf.nx);
  std::vector<std::string_view> parts{header};
  const auto bytes = static_cast<std::size_t>(hf.cells()) * 4;
  if constexpr (std::endian::native == std::endian::little) {
    // IEEE float32 in the host's (little-endian) order is already the file's byte order.
    parts.emplace_back(reinterpret_cast<const char*>(hf.z_um.data()), bytes);
  } else {
    swapped.clear();
    append_npy_values(hf.z_um.data(), hf.cells(), swapped);
    parts.emplace_back(swapped);
  }
  return parts;
}

std::string encode_npy(const Heightfield& hf) {
  std::string out = encode_npy_header(hf.ny, hf.nx);
  out.reserve(out.size() + static_cast<size_t>(hf.cells()) * 4);
  append_npy_values(hf.z_um.data(), hf.cells(), out);
  return out;
}

HeightGrid decode_npy(std::string_view bytes, const std::string& name) {
  if (bytes.size() < kMagicLen + 4 ||
      bytes.substr(0, kMagicLen) != std::string_view(kMagic, kMagicLen)) {
    throw InputError(name + ": not a .npy file (it does not start with \\x93NUMPY)");
  }
  const int major = static_cast<unsigned char>(bytes[kMagicLen]);
  size_t header_len = 0, header_start = 0;
  if (major == 1) {
    header_len = static_cast<unsigned char>(bytes[8]) |
                 (static_cast<size_t>(static_cast<unsigned char>(bytes[9])) << 8);
    header_start = 10;
  } else if (major == 2 || major == 3) {
    if (bytes.size() < 12) throw InputError(name + ": npy header is truncated");
    header_len = 0;
    for (int b = 0; b < 4; ++b)
      header_len |=
          static_cast<size_t>(static_cast<unsigned char>(bytes[8 + static_cast<size_t>(b)]))
          << (8 * b);
    header_start = 12;
  } else {
    throw InputError(name + ": npy format version " + std::to_string(major) +
                     " is not supported (1, 2 or 3)");
  }
  if (bytes.size() < header_start + header_len)
    throw InputError(name + ": npy header is truncated");
  const std::string_view header = bytes.substr(header_start, header_len);
  const std::string_view descr = dict_value(header, "descr", name);
  const std::string_view order = dict_value(header, "fortran_order", name);
  const std::vector<long> dims = parse_shape(dict_value(header, "shape", name), name);
  size_t item = 0;
  bool big = false;
  const std::string d(descr);
  if (d == "'<f4'" || d == "'=f4'" || d == "\"<f4\"")
    item = 4;
  else if (d == "'<f8'" || d == "'=f8'" || d == "\"<f8\"")
    item = 8;
  else if (d == "'>f4'" || d == "\">f4\"") {
    item = 4;
    big = true;
  } else if (d == "'>f8'" || d == "\">f8\"") {
    item = 8;
    big = true;
  } else {
    throw InputError(name + ": npy dtype " + d +
                     " is not supported; expected float32 or float64 ('<f4', '<f8')");
  }
  if (order != "False") {
    throw InputError(name + ": npy fortran_order " + std::string(order) +
                     " is not supported; save the array in C order");
  }
  if (dims.empty() || dims.size() > 2) {
    throw InputError(name + ": npy array has " + std::to_string(dims.size()) +
                     " dimensions; expected 1 (a profile) or 2 (rows along Y)");
  }
  const long ny = dims.size() == 2 ? dims[0] : 1, nx = dims.back();
  if (nx < 1 || ny < 1) throw InputError(name + ": npy array is empty");
  const size_t data_start = header_start + header_len;
  const size_t need = static_cast<size_t>(nx) * static_cast<size_t>(ny) * item;
  if (bytes.size() - data_start != need) {
    throw InputError(name + ": npy data holds " + std::to_string(bytes.size() - data_start) +
                     " bytes, the header's shape needs " + std::to_string(need));
  }
  HeightGrid grid(ny, nx);
  const char* p = bytes.data() + data_start;
  if (item == 4 && !big && std::endian::native == std::endian::little) {
    std::memcpy(grid.data(), p, need);  // the common file: the bytes are the floats
    return grid;
  }
  for (long k = 0; k < nx * ny; ++k) {
    grid.data()[k] = item == 4 ? load_le<float>(p + k * 4, big)
                               : static_cast<float>(load_le<double>(p + k * 8, big));
  }
  return grid;
}

}  // namespace cuspmap

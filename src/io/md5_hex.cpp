// MD5 (RFC 1321): 512-bit blocks, four rounds of 16 operations, little-endian words.
// Input: bytes; output: hex digest. Cost O(bytes).
// Method: RFC 1321 §3 (padding, length, the per-round shifts and sine-derived constants).
#include "io/md5_hex.h"

#include <array>
#include <cmath>
#include <cstdint>

namespace cuspmap {
namespace {

constexpr std::array<std::uint32_t, 64> kShift = {
    7,  12, 17, 22, 7,  12, 17, 22, 7,  12, 17, 22, 7,  12, 17, 22, 5,  9,  14, 20, 5,  9,
    14, 20, 5,  9,  14, 20, 5,  9,  14, 20, 4,  11, 16, 23, 4,  11, 16, 23, 4,  11, 16, 23,
    4,  11, 16, 23, 6,  10, 15, 21, 6,  10, 15, 21, 6,  10, 15, 21, 6,  10, 15, 21};

// T[i] = floor(2^32 |sin(i + 1)|), RFC 1321 §3.4.
std::array<std::uint32_t, 64> sine_table() {
  std::array<std::uint32_t, 64> t{};
  for (int i = 0; i < 64; ++i) {
    t[static_cast<size_t>(i)] =
        static_cast<std::uint32_t>(std::floor(std::abs(std::sin(i + 1.0)) * 4294967296.0));
  }
  return t;
}

std::uint32_t rotl(std::uint32_t x, std::uint32_t c) { return (x << c) | (x >> (32 - c)); }

void block(const unsigned char* p, std::array<std::uint32_t, 4>& h,
           const std::array<std::uint32_t, 64>& t) {
  std::uint32_t m[16];
  for (int i = 0; i < 16; ++i) {
    m[i] = static_cast<std::uint32_t>(p[4 * i]) | (static_cast<std::uint32_t>(p[4 * i + 1]) << 8) |
           (static_cast<std::uint32_t>(p[4 * i + 2]) << 16) |
           (static_cast<std::uint32_t>(p[4 * i + 3]) << 24);
  }
  std::uint32_t a = h[0], b = h[1], c = h[2], d = h[3];
  for (std::uint32_t i = 0; i < 64; ++i) {
    std::uint32_t f = 0, g = 0;
    if (i < 16) {
      f = (b & c) | (~b & d);
      g = i;
    } else if (i < 32) {
      f = (d & b) | (~d & c);
      g = (5 * i + 1) % 16;
    } else if (i < 48) {
      f = b ^ c ^ d;
      g = (3 * i + 5) % 16;
    } else {
      f = c ^ (b | ~d);
      g = (7 * i) % 16;
    }
    const std::uint32_t tmp = d;
    d = c;
    c = b;
    b = b + rotl(a + f + t[i] + m[g], kShift[i]);
    a = tmp;
  }
  h[0] += a;
  h[1] += b;
  h[2] += c;
  h[3] += d;
}

}  // namespace

std::string md5_hex(std::string_view bytes) {
  static const std::array<std::uint32_t, 64> t = sine_table();
  std::array<std::uint32_t, 4> h = {0x67452301u, 0xefcdab89u, 0x98badcfeu, 0x10325476u};
  const auto* data = reinterpret_cast<const unsigned char*>(bytes.data());
  const size_t n = bytes.size();
  size_t k = 0;
  for (; k + 64 <= n; k += 64) block(data + k, h, t);
  // Padding: 0x80, zeros to 56 mod 64, then the bit length as a little-endian 64-bit number.
  unsigned char tail[128] = {};
  const size_t rest = n - k;
  for (size_t i = 0; i < rest; ++i) tail[i] = data[k + i];
  tail[rest] = 0x80;
  const size_t tail_len = rest < 56 ? 64 : 128;
  const std::uint64_t bits = static_cast<std::uint64_t>(n) * 8u;
  for (int i = 0; i < 8; ++i)
    tail[tail_len - 8 + static_cast<size_t>(i)] = static_cast<unsigned char>(bits >> (8 * i));
  block(tail, h, t);
  if (tail_len == 128) block(tail + 64, h, t);
  static constexpr char kHex[] = "0123456789abcdef";
  std::string out;
  for (std::uint32_t word : h) {
    for (int i = 0; i < 4; ++i) {
      const unsigned byte = (word >> (8 * i)) & 0xffu;
      out += kHex[byte >> 4];
      out += kHex[byte & 0xf];
    }
  }
  return out;
}

}  // namespace cuspmap

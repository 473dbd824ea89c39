// RFC 4648 base64 encoder (standard alphabet, padded, unwrapped).
// Inputs: bytes; output: ASCII text of length 4 ceil(n / 3).
// Method: RFC 4648 sec. 4, 24-bit groups to four 6-bit indices.
#include "report/base64.h"

namespace cuspmap {
namespace {

constexpr char kAlphabet[] = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";

}  // namespace

std::string base64_encode(std::string_view bytes) {
  std::string out;
  out.reserve((bytes.size() + 2) / 3 * 4);
  std::size_t k = 0;
  for (; k + 3 <= bytes.size(); k += 3) {
    const unsigned group = (static_cast<unsigned char>(bytes[k]) << 16) |
                           (static_cast<unsigned char>(bytes[k + 1]) << 8) |
                           static_cast<unsigned char>(bytes[k + 2]);
    out += kAlphabet[(group >> 18) & 63];
    out += kAlphabet[(group >> 12) & 63];
    out += kAlphabet[(group >> 6) & 63];
    out += kAlphabet[group & 63];
  }
  const std::size_t rest = bytes.size() - k;
  if (rest == 0) return out;
  unsigned group = static_cast<unsigned char>(bytes[k]) << 16;
  if (rest == 2) group |= static_cast<unsigned char>(bytes[k + 1]) << 8;
  out += kAlphabet[(group >> 18) & 63];
  out += kAlphabet[(group >> 12) & 63];
  out += rest == 2 ? kAlphabet[(group >> 6) & 63] : '=';
  out += '=';
  return out;
}

}  // namespace cuspmap

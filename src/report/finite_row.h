// Whether every value of a float row is finite, with one exponent test per value and no branch
// (an exponent field of all ones, NaN or infinity, carries into the sign bit), so that the loop
// vectorises; the pictures' fast paths take rows with no unreached cell.
// Method: IEEE 754 binary32 layout (exponent bits 23-30).
#pragma once

#include <cstdint>
#include <cstring>

namespace cuspmap {

/// True when none of row[0 .. n) is NaN or infinite (same answer as std::isfinite per value).
inline bool row_all_finite(const float* row, int n) {
  std::uint32_t carry = 0;
  for (int i = 0; i < n; ++i) {
    std::uint32_t bits;
    std::memcpy(&bits, row + i, sizeof bits);
    carry |= (bits & 0x7f800000u) + 0x00800000u;
  }
  return (carry & 0x80000000u) == 0;
}

}  // namespace cuspmap

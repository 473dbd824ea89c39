// The shop profile file `calibrate` writes and `--shop` reads: a small TOML document holding the
// fitted roughness correction (finish/shop_calibration.h), its uncertainty and provenance.
// Values in um; numbers written in shortest round-trip form (std::to_chars), locale-free.
// Method: TOML v1.0 (toml++ 3.3 to read); keys documented in docs/calibration.md.
#pragma once

#include <string>
#include <string_view>

#include "finish/shop_calibration.h"

namespace cuspmap {

/// A shop profile: the correction and where it came from.
struct ShopProfile {
  ShopCalibration ra;       ///< correction of Ra (kinematic -> measured), um
  std::string source;       ///< measurements file it was fitted from (as given)
  std::string created;      ///< date written, YYYY-MM-DD (empty = not stated)
};

/// Encodes a profile as TOML text (pure; the caller writes it atomically).
std::string encode_shop_profile(const ShopProfile& profile);

/// Parses a profile written by encode_shop_profile (or by hand with the same keys).
/// @throws InputError naming file:line:col and the key on a syntax error, an unknown key, a
///         missing value, or a value out of range (scale <= 0, negative standard errors).
ShopProfile parse_shop_profile(std::string_view text, const std::string& file_name);

/// Reads and parses a profile file.
/// @throws InputError when the file cannot be read, or as parse_shop_profile.
ShopProfile read_shop_profile(const std::string& path);

}  // namespace cuspmap

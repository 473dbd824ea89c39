// Base64 encoding of binary data (PNG bytes) for data: URIs in the self-contained HTML report.
// Cost: O(bytes).
// Method: RFC 4648, "The Base16, Base32, and Base64 Data Encodings", 2006, sec. 4 (standard
// alphabet, '=' padding, no line breaks).
#pragma once

#include <string>
#include <string_view>

namespace cuspmap {

/// Encodes bytes as base64 (RFC 4648 sec. 4): 4 characters per 3 bytes, '=' padded.
/// @param[in] bytes  any binary data; empty -> ""
std::string base64_encode(std::string_view bytes);

}  // namespace cuspmap

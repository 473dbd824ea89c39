// MD5 digest as 32 lower-case hex digits, for the checksums an X3P file carries (ISO 25178-72
// names MD5 for main.xml and the point data). Not for security. Cost O(bytes).
// Method: RFC 1321 (Rivest 1992), "The MD5 Message-Digest Algorithm".
#pragma once

#include <string>
#include <string_view>

namespace cuspmap {

/// MD5 of `bytes` as 32 lower-case hex digits, e.g. md5_hex("abc") = "900150983cd24fb0..."
/// @param[in] bytes any data
std::string md5_hex(std::string_view bytes);

}  // namespace cuspmap

// Character classes of RS-274 program text: spaces, digits, letters and case folding, shared by
// the program index, the line lexer and the expression reader. ASCII only and locale-free (the
// <cctype> functions depend on the locale and are undefined for negative chars). Cost O(1).
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.3: letters in either case; spaces and
// tabs are ignored outside comments.
#pragma once

namespace cuspmap {

/// Space, tab, vertical tab or form feed: blanks between the items of a line.
constexpr bool gcode_is_space(char c) { return c == ' ' || c == '\t' || c == '\v' || c == '\f'; }
/// '0'..'9'.
constexpr bool gcode_is_digit(char c) { return c >= '0' && c <= '9'; }
/// 'A'..'Z' or 'a'..'z'.
constexpr bool gcode_is_letter(char c) { return (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z'); }
/// Upper case of an ASCII letter; any other char unchanged.
constexpr char gcode_upper(char c) {
  return (c >= 'a' && c <= 'z') ? static_cast<char>(c - 'a' + 'A') : c;
}
/// Lower case of an ASCII letter; any other char unchanged.
constexpr char gcode_lower(char c) {
  return (c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c;
}

}  // namespace cuspmap

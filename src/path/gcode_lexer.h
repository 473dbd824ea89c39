// Lexer for one line of an RS-274 program: block delete, line number, program number, comments
// in ( ) and after ;, and words (a letter and a number, spaces allowed anywhere, any case).
// Input: one line (no end-of-line); output: the words in order. Cost O(line length).
// Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.3 "Format of a Line",
// §3.3.1 line number, §3.3.2.1 numbers, §3.3.4 comments; ';' comments as common controls read.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace cuspmap {

/// One word: a letter and the number after it.
struct GcodeWord {
  char letter = 0;         ///< upper-case letter A-Z (never N or O: those are handled here)
  double value = 0.0;      ///< the number as written: "X10" is 10, no implied decimal places
  std::string text;        ///< letter and number as written, spaces removed ("G41", "X-1.5")
};

/// Kinds of line.
enum class GcodeLineKind {
  Blank,          ///< nothing but spaces and comments
  Percent,        ///< a lone '%' (tape start/end marker, §3.1)
  Deleted,        ///< starts with '/' (block delete): skipped, as with the switch on (§2.2.2)
  ProgramNumber,  ///< "O1234" alone (with comments): a program number, no action
  Words,          ///< one or more words
};

/// One lexed line.
struct GcodeLine {
  GcodeLineKind kind = GcodeLineKind::Blank;  ///< what the line is
  std::vector<GcodeWord> words;               ///< the words in order (Words only)
};

/// Throws InputError "<file>:<line>: '<word>': <why>" (or without the word when empty), the one
/// error shape of the G-code reader.
[[noreturn]] void throw_gcode_error(std::string_view file, long long line, std::string_view word,
                                    std::string_view why);

/// Splits one line into words.
/// @param[in]  line     the line without end-of-line characters
/// @param[in]  file     file name for messages; @param[in] line_number  1-based, for messages
/// @param[out] out      the lexed line (its vector is reused between calls)
/// @throws InputError on a nested or unclosed comment, a letter without a number, a misplaced
///         line number, O-word control flow, parameters (#), expressions ([ ]), a stray '%', or
///         any other character (bytes outside printable ASCII are shown in hex).
void lex_gcode_line(std::string_view line, std::string_view file, long long line_number,
                    GcodeLine& out);

}  // namespace cuspmap

// Lexer for one line of an RS-274 program: block delete, line number, program number and O-word
// control lines, comments in ( ) and after ;, parameter settings (#1=.., #<name>=..) and words
// (a letter and a real value: number, parameter, [expression] or function; spaces anywhere).
// Input: one line (no end-of-line) and the parameters in force; output the words in order.
// Cost O(line length). Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.3
// "Format of a Line", §3.3.1-3.3.4; ';' comments and O-word control lines as common controls.
#pragma once

#include <string>
#include <string_view>
#include <vector>

#include "path/gcode_expression.h"
#include "path/gcode_parameters.h"

namespace cuspmap {

/// One word: a letter and its value.
struct GcodeWord {
  char letter = 0;         ///< upper-case letter A-Z (never N or O: those are handled here)
  double value = 0.0;      ///< the value: "X10" is 10, no implied decimal places
  std::string text;        ///< letter and value as written, spaces removed ("G41", "X#1")
};

/// A parameter setting "#n=value" (§3.3.3): applied after the whole line is read.
struct GcodeAssignment {
  GcodeParameterRef target;  ///< which parameter
  double value = 0.0;        ///< the value
};

/// An O-word control line ("O100 sub", "o<loop> while [#1 LT 3]").
struct GcodeOWord {
  std::string label;         ///< "100" or "<loop>" (names lower-cased), as matched between lines
  std::string keyword;       ///< sub endsub call if elseif else endif while endwhile do repeat
                             ///< endrepeat return break continue (lower case)
  std::vector<double> args;  ///< values after the keyword (call arguments, a condition, a count)
  std::string text;          ///< "O100 call", for messages
};

/// Kinds of line.
enum class GcodeLineKind {
  Blank,          ///< nothing but spaces, comments and parameter settings
  Percent,        ///< a lone '%' (tape start/end marker, §3.1)
  Deleted,        ///< starts with '/' and the block delete switch is on: skipped (§2.2.2)
  ProgramNumber,  ///< "O1234" alone (with comments): a program number or an M98 subprogram start
  OWord,          ///< an O-word control line
  Words,          ///< one or more words
};

/// One lexed line.
struct GcodeLine {
  GcodeLineKind kind = GcodeLineKind::Blank;  ///< what the line is
  std::vector<GcodeWord> words;               ///< the words in order (Words only)
  std::vector<GcodeAssignment> assignments;   ///< parameter settings, in order
  GcodeOWord oword;                           ///< OWord only (label also set for ProgramNumber)
  bool slash = false;                         ///< the line starts with '/' (block delete mark)
  bool message = false;                       ///< a (MSG,..), (DEBUG,..) or (PRINT,..) comment
};

/// Throws InputError "<file>:<line>: '<word>': <why>" (or without the word when empty), the one
/// error shape of the G-code reader.
[[noreturn]] void throw_gcode_error(std::string_view file, long long line, std::string_view word,
                                    std::string_view why);

/// Splits one line into words.
/// @param[in]  line          the line without end-of-line characters
/// @param[in]  file          file name for messages; @param[in] line_number  1-based
/// @param[in]  parameters    values for #.. and [..]; null: syntax only, every value 0
/// @param[in]  block_delete  the block delete switch: on, a line starting with '/' is Deleted
/// @param[out] out           the lexed line (its vectors are reused between calls)
/// @throws InputError on a nested or unclosed comment, a letter without a value, a misplaced
///         line number or O-word, a malformed value or expression, a stray '%', or any other
///         character (bytes outside printable ASCII are shown in hex).
void lex_gcode_line(std::string_view line, std::string_view file, long long line_number,
                    const GcodeParameters* parameters, bool block_delete, GcodeLine& out);

}  // namespace cuspmap

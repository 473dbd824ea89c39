// Real values of RS-274 words: a number, a parameter (#12, ##2, #[expr], #<name>), a bracketed
// expression [..] with the binary operators ** * / MOD + - EQ NE GT GE LT LE AND OR XOR and the
// functions ABS ACOS ASIN ATAN[y]/[x] COS EXP FIX FUP LN ROUND SIN SQRT TAN EXISTS (degrees).
// Input: the line and a cursor; output the value (program units). Cost O(characters).
// Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.3.2.2-3.3.2.5 (real
// values, expressions, binary operations, unary functions); comparisons, EXISTS and named
// parameters as common controls extend v3 (comparisons bind looser than + -, logic loosest).
#pragma once

#include <cstddef>
#include <string>
#include <string_view>

#include "path/gcode_parameters.h"

namespace cuspmap {

/// Where a value is read and against which parameters.
struct GcodeValueContext {
  const GcodeParameters* parameters = nullptr;  ///< null: check the syntax only, values are 0
  std::string_view file;                        ///< for messages
  long long line = 0;                           ///< for messages
  std::size_t word_start = std::string_view::npos;  ///< where the word's letter stands (messages)
};

/// Reads a real value at `s[i]`: an optional sign, then a number, a parameter, an expression
/// or a unary function. Spaces are skipped before and between items.
/// @param[in]     s     the line
/// @param[in,out] i     cursor: on return just past the value
/// @param[in]     ctx   parameters and message context
/// @param[out]    text  the value as written, spaces removed (appended)
/// @return the value
/// @throws InputError "<file>:<line>: '<text>': <why>" for a malformed value, a named parameter
///         never set, a numbered one out of 0..5399, division by zero, a function outside its
///         domain (ASIN/ACOS of |x| > 1, LN or SQRT of a negative), an unknown operation name.
double read_gcode_real(std::string_view s, std::size_t& i, const GcodeValueContext& ctx,
                       std::string& text);

/// Reads the parameter reference after a '#' at s[i] (i on the '#'): its number, or its name
/// lower-cased with spaces removed.
struct GcodeParameterRef {
  int number = -1;   ///< numbered parameter, or -1 for a named one
  std::string name;  ///< named parameter (without '<' '>'), empty for a numbered one
};
/// @param[in,out] i  cursor on the '#'; on return past the reference
/// @throws InputError as read_gcode_real
GcodeParameterRef read_gcode_parameter_ref(std::string_view s, std::size_t& i,
                                           const GcodeValueContext& ctx, std::string& text);

/// Skips spaces and tabs at s[i].
void skip_gcode_spaces(std::string_view s, std::size_t& i);

}  // namespace cuspmap

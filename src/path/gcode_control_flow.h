// Control flow of an RS-274 program: which line runs next. O-word subroutines (sub/endsub/
// call with arguments/return), if/elseif/else/endif, while/endwhile, do/while, repeat/endrepeat,
// break/continue, and M98/M99 subprograms in the same file (ISO 6983 style, O number ... M99).
// Input: the indexed program, the parameters; output: the next line index. Cost O(1) per line
// plus O(labels' lines) per jump. Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556,
// 2000) §3.3 (lines run in order); O-words and M98/M99 as common controls extend v3.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "path/gcode_lexer.h"
#include "path/gcode_parameters.h"
#include "path/gcode_program.h"

namespace cuspmap {

/// Deepest nesting of calls (O-word and M98) before a program is refused as runaway recursion
/// (common practice, no source: controls allow a few to a few tens of levels).
inline constexpr std::size_t kMaxGcodeCallDepth = 100;

/// Where the program runs: a line counter and the stacks of calls and repeat loops.
class GcodeControlFlow {
 public:
  /// @param[in] program     the indexed program (outlives this object)
  /// @param[in] parameters  the run's parameters (call arguments and locals)
  GcodeControlFlow(const GcodeProgram& program, GcodeParameters& parameters)
      : program_(program), parameters_(parameters) {}

  /// Index of the next line to run and advances past it; false at the end of the file.
  bool next(std::size_t& line) {
    if (pc_ >= program_.size()) return false;
    line = pc_++;
    return true;
  }

  /// Runs an O-word control line found at `line` (0-based).
  /// @throws InputError naming the O-word for a call of a missing subroutine, an unmatched
  ///         keyword, a missing condition, a return outside a call, calls nested too deep.
  void oword(const GcodeOWord& o, std::size_t line);

  /// M98: calls the subprogram "O<label>" of this file `count` times; returns after `line`.
  /// @throws InputError when no such program number is in the file or calls nest too deep.
  void call_program(const std::string& label, int count, std::size_t line,
                    const std::string& word);

  /// M99 at `line`: returns from (or repeats) the innermost M98 subprogram.
  /// @return false when no M98 call is in progress (the main program's M99 ends it)
  bool return_program(std::size_t line);

  /// Calls in progress.
  std::size_t depth() const { return frames_.size(); }

 private:
  struct Frame {
    std::size_t return_line = 0;  // line index to resume at
    std::size_t start_line = 0;   // first line of the body (M98 repeats)
    int remaining = 0;            // M98 repeats still to run after this one
    bool oword = false;           // O-word call (parameter scope) or M98
    std::size_t loops = 0;        // size of loops_ at entry
  };
  struct Loop {
    std::size_t line = 0;  // the repeat line
    long long remaining = 0;
  };
  [[noreturn]] void fail(std::size_t line, const std::string& word, const std::string& why) const;
  std::size_t require_next(const GcodeOWord& o, std::size_t line,
                           std::initializer_list<std::string_view> keywords,
                           const std::string& what) const;
  double condition(const GcodeOWord& o, std::size_t line) const;
  void leave(std::size_t line, const GcodeOWord& o);
  void enter(Frame f, std::size_t line, const std::string& word);

  const GcodeProgram& program_;
  GcodeParameters& parameters_;
  std::size_t pc_ = 0;
  std::size_t elseif_test_ = static_cast<std::size_t>(-1);  // an elseif reached by a false test
  std::vector<Frame> frames_;
  std::vector<Loop> loops_;
};

}  // namespace cuspmap

// A whole RS-274 program held in memory with an index of its O-word control lines, ISO program
// numbers and M99 lines, so subroutines, loops and M98 calls can jump to any line. The index is
// built by a tolerant scan that never throws: lines are checked only when they run.
// Input: a line reader (file or text); output the lines and the index. Cost O(bytes), memory
// O(bytes + lines). Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.3
// line format; O-word sub/call/if/while/do/repeat and M98/M99 as common controls extend v3.
#pragma once

#include <cstddef>
#include <map>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "path/gcode_line_reader.h"

namespace cuspmap {

/// One O-word control line found by the scan.
struct GcodeOWordEntry {
  std::size_t line = 0;  ///< 0-based line index
  std::string keyword;   ///< lower case; a "while" that closes a "do" is stored as "dowhile"
};

/// The program and its index.
class GcodeProgram {
 public:
  /// Reads every line (limits and messages of GcodeLineReader) and indexes them.
  explicit GcodeProgram(GcodeLineReader& reader);

  /// Number of lines.
  std::size_t size() const { return starts_.size() - 1; }
  /// Line k (0-based) without its end-of-line.
  std::string_view line(std::size_t k) const {
    return std::string_view(text_).substr(starts_[k], starts_[k + 1] - starts_[k] - 1);
  }
  /// Name used in messages.
  const std::string& name() const { return name_; }

  /// First line after `from` with O-word label `label` and one of `keywords`; npos if none.
  std::size_t next(const std::string& label, std::size_t from,
                   std::initializer_list<std::string_view> keywords) const;
  /// Last line before `from` with that label and one of `keywords`; npos if none.
  std::size_t previous(const std::string& label, std::size_t from,
                       std::initializer_list<std::string_view> keywords) const;
  /// Keyword the index holds for line k of label (e.g. "dowhile"), empty if none.
  std::string_view keyword_at(const std::string& label, std::size_t k) const;
  /// Line of the program number "O<label>" alone (an M98 subprogram start); npos if none.
  std::size_t program_number(const std::string& label) const;
  /// First line at or after `from` with an M99 word; npos if none.
  std::size_t next_m99(std::size_t from) const;
  /// True when line k lies in a subroutine body (O.. sub to endsub, or O<n> alone to its M99).
  bool in_subprogram(std::size_t k) const;
  /// True when line k holds nothing but spaces, comments and '%'.
  bool blank(std::size_t k) const;

 private:
  std::string name_;
  std::string text_;                 // every line followed by '\n'
  std::vector<std::size_t> starts_;  // start of each line, plus one past the end
  std::map<std::string, std::vector<GcodeOWordEntry>> owords_;
  std::map<std::string, std::size_t> program_numbers_;
  std::vector<std::size_t> m99_lines_;
  std::vector<std::pair<std::size_t, std::size_t>> bodies_;  // subroutine line ranges, sorted
};

}  // namespace cuspmap

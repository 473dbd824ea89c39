// Streaming line reader for G-code programs: yields one line at a time from a file or a memory
// buffer, reading fixed-size chunks so a huge single line fails fast at kMaxGcodeLineChars with
// its line number instead of being buffered whole. Cost O(bytes read), memory O(chunk + line).
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.3: a line ends at CR, LF or both.
#pragma once

#include <cstdio>
#include <memory>
#include <string>
#include <string_view>
#include <vector>

namespace cuspmap {

/// Reads lines of a G-code program, one at a time, with the length and count limits of
/// path/path_limits.h.
class GcodeLineReader {
 public:
  /// Opens a file for reading.
  /// @param[in] path  file to read; also the name used in messages
  /// @throws InputError "<path>: cannot open the G-code file (<reason>)".
  static GcodeLineReader from_file(const std::string& path);

  /// Reads from a memory buffer (tests, benchmarks). The buffer must outlive the reader.
  /// @param[in] text  program text; @param[in] name  name used in messages
  static GcodeLineReader from_text(std::string_view text, std::string name);

  /// The next line without its end-of-line characters.
  /// @param[out] line  valid until the next call
  /// @return false at the end of the input (line untouched)
  /// @throws InputError "<name>:<n>: line longer than 4096 characters ..." as soon as a line
  ///         passes kMaxGcodeLineChars, or when the file has more than kMaxGcodeLines lines.
  bool next(std::string_view& line);

  /// 1-based number of the line last returned (0 before the first).
  long long line_number() const { return line_number_; }
  /// Name used in messages (the path as given, or the name passed to from_text).
  const std::string& name() const { return name_; }

 private:
  GcodeLineReader() = default;
  bool fill();  // refills chunk_ from the source; false at end of input

  struct FileCloser {
    void operator()(std::FILE* f) const { std::fclose(f); }
  };
  std::unique_ptr<std::FILE, FileCloser> file_;  // file source, or null for text
  std::string_view text_;                        // text source (remaining part)
  std::string name_;
  std::vector<char> chunk_;                      // file buffer
  const char* data_ = nullptr;                   // current chunk: file buffer or the whole text
  std::size_t pos_ = 0, end_ = 0;                // unread part of data_
  std::string line_;                             // the line being assembled
  long long line_number_ = 0;
  bool skip_lf_ = false;                         // previous line ended in CR: a leading LF belongs to it
  bool at_end_ = false;
};

}  // namespace cuspmap

// Streaming line reader for G-code programs (see gcode_line_reader.h): chunked reads, CR / LF /
// CR LF line ends, a hard cap on line length and line count. Cost O(bytes read).
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.3 line format.
#include "path/gcode_line_reader.h"

#include <cerrno>
#include <cstring>

#include "core/input_error.h"
#include "path/path_limits.h"

namespace cuspmap {
namespace {

// Bytes per read from a file: large enough that fread's cost per call vanishes, small enough that
// a pathological single-line file is refused after reading one chunk past the limit.
constexpr std::size_t kChunkBytes = 1 << 16;

}  // namespace

GcodeLineReader GcodeLineReader::from_file(const std::string& path) {
  GcodeLineReader reader;
  reader.name_ = path;
  errno = 0;
  reader.file_.reset(std::fopen(path.c_str(), "rb"));
  if (!reader.file_) {
    throw InputError(path + ": cannot open the G-code file (" + std::strerror(errno) + ")");
  }
  reader.chunk_.resize(kChunkBytes);
  return reader;
}

GcodeLineReader GcodeLineReader::from_text(std::string_view text, std::string name) {
  GcodeLineReader reader;
  reader.name_ = std::move(name);
  reader.text_ = text;
  return reader;
}

bool GcodeLineReader::fill() {
  if (at_end_) return false;
  if (!file_) {
    // The whole text is one chunk: no copy.
    data_ = text_.data();
    pos_ = 0;
    end_ = text_.size();
    at_end_ = true;
    return end_ > 0;
  }
  const std::size_t n = std::fread(chunk_.data(), 1, chunk_.size(), file_.get());
  if (n == 0) {
    if (std::ferror(file_.get())) {
      throw InputError(name_ + ":" + std::to_string(line_number_ + 1) +
                       ": cannot read the G-code file (read error)");
    }
    at_end_ = true;
    return false;
  }
  data_ = chunk_.data();
  pos_ = 0;
  end_ = n;
  return true;
}

bool GcodeLineReader::next(std::string_view& line) {
  line_.clear();
  bool any = false;  // consumed at least one character or line end for this line
  for (;;) {
    if (pos_ == end_ && !fill()) {
      if (!any) return false;
      break;  // last line without an end-of-line
    }
    if (skip_lf_) {
      skip_lf_ = false;
      if (data_[pos_] == '\n') {
        ++pos_;
        continue;
      }
    }
    const char* begin = data_ + pos_;
    const char* stop = data_ + end_;
    const char* p = begin;
    while (p != stop && *p != '\n' && *p != '\r') ++p;
    const std::size_t n = static_cast<std::size_t>(p - begin);
    if (line_.size() + n > kMaxGcodeLineChars) {
      throw InputError(name_ + ":" + std::to_string(line_number_ + 1) + ": line longer than " +
                       std::to_string(kMaxGcodeLineChars) +
                       " characters: not a G-code program line");
    }
    line_.append(begin, n);
    any = true;
    pos_ += n;
    if (p != stop) {
      skip_lf_ = (*p == '\r');
      ++pos_;
      break;
    }
  }
  ++line_number_;
  if (line_number_ > kMaxGcodeLines) {
    throw InputError(name_ + ":" + std::to_string(line_number_) + ": more than " +
                     std::to_string(kMaxGcodeLines) +
                     " lines: split the program or simulate a smaller patch");
  }
  line = line_;
  return true;
}

}  // namespace cuspmap

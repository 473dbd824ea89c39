// Lexer for one RS-274 line (see gcode_lexer.h): spaces ignored outside comments, letters in
// any case, numbers with optional sign and decimal point, read with std::from_chars.
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.3, §3.3.1, §3.3.2.1, §3.3.4.
#include "path/gcode_lexer.h"

#include <charconv>
#include <cmath>
#include <cstdio>

#include "core/input_error.h"

namespace cuspmap {
namespace {

bool is_space(char c) { return c == ' ' || c == '\t' || c == '\v' || c == '\f'; }
bool is_digit(char c) { return c >= '0' && c <= '9'; }
bool is_letter(char c) { return (c >= 'A' && c <= 'Z') || (c >= 'a' && c <= 'z'); }
char upper(char c) { return (c >= 'a' && c <= 'z') ? static_cast<char>(c - 'a' + 'A') : c; }

std::string byte_name(char c) {
  char buf[8];
  std::snprintf(buf, sizeof buf, "0x%02X", static_cast<unsigned>(static_cast<unsigned char>(c)));
  return buf;
}

// Lexes one line; holds the cursor and the context for messages.
class LineLexer {
 public:
  LineLexer(std::string_view line, std::string_view file, long long line_number)
      : s_(line), file_(file), line_number_(line_number) {}

  void run(GcodeLine& out) {
    out.kind = GcodeLineKind::Blank;
    out.words.clear();
    skip_spaces();
    if (i_ == s_.size()) return;
    if (s_[i_] == '/') {  // block delete: the rest of the line is not read (§3.3 item 1)
      out.kind = GcodeLineKind::Deleted;
      return;
    }
    if (s_[i_] == '%') {
      ++i_;
      skip_spaces();
      if (i_ != s_.size()) fail("%", "a % sign must stand alone on its line");
      out.kind = GcodeLineKind::Percent;
      return;
    }
    bool first_item = true;  // a line number may only come before every word
    while (i_ < s_.size()) {
      const char c = s_[i_];
      if (is_space(c)) {
        ++i_;
      } else if (c == '(') {
        skip_comment();
      } else if (c == ';') {
        break;  // comment to the end of the line
      } else if (is_letter(c)) {
        const char letter = upper(c);
        ++i_;
        if (letter == 'N') {
          read_line_number(first_item);
        } else if (letter == 'O') {
          read_program_number(first_item, out);
          return;
        } else {
          out.words.push_back(read_word(letter));
          out.kind = GcodeLineKind::Words;
        }
        first_item = false;
      } else if (c == '#') {
        fail("#", "parameters and macros (#) are not supported; post the program with numbers");
      } else if (c == '[') {
        fail("[", "expressions ([ ]) are not supported; post the program with numbers");
      } else if (c == '%') {
        fail("%", "a % sign must stand alone on its line");
      } else if (static_cast<unsigned char>(c) < 0x20 || static_cast<unsigned char>(c) >= 0x7F) {
        throw_gcode_error(file_, line_number_, "",
                          "byte " + byte_name(c) + " at column " + std::to_string(i_ + 1) +
                              ": not G-code text");
      } else {
        fail(std::string(1, c), "unexpected character: words are a letter and a number");
      }
    }
  }

 private:
  [[noreturn]] void fail(std::string_view word, std::string_view why) const {
    throw_gcode_error(file_, line_number_, word, why);
  }

  void skip_spaces() {
    while (i_ < s_.size() && is_space(s_[i_])) ++i_;
  }

  // Comments: no nesting, must close on the same line (§3.3.4). Any byte may appear inside.
  void skip_comment() {
    for (std::size_t j = i_ + 1; j < s_.size(); ++j) {
      if (s_[j] == ')') {
        i_ = j + 1;
        return;
      }
      if (s_[j] == '(') fail("(", "comments cannot be nested (a '(' inside a comment)");
    }
    fail("(", "comment not closed: a ')' must end it on the same line");
  }

  // Digits (spaces allowed between them), appended to `text`; returns how many were read.
  int read_digits(std::string& text) {
    int n = 0;
    for (;;) {
      skip_spaces();
      if (i_ < s_.size() && is_digit(s_[i_])) {
        text.push_back(s_[i_++]);
        ++n;
      } else {
        return n;
      }
    }
  }

  // N and an unsigned integer, only as the first item (§3.3.1); the number itself is not used.
  void read_line_number(bool first_item) {
    std::string text = "N";
    const int digits = read_digits(text);
    if (!first_item) fail(text, "a line number (N) must come first on the line");
    if (digits == 0 || (i_ < s_.size() && (s_[i_] == '.' || s_[i_] == '-' || s_[i_] == '+'))) {
      fail(text, "a line number is N followed by digits only");
    }
  }

  // "O1234" alone is a program number; O-words with anything after them are control flow.
  void read_program_number(bool first_item, GcodeLine& out) {
    std::string text = "O";
    const int digits = read_digits(text);
    skip_spaces();
    while (i_ < s_.size() && s_[i_] == '(') {
      skip_comment();
      skip_spaces();
    }
    const bool alone = i_ == s_.size() || s_[i_] == ';';
    if (!first_item || digits == 0 || !alone) {
      fail(text, "O-word subprograms and control flow are not supported; only a program number "
                 "(O1234) alone on its line is allowed");
    }
    out.kind = GcodeLineKind::ProgramNumber;
    out.words.clear();
  }

  // A real number after a letter (§3.3.2.1): [+|-] digits [. digits], at least one digit.
  GcodeWord read_word(char letter) {
    GcodeWord word;
    word.letter = letter;
    word.text.push_back(letter);
    skip_spaces();
    if (i_ < s_.size() && (s_[i_] == '+' || s_[i_] == '-')) word.text.push_back(s_[i_++]);
    int digits = read_digits(word.text);
    if (i_ < s_.size() && s_[i_] == '.') {
      word.text.push_back(s_[i_++]);
      digits += read_digits(word.text);
    }
    if (digits == 0) {
      if (i_ < s_.size() && (s_[i_] == '#' || s_[i_] == '[')) {
        fail(word.text + s_[i_], "parameters and expressions are not supported; post the "
                                 "program with numbers");
      }
      fail(word.text, std::string("the letter ") + letter + " needs a number after it");
    }
    const char* first = word.text.data() + 1;
    const char* last = word.text.data() + word.text.size();
    if (*first == '+') ++first;  // from_chars takes no '+'
    const auto [ptr, ec] = std::from_chars(first, last, word.value);
    if (ec != std::errc() || ptr != last || !std::isfinite(word.value)) {
      fail(word.text, "number out of range");
    }
    return word;
  }

  std::string_view s_;
  std::string_view file_;
  long long line_number_;
  std::size_t i_ = 0;
};

}  // namespace

void throw_gcode_error(std::string_view file, long long line, std::string_view word,
                       std::string_view why) {
  std::string msg(file);
  msg += ':';
  msg += std::to_string(line);
  msg += ": ";
  if (!word.empty()) {
    msg += '\'';
    msg += word;
    msg += "': ";
  }
  msg += why;
  throw InputError(msg);
}

void lex_gcode_line(std::string_view line, std::string_view file, long long line_number,
                    GcodeLine& out) {
  LineLexer(line, file, line_number).run(out);
}

}  // namespace cuspmap

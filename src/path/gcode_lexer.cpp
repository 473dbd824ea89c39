// Lexer for one RS-274 line (see gcode_lexer.h): spaces ignored outside comments, letters in
// any case, values read by path/gcode_expression (numbers with std::from_chars).
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.3, §3.3.1-3.3.4.
#include "path/gcode_lexer.h"

#include <cstdio>

#include "core/input_error.h"
#include "path/gcode_chars.h"

namespace cuspmap {
namespace {

std::string byte_name(char c) {
  char buf[8];
  std::snprintf(buf, sizeof buf, "0x%02X", static_cast<unsigned>(static_cast<unsigned char>(c)));
  return buf;
}

// Lexes one line; holds the cursor and the context for messages.
class LineLexer {
 public:
  LineLexer(std::string_view line, std::string_view file, long long line_number,
            const GcodeParameters* parameters)
      : s_(line), file_(file), line_number_(line_number) {
    ctx_.parameters = parameters;
    ctx_.file = file;
    ctx_.line = line_number;
  }

  void run(bool block_delete, GcodeLine& out) {
    out.kind = GcodeLineKind::Blank;
    out.words.clear();
    out.assignments.clear();
    out.slash = out.message = false;
    skip_spaces();
    if (i_ == s_.size()) return;
    if (s_[i_] == '/') {  // block delete (§3.3 item 1): skipped only with the switch on
      out.slash = true;
      if (block_delete) {
        out.kind = GcodeLineKind::Deleted;
        return;
      }
      ++i_;
    }
    if (i_ < s_.size() && s_[i_] == '%') {
      ++i_;
      skip_spaces();
      if (i_ != s_.size()) fail("%", "a % sign must stand alone on its line");
      out.kind = GcodeLineKind::Percent;
      return;
    }
    bool first_item = true;  // a line number or O-word may only come before every word
    while (i_ < s_.size()) {
      const char c = s_[i_];
      if (gcode_is_space(c)) {
        ++i_;
      } else if (c == '(') {
        skip_comment(out);
      } else if (c == ';') {
        break;  // comment to the end of the line
      } else if (gcode_is_letter(c)) {
        const char letter = gcode_upper(c);
        ++i_;
        if (letter == 'N') {
          read_line_number(first_item);
        } else if (letter == 'O') {
          read_oword(first_item, out);
          return;
        } else {
          out.words.push_back(read_word(letter));
          out.kind = GcodeLineKind::Words;
        }
        first_item = false;
      } else if (c == '#') {
        read_assignment(out);
        first_item = false;
      } else if (c == '%') {
        fail("%", "a % sign must stand alone on its line");
      } else if (static_cast<unsigned char>(c) < 0x20 || static_cast<unsigned char>(c) >= 0x7F) {
        throw_gcode_error(file_, line_number_, "",
                          "byte " + byte_name(c) + " at column " + std::to_string(i_ + 1) +
                              ": not G-code text");
      } else {
        fail(std::string(1, c), "unexpected character: words are a letter and a value");
      }
    }
  }

 private:
  [[noreturn]] void fail(std::string_view word, std::string_view why) const {
    throw_gcode_error(file_, line_number_, word, why);
  }

  void skip_spaces() {
    while (i_ < s_.size() && gcode_is_space(s_[i_])) ++i_;
  }

  // Comments: no nesting, must close on the same line (§3.3.4). Any byte may appear inside.
  // "(MSG," "(DEBUG," and "(PRINT," comments are operator messages (common controls).
  void skip_comment(GcodeLine& out) {
    for (std::size_t j = i_ + 1; j < s_.size(); ++j) {
      if (s_[j] == ')') {
        std::string head;
        for (std::size_t k = i_ + 1; k < j && head.size() < 7; ++k) {
          if (!gcode_is_space(s_[k])) head.push_back(gcode_upper(s_[k]));
        }
        if (head.rfind("MSG,", 0) == 0 || head.rfind("DEBUG,", 0) == 0 ||
            head.rfind("PRINT,", 0) == 0) {
          out.message = true;
        }
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
      if (i_ < s_.size() && gcode_is_digit(s_[i_])) {
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

  // "O1234" alone is a program number; "O1234 keyword [..]" or "O<name> keyword" a control line.
  void read_oword(bool first_item, GcodeLine& out) {
    GcodeOWord& o = out.oword;
    o.label.clear();
    o.keyword.clear();
    o.args.clear();
    o.text.assign(1, 'O');
    skip_spaces();
    if (i_ < s_.size() && s_[i_] == '<') {
      while (i_ < s_.size() && s_[i_] != '>') {
        if (!gcode_is_space(s_[i_])) o.label.push_back(gcode_lower(s_[i_]));
        ++i_;
      }
      if (i_ == s_.size()) fail(o.text + o.label, "an O-word name needs its closing '>'");
      o.label.push_back('>');
      ++i_;
    } else {
      read_digits(o.label);
      // Leading zeros do not change the number: O0100 and O100 are one label (M98 P100).
      while (o.label.size() > 1 && o.label[0] == '0') o.label.erase(0, 1);
    }
    o.text += o.label;
    if (!first_item) fail(o.text, "an O-word must come first on its line");
    if (o.label.empty() || o.label == "<>") fail(o.text, "an O-word needs a number or a <name>");
    skip_spaces();
    while (i_ < s_.size() && gcode_is_letter(s_[i_])) o.keyword.push_back(gcode_lower(s_[i_++]));
    if (o.keyword.empty()) {
      while (i_ < s_.size() && s_[i_] == '(') {
        skip_comment(out);
        skip_spaces();
      }
      if (i_ != s_.size() && s_[i_] != ';') {
        fail(o.text, "an O-word is a program number alone on its line or a control keyword "
                     "(sub, call, if, while, do, repeat, ...)");
      }
      out.kind = GcodeLineKind::ProgramNumber;
      return;
    }
    static constexpr std::string_view kKeywords[] = {
        "sub", "endsub", "call", "if", "elseif", "else", "endif", "while", "endwhile", "do",
        "repeat", "endrepeat", "return", "break", "continue"};
    bool known = false;
    for (std::string_view k : kKeywords) known = known || k == o.keyword;
    o.text += ' ' + o.keyword;
    if (!known) {
      fail(o.text, "unknown O-word keyword: use sub, endsub, call, return, if, elseif, else, "
                   "endif, while, endwhile, do, repeat, endrepeat, break or continue");
    }
    for (;;) {
      skip_spaces();
      if (i_ == s_.size() || s_[i_] == ';') break;
      if (s_[i_] == '(') {
        skip_comment(out);
        continue;
      }
      std::string text;
      o.args.push_back(read_gcode_real(s_, i_, ctx_, text));
    }
    out.kind = GcodeLineKind::OWord;
  }

  // "#ref = value" (§3.3.3): the value is read with the parameters as they were before the line.
  void read_assignment(GcodeLine& out) {
    GcodeValueContext ctx = ctx_;
    ctx.word_start = i_;
    std::string text;
    GcodeAssignment a;
    a.target = read_gcode_parameter_ref(s_, i_, ctx, text);
    skip_spaces();
    if (i_ == s_.size() || s_[i_] != '=') {
      fail(text, "a parameter outside a word must be set: #n=value (RS274NGC v3 section 3.3.3)");
    }
    ++i_;
    a.value = read_gcode_real(s_, i_, ctx, text);
    if (a.target.number == 0 && ctx_.parameters) fail(text, "parameter #0 cannot be set");
    out.assignments.push_back(std::move(a));
  }

  // A letter and its real value (§3.3.2): a number, #parameter, [expression] or function[..].
  GcodeWord read_word(char letter) {
    GcodeWord word;
    word.letter = letter;
    word.text.push_back(letter);
    const std::size_t letter_at = i_ - 1;
    skip_spaces();
    bool value_follows = false;
    if (i_ < s_.size()) {
      const char c = s_[i_];
      value_follows = gcode_is_digit(c) || c == '.' || c == '+' || c == '-' || c == '#' || c == '[';
      if (gcode_is_letter(c)) {  // a unary function such as SIN[30] is a real value (§3.3.2.2)
        std::size_t j = i_;
        while (j < s_.size() && gcode_is_letter(s_[j])) ++j;
        skip_spaces_from(j);
        value_follows = j < s_.size() && s_[j] == '[' && j - i_ >= 2;
      }
    }
    if (!value_follows) fail(word.text, std::string("the letter ") + letter + " needs a number after it");
    GcodeValueContext ctx = ctx_;
    ctx.word_start = letter_at;
    word.value = read_gcode_real(s_, i_, ctx, word.text);
    return word;
  }

  void skip_spaces_from(std::size_t& j) const {
    while (j < s_.size() && gcode_is_space(s_[j])) ++j;
  }

  std::string_view s_;
  std::string_view file_;
  long long line_number_;
  GcodeValueContext ctx_;
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
                    const GcodeParameters* parameters, bool block_delete, GcodeLine& out) {
  LineLexer(line, file, line_number, parameters).run(block_delete, out);
}

}  // namespace cuspmap

// Which line of an RS-274 program runs next (see gcode_control_flow.h): O-word structures by
// their label's indexed lines, calls on a stack with the parameters' scopes, M98/M99 likewise.
// Cost O(1) per line, O(lines with the label) per jump.
// Method: O-word control flow and M98/M99 as common controls extend RS274NGC v3 (Kramer,
// Proctor & Messina 2000).
#include "path/gcode_control_flow.h"

#include <cmath>

namespace cuspmap {

namespace {
constexpr std::size_t kNone = static_cast<std::size_t>(-1);
}  // namespace

void GcodeControlFlow::fail(std::size_t line, const std::string& word,
                            const std::string& why) const {
  throw_gcode_error(program_.name(), static_cast<long long>(line) + 1, word, why);
}

std::size_t GcodeControlFlow::require_next(const GcodeOWord& o, std::size_t line,
                                           std::initializer_list<std::string_view> keywords,
                                           const std::string& what) const {
  const std::size_t k = program_.next(o.label, line, keywords);
  if (k == kNone) fail(line, o.text, "no matching " + what + " with the same label after it");
  return k;
}

double GcodeControlFlow::condition(const GcodeOWord& o, std::size_t line) const {
  if (o.args.size() != 1) fail(line, o.text, "needs one condition in [ ]: " + o.text + " [...]");
  return o.args[0];
}

void GcodeControlFlow::enter(Frame f, std::size_t line, const std::string& word) {
  if (frames_.size() >= kMaxGcodeCallDepth) {
    fail(line, word, "calls nested more than " + std::to_string(kMaxGcodeCallDepth) +
                         " deep: a subroutine that never returns?");
  }
  f.loops = loops_.size();
  pc_ = f.start_line;
  frames_.push_back(f);
}

void GcodeControlFlow::leave(std::size_t line, const GcodeOWord& o) {
  if (frames_.empty() || !frames_.back().oword) {
    fail(line, o.text, "'" + o.keyword + "' outside a called subroutine");
  }
  if (!o.args.empty()) parameters_.set_named("_value", o.args[0]);
  parameters_.pop_call();
  loops_.resize(frames_.back().loops);
  pc_ = frames_.back().return_line;
  frames_.pop_back();
}

void GcodeControlFlow::oword(const GcodeOWord& o, std::size_t line) {
  const std::string& label = o.label;
  const std::string& k = o.keyword;
  if (k == "sub") {  // a definition met in the flow of lines: skip its body
    pc_ = require_next(o, line, {"endsub"}, "'endsub'") + 1;
  } else if (k == "endsub" || k == "return") {
    leave(line, o);
  } else if (k == "call") {
    const std::size_t sub = program_.next(label, kNone, {"sub"});
    if (sub == kNone) {
      fail(line, o.text, "no 'O" + label + " sub' in the file: the subroutine must be defined "
                         "in the same program");
    }
    Frame f;
    f.return_line = line + 1;
    f.start_line = sub + 1;
    f.oword = true;
    enter(f, line, o.text);
    parameters_.push_call(o.args);
  } else if (k == "if" || (k == "elseif" && elseif_test_ == line)) {
    elseif_test_ = kNone;
    if (condition(o, line) != 0.0) return;
    const std::size_t to = require_next(o, line, {"elseif", "else", "endif"}, "'endif'");
    const std::string_view kw = program_.keyword_at(label, to);
    if (kw == "elseif") {
      elseif_test_ = to;
      pc_ = to;
    } else {
      pc_ = to + 1;
    }
  } else if (k == "elseif" || k == "else") {  // the branch before ran: go past the endif
    pc_ = require_next(o, line, {"endif"}, "'endif'") + 1;
  } else if (k == "while") {
    if (program_.keyword_at(label, line) == "dowhile") {
      if (condition(o, line) != 0.0) pc_ = program_.previous(label, line, {"do"}) + 1;
    } else {
      const std::size_t end = require_next(o, line, {"endwhile"}, "'endwhile'");
      if (condition(o, line) == 0.0) pc_ = end + 1;
    }
  } else if (k == "endwhile") {
    const std::size_t head = program_.previous(label, line, {"while"});
    if (head == kNone) fail(line, o.text, "no 'while' with the same label before it");
    pc_ = head;
  } else if (k == "repeat") {
    const double n = condition(o, line);
    const long long count = std::llround(n);
    if (count <= 0) {
      pc_ = require_next(o, line, {"endrepeat"}, "'endrepeat'") + 1;
    } else {
      require_next(o, line, {"endrepeat"}, "'endrepeat'");
      loops_.push_back({line, count});
    }
  } else if (k == "endrepeat") {
    const std::size_t head = program_.previous(label, line, {"repeat"});
    if (head == kNone || loops_.empty() || loops_.back().line != head) {
      fail(line, o.text, "no 'repeat' with the same label before it");
    }
    if (--loops_.back().remaining > 0) {
      pc_ = head + 1;
    } else {
      loops_.pop_back();
    }
  } else if (k == "break") {
    const std::size_t end = require_next(o, line, {"endwhile", "endrepeat", "dowhile"},
                                         "loop end");
    if (program_.keyword_at(label, end) == "endrepeat" && !loops_.empty()) loops_.pop_back();
    pc_ = end + 1;
  } else if (k == "continue") {
    const std::size_t end = require_next(o, line, {"endwhile", "endrepeat", "dowhile"},
                                         "loop end");
    pc_ = end;  // the loop's end line decides whether it runs again
  }
  // "do" and "endif" mark places only.
}

void GcodeControlFlow::call_program(const std::string& label, int count, std::size_t line,
                                    const std::string& word) {
  const std::size_t start = program_.program_number(label);
  if (start == kNone) {
    fail(line, word, "no subprogram O" + label + " in the file: put the subprogram (O" + label +
                         " ... M99) after the main program's M30");
  }
  if (count <= 0) return;
  Frame f;
  f.return_line = line + 1;
  f.start_line = start + 1;
  f.remaining = count - 1;
  enter(f, line, word);
}

bool GcodeControlFlow::return_program(std::size_t line) {
  (void)line;
  if (frames_.empty() || frames_.back().oword) return false;
  Frame& f = frames_.back();
  loops_.resize(f.loops);
  if (f.remaining > 0) {
    --f.remaining;
    pc_ = f.start_line;
    return true;
  }
  pc_ = f.return_line;
  frames_.pop_back();
  return true;
}

}  // namespace cuspmap

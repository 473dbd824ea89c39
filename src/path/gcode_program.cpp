// A whole RS-274 program in memory and its O-word / program-number / M99 index (see
// gcode_program.h). The scan is tolerant: a malformed line is simply not indexed and is refused,
// with its line and word, only if it runs. Cost O(bytes).
// Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.3 line format.
#include "path/gcode_program.h"

#include <algorithm>

#include "path/gcode_chars.h"

namespace cuspmap {
namespace {

void skip(std::string_view s, std::size_t& i) {
  while (i < s.size() && gcode_is_space(s[i])) ++i;
}

// O-word label and keyword at the start of a line ("" when the line has no leading O-word).
void scan_oword(std::string_view s, std::string& label, std::string& keyword) {
  label.clear();
  keyword.clear();
  std::size_t i = 0;
  skip(s, i);
  if (i < s.size() && s[i] == '/') ++i;
  skip(s, i);
  if (i < s.size() && (s[i] == 'N' || s[i] == 'n')) {
    ++i;
    while (i < s.size() && (gcode_is_digit(s[i]) || gcode_is_space(s[i]))) ++i;
  }
  if (i >= s.size() || (s[i] != 'O' && s[i] != 'o')) return;
  ++i;
  skip(s, i);
  if (i < s.size() && s[i] == '<') {
    while (i < s.size() && s[i] != '>') {
      if (!gcode_is_space(s[i])) label.push_back(gcode_lower(s[i]));
      ++i;
    }
    if (i == s.size()) {
      label.clear();
      return;
    }
    label.push_back('>');
    ++i;
  } else {
    while (i < s.size() && (gcode_is_digit(s[i]) || gcode_is_space(s[i]))) {
      if (!gcode_is_space(s[i])) label.push_back(s[i]);
      ++i;
    }
    while (label.size() > 1 && label[0] == '0') label.erase(0, 1);
  }
  skip(s, i);
  while (i < s.size() && gcode_is_letter(s[i])) keyword.push_back(gcode_lower(s[i++]));
}

// True when the line has an M99 word outside comments.
bool has_m99(std::string_view s) {
  bool in_comment = false;
  for (std::size_t i = 0; i < s.size(); ++i) {
    const char c = s[i];
    if (in_comment) {
      in_comment = c != ')';
    } else if (c == '(') {
      in_comment = true;
    } else if (c == ';') {
      return false;
    } else if (c == 'M' || c == 'm') {
      std::size_t j = i + 1;
      std::string digits;
      while (j < s.size() && (gcode_is_digit(s[j]) || gcode_is_space(s[j]))) {
        if (!gcode_is_space(s[j])) digits.push_back(s[j]);
        ++j;
      }
      while (digits.size() > 1 && digits[0] == '0') digits.erase(0, 1);
      if (digits == "99" && (j == s.size() || s[j] != '.')) return true;
    }
  }
  return false;
}

}  // namespace

GcodeProgram::GcodeProgram(GcodeLineReader& reader) : name_(reader.name()) {
  std::string_view text;
  std::string label, keyword;
  std::map<std::string, bool> open_do;
  starts_.push_back(0);
  while (reader.next(text)) {
    const std::size_t k = starts_.size() - 1;
    text_.append(text);
    text_.push_back('\n');
    starts_.push_back(text_.size());
    scan_oword(text, label, keyword);
    if (!label.empty() && label != ">") {
      if (keyword.empty()) {
        program_numbers_.emplace(label, k);
      } else {
        if (keyword == "do") open_do[label] = true;
        if (keyword == "while" && open_do[label]) {
          keyword = "dowhile";
          open_do[label] = false;
        }
        owords_[label].push_back({k, keyword});
      }
    }
    if (has_m99(text)) m99_lines_.push_back(k);
  }
  for (const auto& [name, entries] : owords_) {
    for (const GcodeOWordEntry& e : entries) {
      if (e.keyword != "sub") continue;
      const std::size_t end = next(name, e.line, {"endsub"});
      bodies_.emplace_back(e.line, end == std::string_view::npos ? size() - 1 : end);
    }
  }
  for (const auto& entry : program_numbers_) {
    const std::size_t end = next_m99(entry.second);
    if (end != std::string_view::npos) bodies_.emplace_back(entry.second, end);
  }
  std::sort(bodies_.begin(), bodies_.end());
}

bool GcodeProgram::in_subprogram(std::size_t k) const {
  for (const auto& [first, last] : bodies_) {
    if (first > k) break;
    if (k <= last) return true;
  }
  return false;
}

std::size_t GcodeProgram::next(const std::string& label, std::size_t from,
                               std::initializer_list<std::string_view> keywords) const {
  const auto it = owords_.find(label);
  if (it == owords_.end()) return std::string_view::npos;
  for (const GcodeOWordEntry& e : it->second) {
    if (e.line <= from && from != std::string_view::npos) continue;
    if (std::find(keywords.begin(), keywords.end(), e.keyword) != keywords.end()) return e.line;
  }
  return std::string_view::npos;
}

std::size_t GcodeProgram::previous(const std::string& label, std::size_t from,
                                   std::initializer_list<std::string_view> keywords) const {
  const auto it = owords_.find(label);
  if (it == owords_.end()) return std::string_view::npos;
  for (auto e = it->second.rbegin(); e != it->second.rend(); ++e) {
    if (e->line >= from) continue;
    if (std::find(keywords.begin(), keywords.end(), e->keyword) != keywords.end()) return e->line;
  }
  return std::string_view::npos;
}

std::string_view GcodeProgram::keyword_at(const std::string& label, std::size_t k) const {
  const auto it = owords_.find(label);
  if (it == owords_.end()) return {};
  for (const GcodeOWordEntry& e : it->second) {
    if (e.line == k) return e.keyword;
  }
  return {};
}

std::size_t GcodeProgram::program_number(const std::string& label) const {
  const auto it = program_numbers_.find(label);
  return it == program_numbers_.end() ? std::string_view::npos : it->second;
}

std::size_t GcodeProgram::next_m99(std::size_t from) const {
  const auto it = std::lower_bound(m99_lines_.begin(), m99_lines_.end(), from);
  return it == m99_lines_.end() ? std::string_view::npos : *it;
}

bool GcodeProgram::blank(std::size_t k) const {
  const std::string_view s = line(k);
  bool in_comment = false;
  for (const char c : s) {
    if (in_comment) {
      in_comment = c != ')';
    } else if (c == '(') {
      in_comment = true;
    } else if (c == ';') {
      return true;
    } else if (!gcode_is_space(c) && c != '%') {
      return false;
    }
  }
  return true;
}

}  // namespace cuspmap

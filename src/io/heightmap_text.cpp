// Locale-free number tokens for the text heightmap formats.
// Inputs: text; outputs: numbers, fields, lines. Cost O(length).
// Method: std::from_chars / std::to_chars (C++17 <charconv>).
#include "io/heightmap_text.h"

#include <array>
#include <charconv>
#include <cmath>
#include <limits>

namespace cuspmap {

bool parse_height_value(std::string_view t, double& value) {
  if (t.empty() || t == "NaN" || t == "nan" || t == "NAN" || t == "BAD") {
    value = std::numeric_limits<double>::quiet_NaN();
    return true;
  }
  const char* first = t.data();
  if (*first == '+') ++first;
  const auto [ptr, ec] = std::from_chars(first, t.data() + t.size(), value);
  return ec == std::errc() && ptr == t.data() + t.size() && std::isfinite(value);
}

std::string format_height(float value) {
  if (std::isnan(value)) return "NaN";
  std::array<char, 32> buf{};
  const auto [ptr, ec] = std::to_chars(buf.data(), buf.data() + buf.size(), value);
  return ec == std::errc() ? std::string(buf.data(), ptr) : std::string("NaN");
}

std::string format_coordinate(double value) {
  std::array<char, 32> buf{};
  const auto [ptr, ec] = std::to_chars(buf.data(), buf.data() + buf.size(), value);
  return ec == std::errc() ? std::string(buf.data(), ptr) : std::string("NaN");
}

std::vector<std::string_view> split_fields(std::string_view line) {
  std::vector<std::string_view> fields;
  const bool delimited = line.find_first_of(",;") != std::string_view::npos;
  auto trim = [](std::string_view s) {
    while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
    while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
    return s;
  };
  if (delimited) {
    size_t start = 0;
    for (size_t i = 0; i <= line.size(); ++i) {
      if (i == line.size() || line[i] == ',' || line[i] == ';') {
        fields.push_back(trim(line.substr(start, i - start)));
        start = i + 1;
      }
    }
    return fields;
  }
  size_t i = 0;
  while (i < line.size()) {
    while (i < line.size() && (line[i] == ' ' || line[i] == '\t')) ++i;
    const size_t start = i;
    while (i < line.size() && line[i] != ' ' && line[i] != '\t') ++i;
    if (i > start) fields.push_back(line.substr(start, i - start));
  }
  return fields;
}

std::vector<std::string_view> split_lines(std::string_view text) {
  std::vector<std::string_view> lines;
  size_t start = 0;
  for (size_t i = 0; i < text.size(); ++i) {
    if (text[i] == '\n' || text[i] == '\r') {
      lines.push_back(text.substr(start, i - start));
      if (text[i] == '\r' && i + 1 < text.size() && text[i + 1] == '\n') ++i;
      start = i + 1;
    }
  }
  if (start < text.size()) lines.push_back(text.substr(start));
  return lines;
}

}  // namespace cuspmap

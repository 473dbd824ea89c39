// Unit-suffix parsing for lengths (-> mm) and angles (-> deg), locale-independent.
// Inputs: strings from flags and job files; outputs: finite doubles in core units.
// Fractions as inch shops write them ("1/4", "1-1/4in") are read as their value.
// Method: std::from_chars (no strtod/locale), exact inch factor 25.4 mm.
#include "core/units.h"

#include <array>
#include <charconv>
#include <cmath>
#include <cstdio>
#include <utility>

#include "core/input_error.h"

namespace cuspmap {
namespace {

std::string_view trim(std::string_view s) {
  while (!s.empty() && (s.front() == ' ' || s.front() == '\t')) s.remove_prefix(1);
  while (!s.empty() && (s.back() == ' ' || s.back() == '\t')) s.remove_suffix(1);
  return s;
}

// A magnitude a double cannot hold (before or after the unit factor), e.g. "1e400" or "1e308in".
InputError out_of_range(std::string_view text, std::string_view what) {
  return InputError(std::string(what) + " '" + std::string(text) + "': out of range");
}

// value * factor, refusing a product that overflows to infinity.
double scaled(double value, double factor, std::string_view text, std::string_view what) {
  const double out = value * factor;
  if (!std::isfinite(out)) throw out_of_range(text, what);
  return out;
}

bool is_digit(char c) { return c >= '0' && c <= '9'; }

// An unsigned decimal at p (no sign, no exponent sign games): the fraction parts "3" and "8".
const char* unsigned_part(const char* p, const char* end, double& out, std::string_view text,
                          std::string_view what) {
  if (p == end || !is_digit(*p)) {
    throw InputError(std::string(what) + " '" + std::string(text) +
                     "': not a number (fractions are written 1/4 or 1-1/4)");
  }
  const auto [next, ec] = std::from_chars(p, end, out);
  if (ec != std::errc() || !std::isfinite(out)) throw out_of_range(text, what);
  return next;
}

// Fractional input as inch shops write it: "1/4" or the mixed "1-1/4" (whole number, hyphen,
// fraction), after `value` was read up to `ptr`. Folds the fraction into `value` and returns
// where the suffix starts; leaves both alone when no fraction follows.
const char* read_fraction(double& value, const char* ptr, const char* end, std::string_view text,
                          std::string_view what) {
  double numerator = value, whole = 0.0;
  bool mixed = false;
  const char* p = ptr;
  if (p + 1 < end && *p == '-' && is_digit(p[1])) {
    // "1-1/4" only when a '/' follows the second number: "0.1-0.5" stays a bad suffix.
    double second = 0.0;
    const char* q = unsigned_part(p + 1, end, second, text, what);
    if (q == end || *q != '/') return ptr;
    if (value != std::floor(value)) {
      throw InputError(std::string(what) + " '" + std::string(text) +
                       "': the whole part of a mixed fraction must be a whole number");
    }
    whole = value;
    numerator = second;
    mixed = true;
    p = q;
  }
  if (p == end || *p != '/') return ptr;
  double denominator = 0.0;
  const char* q = unsigned_part(p + 1, end, denominator, text, what);
  if (!(denominator > 0.0)) {
    throw InputError(std::string(what) + " '" + std::string(text) +
                     "': a fraction needs a denominator > 0");
  }
  const double fraction = numerator / denominator;
  // "-1-1/4" is -(1 + 1/4): the fraction takes the whole part's sign.
  value = mixed ? whole + std::copysign(fraction, whole) : fraction;
  return q;
}

// Splits "12.5mm" into the number 12.5 and the suffix "mm"; throws on a malformed number.
std::pair<double, std::string_view> split_number(std::string_view text, std::string_view what) {
  const std::string_view s = trim(text);
  if (s.empty()) {
    throw InputError(std::string(what) + " is empty: expected a number");
  }
  const char* first = s.data();
  if (*first == '+') ++first;  // from_chars rejects a leading '+', people type it
  double value = 0.0;
  const auto [ptr, ec] = std::from_chars(first, s.data() + s.size(), value);
  if (ec == std::errc::result_out_of_range) throw out_of_range(text, what);
  if (ec != std::errc() || ptr == first) {
    throw InputError(std::string(what) + " '" + std::string(text) + "': not a number");
  }
  if (!std::isfinite(value)) {
    throw InputError(std::string(what) + " '" + std::string(text) + "': must be a finite number");
  }
  const char* rest = read_fraction(value, ptr, s.data() + s.size(), text, what);
  return {value, trim(std::string_view(rest, static_cast<size_t>(s.data() + s.size() - rest)))};
}

}  // namespace

LengthUnit parse_length_unit(std::string_view text, std::string_view what) {
  const std::string_view s = trim(text);
  if (s == "mm") return LengthUnit::Millimetre;
  if (s == "in" || s == "inch") return LengthUnit::Inch;
  throw InputError(std::string(what) + " '" + std::string(text) + "': allowed units are mm, in");
}

double parse_length_mm(std::string_view text, LengthUnit bare_unit, std::string_view what) {
  const auto [value, suffix] = split_number(text, what);
  struct Factor {
    std::string_view suffix;
    double mm_per_unit;
  };
  static constexpr std::array<Factor, 7> kFactors = {{
      {"mm", 1.0},
      {"um", 1e-3},
      {"µm", 1e-3},
      {"in", kMmPerInch},
      {"thou", kMmPerInch * 1e-3},
      {"mil", kMmPerInch * 1e-3},
      {"uin", kMmPerInch * 1e-6},
  }};
  if (suffix.empty()) {
    return scaled(value, bare_unit == LengthUnit::Inch ? kMmPerInch : 1.0, text, what);
  }
  for (const Factor& f : kFactors) {
    if (suffix == f.suffix) return scaled(value, f.mm_per_unit, text, what);
  }
  throw InputError(std::string(what) + " '" + std::string(text) +
                   "': unknown unit; allowed suffixes are mm, um, in, thou, uin");
}

double parse_positive_length_mm(std::string_view text, LengthUnit bare_unit,
                                std::string_view what) {
  const double mm = parse_length_mm(text, bare_unit, what);
  if (!(mm > 0.0)) {
    throw InputError(std::string(what) + " " + std::string(text) + ": must be > 0");
  }
  return mm;
}

double parse_angle_deg(std::string_view text, std::string_view what) {
  const auto [value, suffix] = split_number(text, what);
  if (suffix.empty() || suffix == "deg" || suffix == "°") return value;
  throw InputError(std::string(what) + " '" + std::string(text) +
                   "': unknown angle unit; allowed suffix is deg");
}

double parse_number(std::string_view text, std::string_view what) {
  const auto [value, suffix] = split_number(text, what);
  if (!suffix.empty()) {
    throw InputError(std::string(what) + " '" + std::string(text) + "': expected a plain number");
  }
  return value;
}

std::string format_number(double value) {
  std::array<char, 64> buf{};
  if (value == 0.0) value = 0.0;  // prints -0 as 0
  // std::to_chars with general format and precision 6: locale-independent, like %.6g.
  const auto [ptr, ec] =
      std::to_chars(buf.data(), buf.data() + buf.size(), value, std::chars_format::general, 6);
  if (ec != std::errc()) return "?";
  return std::string(buf.data(), ptr);
}

}  // namespace cuspmap

// Heights and roughness targets: bare numbers in um or uin, suffixed lengths, ISO 1302 grades.
// Inputs: flag text; outputs: um. Method: see height_units.h.
#include "core/height_units.h"

#include <cctype>
#include <optional>
#include <string>

#include "core/input_error.h"
#include "core/iso1302_table.h"

namespace cuspmap {
namespace {

// The text without surrounding blanks (spaces, tabs), as parse_length_mm reads it.
std::string_view strip_blanks(std::string_view s) {
  const size_t first = s.find_first_not_of(" \t");
  if (first == std::string_view::npos) return {};
  return s.substr(first, s.find_last_not_of(" \t") - first + 1);
}

// True when the text ends in a letter (or the micro sign): a unit suffix is present.
bool has_suffix(std::string_view s) {
  if (s.empty()) return false;
  const unsigned char last = static_cast<unsigned char>(s.back());
  return std::isalpha(last) != 0 || last >= 0x80;
}

}  // namespace

double parse_height_um(std::string_view text, LengthUnit bare_unit, std::string_view what) {
  const std::string_view s = strip_blanks(text);
  // A bare number is read as a length in mm (the factor 1) and then taken as um or uin; the
  // number rules (fractions, signs, range) stay those of parse_length_mm.
  if (!has_suffix(s)) {
    const double value = parse_length_mm(s, LengthUnit::Millimetre, what);
    return bare_unit == LengthUnit::Inch ? value / kUinPerUm : value;
  }
  return parse_length_mm(s, bare_unit, what) * kUmPerMm;
}

double parse_ra_target_um(std::string_view text, LengthUnit bare_unit, std::string_view what) {
  const std::string_view s = strip_blanks(text);
  if (!s.empty() && (s.front() == 'N' || s.front() == 'n')) {
    const std::optional<Iso1302Row> row = iso1302_row(s);
    if (!row) {
      throw InputError(std::string(what) + " '" + std::string(text) +
                       "': unknown roughness grade; ISO 1302:1992 grades are N1 to N12");
    }
    return row->ra_um;
  }
  return parse_height_um(text, bare_unit, what);
}

}  // namespace cuspmap

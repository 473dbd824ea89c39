// D-word table parsing and checks (see gcode_d_radius.h). Inputs text or numbers; output mm.
// Cost O(characters). Method: plain parsing with std::from_chars (locale-free).
#include "path/gcode_d_radius.h"

#include <algorithm>
#include <charconv>

#include "core/input_error.h"

namespace cuspmap {

void check_d_radius(long long d_number, double radius_mm, const std::string& where) {
  const std::string d = where + " D" + std::to_string(d_number);
  if (d_number < 0 || d_number > kMaxDNumber) {
    throw InputError(d + ": D numbers are whole numbers from 0 to " + std::to_string(kMaxDNumber));
  }
  if (!(radius_mm >= 0.0) || radius_mm > kMaxJobLengthMm) {
    throw InputError(d + ": the tool radius " + format_number(radius_mm) +
                     " mm must be >= 0 (the side comes from G41/G42)");
  }
}

std::map<int, double> parse_d_radius_list(std::string_view text, LengthUnit bare_unit,
                                          const std::string& flag) {
  std::map<int, double> out;
  std::size_t begin = 0;
  while (begin <= text.size()) {
    const std::size_t comma = std::min(text.find(',', begin), text.size());
    const std::string_view pair = text.substr(begin, comma - begin);
    begin = comma + 1;
    const std::size_t eq = pair.find('=');
    std::string_view number = pair.substr(0, eq);
    if (!number.empty() && (number[0] == 'D' || number[0] == 'd')) number.remove_prefix(1);
    long long d = -1;
    const auto [end, ec] = std::from_chars(number.data(), number.data() + number.size(), d);
    if (eq == std::string_view::npos || number.empty() || ec != std::errc() ||
        end != number.data() + number.size()) {
      throw InputError(flag + " '" + std::string(pair) +
                       "': give D=RADIUS pairs separated by commas, e.g. 1=3mm,2=2.5");
    }
    const double radius_mm = parse_length_mm(pair.substr(eq + 1), bare_unit, flag);
    check_d_radius(d, radius_mm, flag);
    if (!out.emplace(static_cast<int>(d), radius_mm).second) {
      throw InputError(flag + " D" + std::to_string(d) + ": given twice");
    }
  }
  return out;
}

}  // namespace cuspmap

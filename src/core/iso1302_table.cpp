// ISO 1302:1992 grade text ("N6") to its table row, and the Ra limit of a row in um.
// Inputs: text; outputs: row, um. Cost O(1).
// Method: ISO 1302:1992 table of roughness grade numbers; 1 uin = 0.0254 um exactly.
#include "core/iso1302_table.h"

#include <algorithm>
#include <charconv>

#include "core/units.h"

namespace cuspmap {

std::optional<Iso1302Row> iso1302_row(std::string_view text) {
  if (text.size() < 2 || (text.front() != 'N' && text.front() != 'n')) return std::nullopt;
  const std::string_view digits = text.substr(1);
  int n = 0;
  const auto [ptr, ec] = std::from_chars(digits.data(), digits.data() + digits.size(), n);
  if (ec != std::errc() || ptr != digits.data() + digits.size() || n < 1 ||
      n > static_cast<int>(kIso1302Table.size())) {
    return std::nullopt;
  }
  return kIso1302Table[static_cast<size_t>(n - 1)];
}

double iso1302_limit_um(const Iso1302Row& row) {
  return std::max(row.ra_um, row.ra_uin / kUinPerUm);
}

}  // namespace cuspmap

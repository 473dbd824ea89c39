// ISO 1302 grade lookup: the twelve grade numbers, their Ra in um and the conventional inch value.
// Input: Ra (um); output: the grade, or none above N12.
// Method: ISO 1302:1992 roughness grade numbers N1-N12 (core/iso1302_table.h).
#include "cusp/iso1302_grade.h"

#include <cmath>

#include "core/iso1302_table.h"

namespace cuspmap {
namespace {

// Computed Ra values carry rounding near 1e-12 relative; grades are given to 2-3 digits, so a
// 1e-9 relative allowance only absorbs rounding, never a real difference.
constexpr double kGradeRelTol = 1e-9;

}  // namespace

std::string RoughnessGrade::label() const {
  std::string text(1, 'N');  // appended, not "N" + ...: GCC 12 warns falsely (-Wrestrict) there
  text += std::to_string(number);
  return text;
}

std::optional<RoughnessGrade> iso1302_grade(double ra_um) {
  if (!std::isfinite(ra_um) || ra_um < 0.0) return std::nullopt;
  for (const Iso1302Row& row : kIso1302Table) {
    if (ra_um <= iso1302_limit_um(row) * (1.0 + kGradeRelTol)) {
      return RoughnessGrade{row.grade, row.ra_um, row.ra_uin};
    }
  }
  return std::nullopt;
}

}  // namespace cuspmap

// ISO 1302 grade lookup: table of the twelve grade numbers and their Ra values.
// Input: Ra (um); output: the grade, or none above N12.
// Method: ISO 1302:1992 roughness grade numbers N1-N12.
#include "cusp/iso1302_grade.h"

#include <array>
#include <cmath>

namespace cuspmap {
namespace {

// Nominal Ra of N1 ... N12, um (ISO 1302 table; the series doubles, rounded at N9 and N10).
constexpr std::array<double, 12> kGradeRaUm = {0.025, 0.05, 0.1, 0.2,  0.4,  0.8,
                                               1.6,   3.2,  6.3, 12.5, 25.0, 50.0};
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
  for (size_t k = 0; k < kGradeRaUm.size(); ++k) {
    if (ra_um <= kGradeRaUm[k] * (1.0 + kGradeRelTol)) {
      return RoughnessGrade{static_cast<int>(k) + 1, kGradeRaUm[k]};
    }
  }
  return std::nullopt;
}

}  // namespace cuspmap

// ISO 1302 N-grade lookup of an Ra value.
// Inputs: Ra um; output: grade string. Cost O(1).
// Method: ISO 1302:1992 roughness grade numbers (from memory, see the test table).
#include "texture/iso1302_grade.h"

#include <array>
#include <cassert>

namespace cuspmap {
namespace {

constexpr std::array<double, 12> kGradeRaUm = {0.025, 0.05, 0.1, 0.2,  0.4,  0.8,
                                               1.6,   3.2,  6.3, 12.5, 25.0, 50.0};
// Ra values printed to 3-4 significant digits sit on a grade's boundary within this fraction;
// 1.6001 um still meets N7.
constexpr double kGradeBoundaryRel = 1e-4;

}  // namespace

double iso1302_grade_ra_um(int n) {
  assert(n >= 1 && n <= 12 && "ISO 1302 grades run N1..N12");
  return kGradeRaUm[static_cast<size_t>(n - 1)];
}

std::string iso1302_grade(double ra_um) {
  for (size_t k = 0; k < kGradeRaUm.size(); ++k) {
    if (ra_um <= kGradeRaUm[k] * (1.0 + kGradeBoundaryRel)) {
      std::string grade = "N";  // appended, not "N" + ...: GCC 12 warns falsely on the latter
      grade += std::to_string(k + 1);
      return grade;
    }
  }
  return "coarser than N12";
}

}  // namespace cuspmap

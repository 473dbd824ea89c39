// ISO 1302 N-grade lookup of an Ra value.
// Inputs: Ra um; output: grade string. Cost O(1).
// Method: ISO 1302:1992 roughness grade numbers, with their conventional inch values
// (core/iso1302_table.h, from memory; see the test table).
#include "texture/iso1302_grade.h"

#include <cassert>

#include "core/iso1302_table.h"

namespace cuspmap {
namespace {

// Ra values printed to 3-4 significant digits sit on a grade's boundary within this fraction;
// 1.6001 um still meets N7.
constexpr double kGradeBoundaryRel = 1e-4;

}  // namespace

double iso1302_grade_ra_um(int n) {
  assert(n >= 1 && n <= 12 && "ISO 1302 grades run N1..N12");
  return kIso1302Table[static_cast<size_t>(n - 1)].ra_um;
}

std::string iso1302_grade(double ra_um) {
  // A grade's limit is its um value or the conventional inch value beside it, whichever is
  // larger: 32 uin (0.8128 um) is N6 on an inch print.
  for (const Iso1302Row& row : kIso1302Table) {
    if (ra_um <= iso1302_limit_um(row) * (1.0 + kGradeBoundaryRel)) {
      std::string grade = "N";  // appended, not "N" + ...: GCC 12 warns falsely on the latter
      grade += std::to_string(row.grade);
      return grade;
    }
  }
  return "coarser than N12";
}

}  // namespace cuspmap

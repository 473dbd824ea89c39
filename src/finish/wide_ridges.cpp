// Wide-ridge check against ISO 4288's periodic table and its caution line.
// Inputs: spacing mm, preformatted texts; outputs: bool, text. Cost O(1).
// Method: ISO 4288:1996 Table 3 via texture/iso4288_cutoff (in_range false beyond 4 mm).
#include "finish/wide_ridges.h"

#include "texture/iso4288_cutoff.h"

namespace cuspmap {

namespace {

// Marks finer than this are below the table's first row (RSm <= 0.013 mm), which is out of range
// too but no ridge; any spacing between the table's ends works as the divide.
constexpr double kCoarseSideMm = 1.0;

}  // namespace

bool ridges_hidden_by_ra(double spacing_mm, double cusp_um, double ra_um) {
  return spacing_mm > kCoarseSideMm && !cutoff_for_rsm(spacing_mm).in_range &&
         cusp_um > kRidgeRzOverRa * ra_um;
}

std::string wide_ridges_caution(const std::string& cusp_text, const std::string& spacing_text) {
  return "Ra hides these ridges: cusps " + cusp_text + " high every " + spacing_text +
         " are spaced beyond ISO 4288's periodic table (RSm <= 4 mm), so a roughness measurement "
         "(cut-off <= 8 mm) filters them as waviness; specify the cusp height (Rz) or a "
         "waviness limit, or step over less";
}

}  // namespace cuspmap

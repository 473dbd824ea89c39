// The fine-Ra caution text (see kinematic_limits.h for the threshold's source).
// Inputs: Ra um; output: one line or "".
#include "cusp/kinematic_limits.h"

#include "core/units.h"

namespace cuspmap {

std::string fine_ra_caution(double ra_um) {
  if (!(ra_um < kFineRaCautionUm)) return "";
  return "predicted Ra " + format_number(ra_um) + " um is below 0.2 um, finer than milling "
         "usually measures: expect the real surface to be rougher (kinematic best case)";
}

}  // namespace cuspmap

// The fine-Ra caution text (see kinematic_limits.h for the threshold's source).
// Inputs: Ra um; output: one line or "".
#include "cusp/kinematic_limits.h"

#include "core/display_quantity.h"
#include "core/units.h"

namespace cuspmap {

std::string fine_ra_caution(double ra_um, LengthUnit unit) {
  if (!(ra_um < kFineRaCautionUm)) return "";
  // Inch prints use the conventional 8 uin for 0.2 um (ISO 1302:1992 table's inch column).
  return "predicted Ra " + display_roughness(ra_um, unit) + " is below " +
         (unit == LengthUnit::Inch ? "8 uin (0.2 um)" : "0.2 um") +
         ", finer than milling usually measures: expect the real surface to be rougher "
         "(kinematic best case)";
}

}  // namespace cuspmap

// Caution texts for sanding outputs (human lines and JSON cautions[]).
// Method: general shop-safety practice (common practice, no source).
#include "finish/finishing_cautions.h"

namespace cuspmap {

std::vector<std::string> sanding_cautions() {
  return {
      kSandingDustCaution,
      "Fine metal dust and fines are combustible, fine aluminium dust in particular: keep them "
      "away from sparks (never share an extractor with steel grinding), flames and heat, and "
      "clean up wet, never with compressed air.",
      "These are estimates, not a safety assessment: follow local codes, the material's safety "
      "data sheet, the machine and abrasive makers' instructions and licensed practice.",
  };
}

}  // namespace cuspmap

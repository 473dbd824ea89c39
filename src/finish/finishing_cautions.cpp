// Caution texts for sanding and machining outputs (human lines and JSON cautions[]).
// Method: general shop-safety practice (common practice, no source).
#include "finish/finishing_cautions.h"

namespace cuspmap {

std::vector<std::string> sanding_cautions() {
  return {
      "Sanding metal makes fine dust: sand wet or under extraction, ventilate the room, and wear "
      "respiratory protection rated for the dust, plus eye protection.",
      "Fine metal dust and fines are combustible, fine aluminium dust in particular: keep them "
      "away from sparks (never share an extractor with steel grinding), flames and heat, and "
      "clean up wet, never with compressed air.",
      "These are estimates, not a safety assessment: follow local codes, the material's safety "
      "data sheet, the machine and abrasive makers' instructions and licensed practice.",
  };
}

std::vector<std::string> machining_cautions() {
  return {
      "Rotating tools and moving axes: keep guards closed, check workholding and tool clamping, "
      "and prove a new program above the part before cutting.",
      "Follow local codes, the machine maker's instructions and licensed practice; these figures "
      "are estimates, not a safety assessment.",
  };
}

}  // namespace cuspmap

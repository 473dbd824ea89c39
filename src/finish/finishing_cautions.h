// Safety cautions shown with every output that leads someone to a sanding bench: dust,
// ventilation and respiratory protection, combustible metal fines (fine aluminium dust above
// all), and deference to local codes, the makers' instructions and licensed practice.
// Method: general shop-safety practice (common practice, no source); not a safety assessment.
#pragma once

#include <string>
#include <vector>

namespace cuspmap {

/// The dust line: wet sanding or extraction, ventilation, respiratory and eye protection.
inline constexpr const char* kSandingDustCaution =
    "Sanding metal makes fine dust: sand wet or under extraction, ventilate the room, and wear "
    "respiratory protection rated for the dust, plus eye protection.";

/// Cautions for hand sanding and polishing metal, one line each, in the order to show them:
/// kSandingDustCaution, combustible fines, deference to codes and makers.
std::vector<std::string> sanding_cautions();

}  // namespace cuspmap

// Safety cautions shown with every output that leads someone to act at a sanding bench or a
// machine: dust, ventilation and respiratory protection, combustible metal fines, rotating tools
// and workholding, and deference to local codes, the machine maker and licensed practice.
// Method: general shop-safety practice (common practice, no source); not a safety assessment.
#pragma once

#include <string>
#include <vector>

namespace cuspmap {

/// Cautions for hand sanding and polishing metal, one line each, in the order to show them.
std::vector<std::string> sanding_cautions();

/// Cautions for running a finishing pass (rotating tools, workholding), one line each.
std::vector<std::string> machining_cautions();

}  // namespace cuspmap

// Trace dropouts bridged linearly (see bridge_trace_gaps.h).
// Inputs: runs (z um over x mm); output: joined runs. Cost O(points).
// Method: linear interpolation between the samples either side of each short gap.
#include "texture/bridge_trace_gaps.h"

#include <cmath>

namespace cuspmap {

std::vector<ProfileTrace> bridge_trace_gaps(const std::vector<ProfileTrace>& runs,
                                            int max_gap_points, int* bridged) {
  std::vector<ProfileTrace> out;
  if (bridged != nullptr) *bridged = 0;
  for (const ProfileTrace& r : runs) {
    if (!out.empty()) {
      ProfileTrace& last = out.back();
      const double dx = last.spacing_mm;
      const double end_mm = last.start_mm + last.length_mm();
      const long gap = std::lround((r.start_mm - end_mm) / dx) - 1;  // missing samples between
      if (gap >= 0 && gap <= max_gap_points && !last.z_um.empty() && !r.z_um.empty()) {
        const double z0 = last.z_um.back(), z1 = r.z_um.front();
        for (long k = 1; k <= gap; ++k) {
          const double f = static_cast<double>(k) / static_cast<double>(gap + 1);
          last.z_um.push_back(z0 + (z1 - z0) * f);
        }
        last.z_um.insert(last.z_um.end(), r.z_um.begin(), r.z_um.end());
        if (bridged != nullptr) ++*bridged;
        continue;
      }
    }
    out.push_back(r);
  }
  return out;
}

}  // namespace cuspmap

// RSm: mean width of profile elements after height and width discrimination.
// Inputs: heights um about the mean line; output: mean element width mm (or none).
// Method: ISO 4287:1997 §3.2.2, §3.1.9, §4.3.1; crossings of the mean line located by linear
// interpolation between samples.
#include "texture/mean_element_width.h"

#include <algorithm>
#include <cmath>
#include <vector>

namespace cuspmap {
namespace {

// One part of the profile between two crossings of the mean line.
struct Segment {
  bool peak;         // above the mean line
  double height_um;  // highest point above (peak) or deepest below (valley), positive
  double width_mm;   // crossing to crossing
};

bool fails(const Segment& s, double min_height_um, double min_width_mm) {
  return s.height_um < min_height_um || s.width_mm < min_width_mm;
}

}  // namespace

std::optional<double> mean_element_width(std::span<const double> z_um, double spacing_mm,
                                         double min_height_um, double min_width_mm) {
  const size_t n = z_um.size();
  if (n < 3) return std::nullopt;
  // Crossings: positions (mm) where the sign changes; a zero sample counts as below the line.
  std::vector<double> cross_mm;
  std::vector<Segment> segments;
  double extreme = 0.0;
  bool above = z_um[0] > 0.0;
  for (size_t i = 1; i < n; ++i) {
    const bool now_above = z_um[i] > 0.0;
    extreme = std::max(extreme, std::abs(z_um[i - 1]));
    if (now_above != above) {
      const double a = z_um[i - 1], b = z_um[i];
      const double t = (a == b) ? 0.5 : a / (a - b);
      const double x = (static_cast<double>(i - 1) + t) * spacing_mm;
      if (!cross_mm.empty()) segments.push_back({above, extreme, x - cross_mm.back()});
      cross_mm.push_back(x);
      extreme = 0.0;
      above = now_above;
    }
  }
  // Merge the least significant failing segment into its neighbours until none fails.
  for (;;) {
    size_t worst = segments.size();
    for (size_t k = 0; k < segments.size(); ++k) {
      if (!fails(segments[k], min_height_um, min_width_mm)) continue;
      if (worst == segments.size() || segments[k].height_um < segments[worst].height_um) worst = k;
    }
    if (worst == segments.size()) break;
    if (worst == 0 || worst + 1 == segments.size()) {
      // At either end there is only one neighbour: the part joins the incomplete remainder.
      segments.erase(segments.begin() + static_cast<std::ptrdiff_t>(worst));
      continue;
    }
    Segment& left = segments[worst - 1];
    const Segment& right = segments[worst + 1];
    left.width_mm += segments[worst].width_mm + right.width_mm;
    left.height_um = std::max(left.height_um, right.height_um);
    segments.erase(segments.begin() + static_cast<std::ptrdiff_t>(worst),
                   segments.begin() + static_cast<std::ptrdiff_t>(worst) + 2);
  }
  // An element is a peak and the valley after it.
  size_t k = (!segments.empty() && !segments[0].peak) ? 1 : 0;
  double total_mm = 0.0;
  int elements = 0;
  for (; k + 1 < segments.size(); k += 2) {
    total_mm += segments[k].width_mm + segments[k + 1].width_mm;
    ++elements;
  }
  if (elements == 0) return std::nullopt;
  return total_mm / elements;
}

}  // namespace cuspmap

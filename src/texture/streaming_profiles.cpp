// Trace collection from bands: pick lines as extract_profiles does, copy their centred samples.
// Inputs: bands (um); output: traces (um, mm). Method: see streaming_profiles.h.
#include "texture/streaming_profiles.h"

#include <algorithm>
#include <cmath>
#include <limits>

namespace cuspmap {

TraceCollector::TraceCollector(int nx, int ny, double cell_mm, bool along_y, int max_traces,
                               double max_length_mm)
    : nx_(nx), ny_(ny), cell_mm_(cell_mm), along_y_(along_y) {
  const int length = along_y ? ny : nx;  // samples along a trace
  const int lines = along_y ? nx : ny;   // parallel lines across
  const long cap = static_cast<long>(std::floor(max_length_mm / cell_mm)) + 1;
  count_ = static_cast<int>(std::min<long>(length, std::max<long>(2, cap)));
  first_ = (length - count_) / 2;
  const long used = std::min<long>(lines, std::max(1, max_traces));
  const double centre = 0.5 * (lines - 1);
  for (long k = 0; k < used; ++k) {
    // Evenly spread pick of `used` lines among `lines`, both outermost included (as
    // extract_profiles picks them).
    const long line = used == 1 ? lines / 2 : (k * (lines - 1) + (used - 1) / 2) / (used - 1);
    // Along +Y the offset (across, to the left of the direction) runs along -X.
    const int index = along_y ? static_cast<int>(lines - 1 - line) : static_cast<int>(line);
    lines_.push_back(index);
    offset_mm_.push_back(along_y ? (centre - index) * cell_mm : (index - centre) * cell_mm);
    z_um_.emplace_back(count_, std::numeric_limits<double>::quiet_NaN());
  }
}

void TraceCollector::add_band(const Heightfield& band, int j0) {
  for (std::size_t t = 0; t < lines_.size(); ++t) {
    std::vector<double>& z = z_um_[t];
    if (along_y_) {
      const int lo = std::max(j0, first_), hi = std::min(j0 + band.ny, first_ + count_);
      for (int j = lo; j < hi; ++j) z[j - first_] = band.z_um(j - j0, lines_[t]);
    } else if (lines_[t] >= j0 && lines_[t] < j0 + band.ny) {
      for (int s = 0; s < count_; ++s) z[s] = band.z_um(lines_[t] - j0, first_ + s);
    }
  }
}

std::vector<ProfileTrace> TraceCollector::traces(double min_length_mm) const {
  // Same slack as extract_profiles: lengths are sums of cell sizes.
  const double eps = 1e-7 * cell_mm_;
  const int length = along_y_ ? ny_ : nx_;
  const double start0 = (first_ - 0.5 * (length - 1)) * cell_mm_;
  std::vector<ProfileTrace> out;
  for (std::size_t t = 0; t < lines_.size(); ++t) {
    ProfileTrace run;
    run.spacing_mm = cell_mm_;
    run.offset_mm = offset_mm_[t];
    auto flush = [&] {
      if (!run.z_um.empty() && run.length_mm() >= min_length_mm - eps) out.push_back(run);
      run.z_um.clear();
    };
    for (int s = 0; s < count_; ++s) {
      const double v = z_um_[t][s];
      if (std::isnan(v)) {
        flush();
        continue;
      }
      if (run.z_um.empty()) run.start_mm = start0 + s * cell_mm_;
      run.z_um.push_back(v);
    }
    flush();
  }
  return out;
}

}  // namespace cuspmap

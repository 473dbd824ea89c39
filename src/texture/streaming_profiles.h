// Profile traces of a heightfield that arrives in bands: the grid columns (traces along Y) or
// rows (along X) that extract_profiles would pick, copied as the bands pass, cut to a centred
// length and split at unreached cells. Inputs: bands (um over mm cells); output: ProfileTrace
// runs. Cost O(traces x length); memory the same.
// Method: ISO 4288:1996 §7 traverse length = evaluation length (5 cut-offs) plus run-in and
// run-out; axis-aligned traces read stored heights exactly (as extract_profiles does).
#pragma once

#include <vector>

#include "core/heightfield.h"
#include "texture/extract_profiles.h"

namespace cuspmap {

/// Longest trace kept in streamed mode: 6 of the longest ISO 4288 cut-off (8 mm), i.e. five
/// sampling lengths plus half a cut-off of run-in and run-out each.
inline constexpr double kStreamTraceMaxMm = 48.0;
/// Traces kept in streamed mode at most (common practice, no source: bounds the Gaussian
/// filtering cost of long fine-cell traces; ISO 4288 asks for several, not a number).
inline constexpr int kStreamMaxTraces = 16;

/// Collects axis-aligned traces from bands.
class TraceCollector {
 public:
  /// @param[in] along_y     true: traces along +Y (direction 90 deg, grid columns); false: along
  ///                        +X (0 deg, grid rows)
  /// @param[in] max_traces  parallel traces (>= 1), spread as extract_profiles spreads them
  /// @param[in] max_length_mm  longest trace, centred on the grid
  TraceCollector(int nx, int ny, double cell_mm, bool along_y, int max_traces,
                 double max_length_mm);
  /// Copies the samples of a band whose first row is grid row j0.
  void add_band(const Heightfield& band, int j0);
  /// Runs of finite samples at least min_length_mm long, in order of offset then position.
  std::vector<ProfileTrace> traces(double min_length_mm) const;

 private:
  int nx_, ny_;
  double cell_mm_;
  bool along_y_;
  int first_, count_;           // first sample index along the trace and sample count
  std::vector<int> lines_;      // the grid columns (along_y) or rows picked
  std::vector<double> offset_mm_;
  std::vector<std::vector<double>> z_um_;
};

}  // namespace cuspmap

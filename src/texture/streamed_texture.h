// Texture report of a heightfield too large to hold, built from two passes over its bands:
// pass 1 the plane, extremes, overview, profile traces and the two full-length centre traces
// profile.png draws; pass 2 the residual moments. Sa, Sq,
// Sp, Sv, Sz, Ssk, Sku are exact (the same as texture_report's to float rounding); profile
// parameters come from axis-aligned traces of bounded length; Sdr, Sal, Str and the S/L areal
// filters need the whole field and are left out with a warning.
// Inputs: bands (um over mm cells), TextureOptions; output: TextureReport, overview.
// Method: ISO 25178-2:2012 §3.1.8, §4.1; ISO 4287/4288 via fill_profile_report.
#pragma once

#include <array>
#include <cstdint>
#include <optional>

#include "core/heightfield.h"
#include "texture/block_mean_overview.h"
#include "texture/streaming_areal.h"
#include "texture/streaming_profiles.h"
#include "texture/texture_report.h"

namespace cuspmap {

/// Longest centre trace kept for profile.png in streamed mode, samples: 8 MiB of doubles per
/// trace, a 1 m side at 1 um; a longer side is drawn over its centred part (common practice, no
/// source: a picture shows at most a few thousand samples' detail anyway).
inline constexpr int kStreamPictureTraceMaxSamples = 1 << 20;

/// Accumulates a streamed texture report over two passes of the same bands.
class StreamedTexture {
 public:
  /// For a grid of nx x ny cells (origin and cell as the bands'), options as texture_report's.
  StreamedTexture(int nx, int ny, double cell_mm, double origin_x_mm, double origin_y_mm,
                  const TextureOptions& options, int threads);
  /// Pass 1: a band whose first row is grid row j0.
  void add_first_pass(const Heightfield& band, int j0);
  /// Ends pass 1 (solves the plane). @throws InputError when no cell was finite.
  void finish_first_pass();
  /// Pass 2: the same band again (after finish_first_pass).
  void add_second_pass(const Heightfield& band);
  /// The report (after pass 2). @throws InputError when the traces are shorter than two of the
  /// smallest cut-off.
  TextureReport report() const;
  /// Block-mean overview of the field (after pass 1).
  Heightfield overview() const { return overview_.result(); }
  /// The runs of finite samples of the centre trace across the lay (k = 0, at the report's
  /// direction_deg) and along it (k = 1, 90 deg further), as extract_profiles(floor, deg, 1, 0)
  /// returns them in memory (after pass 1). Traces longer than kStreamPictureTraceMaxSamples
  /// keep their centred part.
  std::vector<ProfileTrace> centre_trace(int k) const { return centre_[k]->traces(0.0); }
  /// Cells per overview block side.
  int overview_cells_per_block() const { return overview_.cells_per_block(); }
  /// Lowest and highest finite raw heights, um (after pass 1).
  double min_um() const { return plane_.min_um; }
  double max_um() const { return plane_.max_um; }  ///< see min_um
  /// Finite cells seen in pass 1.
  std::int64_t reached() const { return plane_.reached; }

 private:
  int nx_, ny_;
  double cell_mm_;
  TextureOptions options_;
  int threads_;
  double direction_deg_ = 0.0;
  std::string direction_label_;
  std::vector<std::string> warnings_;
  StreamingPlane plane_;
  Plane solved_;
  BlockMeanOverview overview_;
  std::optional<TraceCollector> traces_;
  std::array<std::optional<TraceCollector>, 2> centre_;  // across, along the lay (profile.png)
  ArealMoments moments_;
};

}  // namespace cuspmap

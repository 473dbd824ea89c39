// Streaming sweep for floors too large for one grid: the patch is swept in horizontal bands of
// whole tile rows, each band handed to a consumer and then reused, so grid memory stays at one
// band (bounded by the memory limit) whatever the patch size. Heights um above the floor,
// bit-identical to simulate_floor's rows. Cost O(cells x moves reaching them) / threads, plus
// O(moves x bands they cross) for the two-level spatial index (bands, then tiles).
// Method: tiled Z-map (Choi & Jerard 1998) with uniform-grid binning (Akenine-Moller et al.,
// Real-Time Rendering 4th ed., §19.1), swept band by band.
#pragma once

#include <cstdint>
#include <functional>

#include "core/heightfield.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "sweep/simulate_floor.h"
#include "tool/cutter.h"

namespace cuspmap {

/// How a patch is cut into bands.
struct BandPlan {
  int nx = 0;                    ///< grid columns
  int ny = 0;                    ///< grid rows
  int band_rows = 0;             ///< rows per band (a multiple of the tile height, except the last)
  int bands = 0;                 ///< number of bands
  std::int64_t band_bytes = 0;   ///< bytes of one band's grid (the peak grid memory)
  std::int64_t limit_bytes = 0;  ///< the memory limit the plan respects
};

/// Plans the bands of a patch.
/// @param[in] patch             validated patch
/// @param[in] max_memory_bytes  limit; 0 = half of physical memory. A band takes at most a
///                              quarter of it and at most kMaxBandBytes, and at least one tile row.
/// @throws InputError when a single tile row of the grid exceeds the limit, or a dimension
///         exceeds 2^31 - 1 cells
BandPlan plan_bands(const Patch& patch, std::int64_t max_memory_bytes);

/// Largest band grid (bytes): big enough that each band has many tiles for the threads and the
/// per-band set-up is negligible, small enough to leave memory to everything else.
inline constexpr std::int64_t kMaxBandBytes = std::int64_t{64} << 20;

/// Receives one band: rows j0 .. j0 + band.ny - 1 of the grid (band.origin_y_mm is set so that
/// band.y_mm(j) is the grid row's centre). The band is only valid during the call.
using BandSink = std::function<void(const Heightfield& band, int j0)>;

/// Sweeps the floor band by band, bottom (j = 0) to top, calling `sink` for each band in order.
/// @param[in] cutter, path, cut, patch, sim  as for simulate_floor (sim.progress gets the done
///                                           fraction over all bands)
/// @param[in] plan    from plan_bands for this patch
/// @param[in] sink    consumer of each band
/// @param[out] stats  optional counters (summed over bands)
void simulate_bands(const Cutter& cutter, const Toolpath& path, const CutSpec& cut,
                    const Patch& patch, const SimSpec& sim, const BandPlan& plan,
                    const BandSink& sink, SweepStats* stats = nullptr);

}  // namespace cuspmap

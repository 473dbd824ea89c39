// Height parameters of the floor a raster leaves, from a simulation of a small window: whole
// periods across the passes (between guard bands wider than the cutter's reach), a few cells
// along them, swept by the revolving-cutter envelope, then ISO 25178-2 parameters after
// least-squares plane removal. Heights um, lengths mm.
// Cost: one sweep of (kWindowPeriods + 2 guard periods) x cells/period x cells along; guards
// span R (tilt, dish, runout) or only the nearest pass's reach (ends lowest on their axis).
// Method: simulate_floor (DESIGN.md "Geometry") + texture/fit_plane + areal_parameters.
#pragma once

#include "finish/surface_heights.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Periods (stepovers) across the window; whole periods keep the statistics unbiased.
inline constexpr int kWindowPeriods = 6;
/// Least cells per stepover: odd, so a cell centre falls on every cusp crest (half a period from
/// a pass) and the sampled Sz is not short of the crest; 41 keeps Sv within ~0.1% (midpoint rule)
/// when the arcs span the whole period (ball).
inline constexpr int kCellsPerPeriod = 41;
/// Least cells across each arc of the profile (a bull-nose's arcs are a narrow part of the
/// period: sampling them with a few cells would bias Sv by ~10%).
inline constexpr int kCellsPerArc = 20;
/// Most cells per stepover (bounds the window when the arcs are a sliver of the period).
inline constexpr int kMaxCellsPerPeriod = 2001;
/// Cells along the passes: the envelope of straight passes does not vary along them.
inline constexpr int kWindowCellsAlong = 12;
/// Tooth-resolved windows: revolutions of feed along the passes (whole periods of the marks a
/// runout or tilt repeats once per revolution), and cells per feed per tooth (the marks' spacing).
inline constexpr int kWindowRevolutions = 4;
inline constexpr int kCellsPerToothMark = 8;

/// How the window is swept: the revolving envelope, or tooth by tooth as a job asks
/// ([sim] tooth_marks) at its spindle speed and feed, so `plan` and `simulate` agree.
struct WindowSweep {
  bool tooth_marks = false;  ///< tooth-resolved sweep (true) or revolving envelope (false)
  CutSpec cut;               ///< rpm, feed, spindle direction (tooth-resolved sweep only)
};

/// Simulates the window and returns its height parameters; Ra is taken as Sa of the window
/// (equal for a texture extruded along the feed, as the revolving envelope of straight passes
/// is; with tooth marks the areal Sa of the window).
/// @param[in] cutter       validated cutter (tilt, dish, runout all simulated)
/// @param[in] stepover_mm  > 0, <= D
/// @param[in] direction    one-way or zigzag (matters for a tilted cutter)
/// @param[in] sweep        envelope (default) or tooth-resolved at the job's rpm and feed: the
///                         window then spans kWindowRevolutions of feed along the passes with
///                         cells no wider than the feed per tooth / kCellsPerToothMark
SurfaceHeights simulated_cusp_heights(const Cutter& cutter, double stepover_mm,
                                      RasterDirection direction, const WindowSweep& sweep = {});

}  // namespace cuspmap

// profile.png: up to two profiles stacked, each with its mean line, the Ra band (mean line +- Ra),
// a bar of length Rz, 1-2-5 ticks, units and a key; inputs are plain data (x mm, z um), not
// texture/ types. Cost: O(points + pixels).
// Method: Ra, Rz as ISO 4287:1997 defines them (given); Heckbert, Graphics Gems I, 1990 ticks.
#pragma once

#include <string>
#include <vector>

#include "core/units.h"
#include "io/raster_image.h"

namespace cuspmap {

/// One profile to plot (all vectors the same length, x ascending).
struct ProfilePlotData {
  std::vector<double> x_mm;          ///< position along the trace, mm
  std::vector<double> z_um;          ///< profile height, um (NaN samples break the line)
  std::vector<double> mean_line_um;  ///< filtered mean line at x_mm, um; empty = not drawn
  double ra_um = 0.0;                ///< Ra of the roughness profile, um
  double rz_um = 0.0;                ///< Rz of the roughness profile, um
  double cutoff_mm = 0.0;            ///< the cut-off lc used, mm (0 = not stated)
  std::string title;                 ///< e.g. "cross-feed profile (along Y)"
};

/// Picture size and units.
struct ProfilePlotOptions {
  int width_px = 960;                         ///< whole picture width
  int panel_height_px = 340;                  ///< height of each stacked panel
  LengthUnit units = LengthUnit::Millimetre;  ///< x in mm / in, heights in um / uin
  int text_scale = 2;                         ///< text size
};

/// Where one panel's plot area sits and which values it spans (display units: mm or in for x,
/// um or uin for z). Pixel columns grow with x, rows shrink with z.
struct PlotFrame {
  int left_px = 0, top_px = 0, width_px = 0, height_px = 0;  ///< plot area in the image
  double x_lo = 0.0, x_hi = 1.0;                             ///< x at the left and right edges
  double z_lo = 0.0, z_hi = 1.0;                             ///< z at the bottom and top edges
  int rz_bar_x_px = 0;  ///< column of the Rz bar, right of the plot area
  /// Column of a display-unit x.
  double px_of_x(double x) const { return left_px + (x - x_lo) / (x_hi - x_lo) * (width_px - 1); }
  /// Row of a display-unit z.
  double py_of_z(double z) const { return top_px + (z_hi - z) / (z_hi - z_lo) * (height_px - 1); }
};

/// The picture and the frames of its panels (for callers and tests that locate features).
struct ProfilePlot {
  Image image;                    ///< RGB, width_px x (panels x panel_height_px)
  std::vector<PlotFrame> panels;  ///< one per profile, top to bottom
};

/// Colours of the plot's lines; each also differs in style (width, dashes) so colour is not
/// the only cue.
inline constexpr Color kProfileColor = kBlack;         ///< profile, 1 px solid
inline constexpr Color kMeanLineColor = {0, 92, 200};  ///< mean line, 2 px solid
inline constexpr Color kRaBandColor = {200, 90, 0};    ///< mean +- Ra, 2 px dashed
inline constexpr Color kRzBarColor = {150, 0, 60};     ///< Rz bar, 3 px with end caps

/// Renders up to two profiles stacked.
/// @param[in] profiles  1 or 2 profiles, each with >= 2 samples and equal-length vectors
/// @throws std::invalid_argument for 0 or more than 2 profiles, mismatched or too short vectors
///         (the caller builds these; a mismatch is a programming error)
ProfilePlot render_profile_plot(const std::vector<ProfilePlotData>& profiles,
                                const ProfilePlotOptions& options);

}  // namespace cuspmap

// The pictures and heightmap file of one simulation: height.png (gray + legend), shaded.png
// (Lambert relief), both anti-aliased overviews with the detail window outlined; detail.png and
// detail_shaded.png (a ~1.5 mm window at native resolution where the marks are deepest);
// profile.png (cross- and along-feed traces with mean line, Ra, Rz) and height.npy, encoded in
// memory; plus the facts report.json and the HTML page state about them.
// Inputs: JobRun (um over mm cells), display units, optional fixed height range.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/units.h"
#include "report/detail_view.h"
#include "report/height_image.h"
#include "report/html_report.h"
#include "report/profile_plot.h"
#include "report/shaded_image.h"
#include "io/simulate_report.h"
#include "job/run_job.h"

namespace cuspmap {

/// Encoded files of one simulation and what they show.
struct SimulationPictures {
  std::string height_png;              ///< height.png bytes (the fixed range when one is given)
  std::string height_own_png;          ///< the same floor on its own range; only when asked for
                                       ///< beside a shared range (compare, demo), else empty
  std::string shaded_png;              ///< shaded.png bytes
  std::string profile_png;             ///< profile.png bytes
  ShadedImage shaded;                  ///< the shaded picture (for montages) and its light; RGB
                                       ///< with the detail window outlined when there is one
  bool has_detail = false;             ///< false for a streamed floor (no native cells kept)
  DetailWindow detail;                 ///< where the detail view lies
  std::string detail_png;              ///< detail.png: the window's heights on their own range
  std::string detail_shaded_png;       ///< detail_shaded.png: the window's relief
  ShadedImage detail_shaded;           ///< the detail relief (for montages)
  std::string height_caption;          ///< one line: range, scale, orientation
  std::string height_own_caption;      ///< one line, for height_own_png
  std::string detail_caption;          ///< where the window is, why there, scale and range
  std::string shaded_caption;          ///< one line: light, exaggeration
  std::string profile_caption;         ///< one line: what the traces are
  ImageFacts facts;                    ///< for report.json
};

/// height.png on a fixed (shared) or automatic range and, when asked, the same floor on its
/// own range, each titled on the picture with the scale it uses.
struct HeightPictures {
  HeightImage shared;               ///< the range given (or automatic when none is)
  std::optional<HeightImage> own;   ///< own range; only with a range and own_range_too
  std::string shared_caption;       ///< one line, naming the scale when both are drawn
  std::string own_caption;          ///< one line for `own`
};

/// Renders height.png (and its own-range twin). Titles ("Shared scale: ...", "Own range: ...")
/// are drawn only when both pictures are made.
HeightPictures render_height_pictures(const Heightfield& floor, LengthUnit units,
                                      const std::optional<HeightRange>& range,
                                      bool own_range_too);

/// Renders the pictures of the floor itself (height, shaded relief, detail view), everything
/// but profile.png; needs only the floor, so it can run beside the texture report.
/// @param[in] floor     the swept floor (um), or a streamed run's overview
/// @param[in] streamed  the floor is an overview of block means: no detail view
/// @param[in] units, range, cells_per_pixel, own_range_too  as render_simulation_pictures
SimulationPictures render_floor_pictures(const Heightfield& floor, bool streamed,
                                         LengthUnit units, const std::optional<HeightRange>& range,
                                         int cells_per_pixel = 0, bool own_range_too = false);


/// profile.png of an in-memory floor from its texture report's profile side alone (lay and
/// cut-off), so it can be drawn as soon as that side is done; empty when no centre trace has
/// two samples. The same bytes add_profile_picture makes from the finished run.
/// @param[in] floor    the swept floor (um)
/// @param[in] profile  the texture report's profile side of that floor
/// @param[in] units    axis units
std::string render_profile_png(const Heightfield& floor, const ProfileReport& profile,
                               LengthUnit units);

/// Sets profile.png (bytes from render_profile_png, may be empty) and its caption.
void set_profile_picture(std::string png, SimulationPictures& pics);

/// Adds profile.png (needs the texture report's lay and cut-off) and its caption.
/// @param[in]  run    a finished simulation
/// @param[in]  units  axis units
/// @param[out] pics   pictures from render_floor_pictures of run.floor
void add_profile_picture(const JobRun& run, LengthUnit units, SimulationPictures& pics);

/// Renders the pictures: render_floor_pictures, then add_profile_picture.
/// @param[in] run     a finished simulation
/// @param[in] units   legend and axis units
/// @param[in] range   fixed height range for height.png (shared scale); empty = auto
/// @param[in] cells_per_pixel  > 0 forces the shaded picture's scale (compare); 0 = auto
/// @param[in] own_range_too  with a range: also render height_own_png on the floor's own range,
///                           and title both pictures with the scale they use
SimulationPictures render_simulation_pictures(const JobRun& run, LengthUnit units,
                                              const std::optional<HeightRange>& range,
                                              int cells_per_pixel = 0, bool own_range_too = false);

/// Traces for profile.png: the centre trace across the lay and the one along it, each with its
/// Gaussian mean line at the report's cut-off and its own Ra and Rz. In memory they are read
/// from run.floor; streamed, from run.centre_traces (the same samples, collected band by band).
std::vector<ProfilePlotData> simulation_profiles(const JobRun& run);

/// The HTML page of one simulation (inputs, results, pictures, filters, notes, cautions).
HtmlReport simulation_html_report(const Job& job, const JobRun& run,
                                  const SimulationPictures& pictures, LengthUnit units);

}  // namespace cuspmap

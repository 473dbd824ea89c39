// The pictures and heightmap file of one simulation: height.png (gray + legend), shaded.png
// (Lambert relief), profile.png (cross- and along-feed traces with mean line, Ra, Rz) and
// height.npy, encoded in memory; plus the facts report.json and the HTML page state about them.
// Inputs: JobRun (um over mm cells), display units, optional fixed height range.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "core/units.h"
#include "report/height_image.h"
#include "report/html_report.h"
#include "report/profile_plot.h"
#include "report/shaded_image.h"
#include "io/simulate_report.h"
#include "job/run_job.h"

namespace cuspmap {

/// Encoded files of one simulation and what they show.
struct SimulationPictures {
  std::string height_png;              ///< height.png bytes
  std::string shaded_png;              ///< shaded.png bytes
  std::string profile_png;             ///< profile.png bytes
  std::string height_npy;              ///< height.npy bytes (float32 um, rows along Y); empty
                                       ///< when streamed (see io/npy_band_writer.h)
  ShadedImage shaded;                  ///< the shaded picture (for montages) and its light
  std::string height_caption;          ///< one line: range, scale, orientation
  std::string shaded_caption;          ///< one line: light, exaggeration
  std::string profile_caption;         ///< one line: what the traces are
  ImageFacts facts;                    ///< for report.json
};

/// Renders the pictures.
/// @param[in] run     a finished simulation
/// @param[in] units   legend and axis units
/// @param[in] range   fixed height range for height.png (shared scale); empty = auto
/// @param[in] cells_per_pixel  > 0 forces the shaded picture's scale (compare); 0 = auto
SimulationPictures render_simulation_pictures(const JobRun& run, LengthUnit units,
                                              const std::optional<HeightRange>& range,
                                              int cells_per_pixel = 0);

/// Traces for profile.png: the centre trace across the lay and the one along it, each with its
/// Gaussian mean line at the report's cut-off and its own Ra and Rz. In memory they are read
/// from run.floor; streamed, from run.centre_traces (the same samples, collected band by band).
std::vector<ProfilePlotData> simulation_profiles(const JobRun& run);

/// The HTML page of one simulation (inputs, results, pictures, filters, notes, cautions).
HtmlReport simulation_html_report(const Job& job, const JobRun& run,
                                  const SimulationPictures& pictures, LengthUnit units);

}  // namespace cuspmap

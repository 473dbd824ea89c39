// Streamed texture report: trace direction from the known lay (snapped to a grid axis), two
// passes of band statistics, then the same profile side as texture_report.
// Inputs: bands, options; output: TextureReport. Method: see streamed_texture.h.
#include "texture/streamed_texture.h"

#include <algorithm>
#include <cmath>

#include "core/input_error.h"
#include "core/units.h"
#include "texture/iso4288_cutoff.h"

namespace cuspmap {
namespace {

double wrap_180(double deg) {
  double a = std::fmod(deg, 180.0);
  if (a < 0.0) a += 180.0;
  return a;
}

}  // namespace

StreamedTexture::StreamedTexture(int nx, int ny, double cell_mm, double origin_x_mm,
                                 double origin_y_mm, const TextureOptions& options, int threads)
    : nx_(nx),
      ny_(ny),
      cell_mm_(cell_mm),
      options_(options),
      threads_(threads),
      plane_(nx, ny, cell_mm, origin_x_mm, origin_y_mm),
      overview_(nx, ny, cell_mm, origin_x_mm, origin_y_mm) {
  // The lay cannot be detected without the whole field: it must be known (the path's pass
  // direction) or the traces run along X.
  double wanted = 0.0;
  if (options.direction == ProfileDirection::Angle) {
    direction_label_ = "angle";
    wanted = options.direction_deg;
  } else {
    direction_label_ = options.direction == ProfileDirection::Across ? "across" : "along";
    if (options.lay_deg) {
      wanted = *options.lay_deg + (options.direction == ProfileDirection::Across ? 90.0 : 0.0);
    } else {
      warnings_.push_back("streamed mode: the lay cannot be detected without the whole field; "
                          "profiles traced along X");
    }
  }
  wanted = wrap_180(wanted);
  const bool along_y = wanted >= 45.0 && wanted < 135.0;
  direction_deg_ = along_y ? 90.0 : 0.0;
  if (wanted != direction_deg_) {
    warnings_.push_back("streamed mode: profiles traced at " + format_number(direction_deg_) +
                        " deg, the grid axis nearest to " + format_number(wanted) + " deg");
  }
  traces_.emplace(nx, ny, cell_mm, along_y, std::min(options.max_traces, kStreamMaxTraces),
                  kStreamTraceMaxMm);
  // The picture's centre traces run the whole field (as in memory), up to the sample cap.
  for (int k = 0; k < 2; ++k) {
    const bool y = k == 0 ? along_y : !along_y;
    const int length = std::min(y ? ny : nx, kStreamPictureTraceMaxSamples);
    centre_[k].emplace(nx, ny, cell_mm, y, 1, length * cell_mm);
  }
  warnings_.push_back("streamed mode: Sdr, Sal and Str need the whole field and are reported as "
                      "0; areal S/L filters are not applied");
}

void StreamedTexture::add_first_pass(const Heightfield& band, int j0) {
  plane_.add_band(band, j0, threads_, &overview_);
  traces_->add_band(band, j0);
  for (auto& c : centre_) c->add_band(band, j0);
}

void StreamedTexture::finish_first_pass() {
  if (plane_.reached == 0) {
    throw InputError("surface has no finite height: every cell is unreached (NaN)");
  }
  solved_ = plane_.sums.solve();
}

void StreamedTexture::add_second_pass(const Heightfield& band) {
  add_residual_band(band, solved_, threads_, moments_);
}

TextureReport StreamedTexture::report() const {
  TextureReport report;
  report.cell_mm = cell_mm_;
  report.size_x_mm = nx_ * cell_mm_;
  report.size_y_mm = ny_ * cell_mm_;
  report.cells = static_cast<std::int64_t>(nx_) * ny_;
  report.reached_cells = plane_.reached;
  if (report.reached_cells < report.cells) {
    report.warnings.push_back(std::to_string(report.cells - report.reached_cells) + " of " +
                              std::to_string(report.cells) +
                              " cells are unreached (NaN) and left out");
  }
  report.warnings.insert(report.warnings.end(), warnings_.begin(), warnings_.end());
  ArealReport& a = report.areal;
  a.plane = solved_;
  const AmplitudeParameters amp = amplitude_parameters(moments_);
  ArealParameters& s = a.parameters;
  s.sa_um = amp.mean_abs_um;
  s.sq_um = amp.rms_um;
  s.sp_um = amp.peak_um;
  s.sv_um = amp.valley_um;
  s.sz_um = amp.total_um;
  s.ssk = amp.skewness;
  s.sku = amp.kurtosis;
  s.shape_defined = amp.shape_defined;
  s.cells = moments_.count;
  if (!s.shape_defined) report.warnings.push_back("surface is flat: Ssk and Sku reported as 0");
  if (options_.lay_deg) a.spatial.lay_deg = wrap_180(*options_.lay_deg);

  ProfileReport& p = report.profile;
  p.direction = direction_label_;
  p.direction_deg = direction_deg_;
  p.lay_source = options_.direction == ProfileDirection::Angle ? "not used"
                 : options_.lay_deg                              ? "known"
                                                                 : "none";
  p.lay_deg = options_.lay_deg ? wrap_180(*options_.lay_deg) : 0.0;
  const double shortest_cutoff =
      options_.cutoff_mm > 0.0 ? options_.cutoff_mm : kStandardCutoffsMm.front();
  const std::vector<ProfileTrace> traces = traces_->traces(2.0 * shortest_cutoff);
  if (traces.empty()) {
    throw InputError("surface too short for a profile at " + format_number(p.direction_deg) +
                     " deg: at least " + format_number(2.0 * shortest_cutoff) +
                     " mm (two cut-offs) of reached cells is needed");
  }
  fill_profile_report(traces, options_, p, report.warnings);
  return report;
}

}  // namespace cuspmap

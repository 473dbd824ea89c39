// Texture report: the areal side (plane, filters, parameters, lay) and profiles traced across or
// along the lay, evaluated at the ISO 4288 cut-off (beside the areal side when the lay is known,
// after it when detected); undefined values become 0 with a warning.
// Inputs: Heightfield, TextureOptions; output: TextureReport. Cost: see texture_report.h.
// Method: ISO 25178-2:2012, ISO 4287:1997, ISO 4288:1996 (docs/texture.md).
#include "texture/texture_report.h"

#include <algorithm>
#include <cmath>
#include <future>
#include <optional>
#include <utility>

#include "core/input_error.h"
#include "core/units.h"
#include "texture/extract_profiles.h"
#include "texture/gaussian_areal_filter.h"
#include "texture/iso1302_grade.h"
#include "texture/iso4288_cutoff.h"
#include "texture/lay_spectrum.h"
#include "texture/select_cutoff.h"
#include "texture/stylus_closing.h"

namespace cuspmap {
namespace {

double wrap_180(double deg) {
  double a = std::fmod(deg, 180.0);
  if (a < 0.0) a += 180.0;
  // 179.9999999 from round-off is 0 for the traces.
  constexpr double kWrapSlackDeg = 1e-9;
  return a > 180.0 - kWrapSlackDeg ? 0.0 : a;
}

void note_areal_warnings(const ArealReport& a, std::vector<std::string>& warnings) {
  if (!a.parameters.shape_defined) warnings.push_back("surface is flat: Ssk and Sku reported as 0");
  if (!a.spatial.sal_found) {
    warnings.push_back(
        "the autocorrelation never fell to 0.2 within half the field: Sal and Str "
        "reported as 0");
  } else if (a.spatial.str_upper_bound) {
    warnings.push_back(
        "the autocorrelation did not fall to 0.2 in some directions within half "
        "the field: Str is an upper bound");
  }
}

// With S- or L-filters: the residual is made whole, filtered, and handed to the transform.
void filtered_areal(const Heightfield& hf, const TextureOptions& o, ArealReport& a) {
  Heightfield residual = remove_plane(hf, a.plane);
  if (o.s_filter_mm > 0.0) {
    residual = gaussian_areal_filter(residual, o.s_filter_mm);
    a.s_filter_mm = o.s_filter_mm;
  }
  if (o.l_filter_mm > 0.0) {
    const Heightfield mean = gaussian_areal_filter(residual, o.l_filter_mm);
    residual.z_um -= mean.z_um;
    // The L-filter's mean surface is not exactly the plane: take the plane off again.
    residual = remove_plane(residual, fit_plane(residual));
    a.l_filter_mm = o.l_filter_mm;
  }
  a.parameters = areal_parameters(residual);
  // Its heights are freed once the padded transform holds them (peak memory).
  a.spatial = texture_direction(residual, nullptr, 0, nullptr, {}, &residual);
}

ArealReport areal_side(const Heightfield& hf, const TextureOptions& o,
                       std::vector<std::string>& warnings) {
  ArealReport a;
  a.plane = fit_plane(hf);
  if (o.s_filter_mm > 0.0 || o.l_filter_mm > 0.0) {
    filtered_areal(hf, o, a);
  } else {
    // Without filters the residual (the floor less its plane) is never held whole: the lay's
    // transform, the height parameters and the padded autocorrelation make its rows as they
    // go (the same float values as remove_plane), and the autocorrelation reuses the lay
    // transform's memory.
    std::optional<LaySums> lay;
    LargeBytes spent;
    if (hf.nx >= 2 && hf.ny >= 2) lay = lay_spectrum(hf, 0, &a.plane, &spent);
    a.parameters = areal_parameters(hf, a.plane);
    a.spatial = texture_direction(hf, &a.plane, 0, lay ? &*lay : nullptr, std::move(spent));
  }
  note_areal_warnings(a, warnings);
  return a;
}

// Whether the traces' direction is known without the areal side: an angle, or a known lay.
bool direction_given(const TextureOptions& o) {
  return o.direction == ProfileDirection::Angle || o.lay_deg.has_value();
}

double trace_direction(const TextureOptions& o, const ArealReport& areal, ProfileReport& p,
                       std::vector<std::string>& warnings) {
  if (o.direction == ProfileDirection::Angle) {
    p.direction = "angle";
    p.lay_source = "not used";
    return wrap_180(o.direction_deg);
  }
  p.direction = o.direction == ProfileDirection::Across ? "across" : "along";
  double lay = 0.0;
  if (o.lay_deg) {
    lay = *o.lay_deg;
    p.lay_source = "known";
  } else if (areal.spatial.lay_strength >= kMinLayStrength) {
    lay = areal.spatial.lay_deg;
    p.lay_source = "detected";
  } else {
    warnings.push_back("no dominant lay (strength " + format_number(areal.spatial.lay_strength) +
                       "): profiles traced along X");
    p.lay_source = "none";
    p.lay_deg = 0.0;
    return 0.0;
  }
  p.lay_deg = wrap_180(lay);
  return wrap_180(o.direction == ProfileDirection::Across ? lay + 90.0 : lay);
}

void note_undefined(const char* name, const ProfileParameters& p, std::vector<std::string>& w) {
  if (!p.shape_defined) {
    w.push_back(std::string(name) + " profile is flat: its skewness and kurtosis reported as 0");
  }
  if (!p.sm_defined) {
    w.push_back(std::string(name) +
                " profile has no complete element: its mean width reported "
                "as 0");
  }
}

}  // namespace

void fill_profile_report(const std::vector<ProfileTrace>& traces, const TextureOptions& options,
                         ProfileReport& p, std::vector<std::string>& warnings) {
  // The instrument's view: the stylus tip closes each trace before any filter (ISO 3274).
  std::vector<ProfileTrace> tipped;
  if (options.stylus_tip_um > 0.0) {
    tipped = traces;
    for (ProfileTrace& t : tipped) {
      t.z_um = stylus_closing(t.z_um, t.spacing_mm, options.stylus_tip_um);
    }
  }
  const std::vector<ProfileTrace>& seen = options.stylus_tip_um > 0.0 ? tipped : traces;
  p.stylus_tip_um = options.stylus_tip_um;
  const CutoffSelection sel = select_cutoff(seen, options.cutoff_mm, options.lambda_s_um);
  const ProfileEvaluation& e = sel.evaluation;
  warnings.insert(warnings.end(), sel.warnings.begin(), sel.warnings.end());
  p.roughness = e.roughness;
  p.primary = e.primary;
  p.waviness = e.waviness;
  p.cutoff_mm = e.cutoff_mm;
  p.lambda_s_um = e.lambda_s_um;
  p.evaluation_length_mm = e.evaluation_length_mm;
  p.sampling_lengths = e.sampling_lengths;
  p.traces = e.traces;
  p.cutoff_rule = sel.rule;
  p.periodic = sel.periodicity.periodic;
  p.acf_peak = sel.periodicity.acf_peak;
  p.iso1302_grade = iso1302_grade(p.roughness.a_um);
  if (e.sampling_lengths < kDefaultSamplingLengths) {
    warnings.push_back("evaluation length " + format_number(e.evaluation_length_mm) +
                              " mm holds " + std::to_string(e.sampling_lengths) +
                              " sampling length(s) of " + format_number(e.cutoff_mm) +
                              " mm, fewer than the 5 ISO 4288 asks for: the surface is "
                              "shorter than 6 cut-offs along the trace");
  }
  note_undefined("roughness", p.roughness, warnings);
  note_undefined("primary", p.primary, warnings);
}

TextureReport texture_report(const Heightfield& hf, const TextureOptions& options,
                             const std::function<void(const ProfileReport&)>& profile_done) {
  TextureReport report;
  report.cell_mm = hf.cell_mm;
  report.size_x_mm = hf.nx * hf.cell_mm;
  report.size_y_mm = hf.ny * hf.cell_mm;
  report.cells = hf.cells();
  report.reached_cells = reached_cells(hf);
  if (report.reached_cells == 0) {
    throw InputError("surface has no finite height: every cell is unreached (NaN)");
  }
  if (report.reached_cells < report.cells) {
    report.warnings.push_back(std::to_string(report.cells - report.reached_cells) + " of " +
                              std::to_string(report.cells) +
                              " cells are unreached (NaN) and left out");
  }
  ProfileReport& p = report.profile;
  std::vector<std::string> profile_warnings;
  const auto profile_side = [&] {
    const double shortest_cutoff =
        options.cutoff_mm > 0.0 ? options.cutoff_mm : kStandardCutoffsMm.front();
    const std::vector<ProfileTrace> traces =
        extract_profiles(hf, p.direction_deg, options.max_traces, 2.0 * shortest_cutoff);
    if (traces.empty()) {
      throw InputError("surface too short for a profile at " + format_number(p.direction_deg) +
                       " deg: the longest trace is " +
                       format_number(longest_chord_mm(hf, p.direction_deg)) + " mm, at least " +
                       format_number(2.0 * shortest_cutoff) + " mm (two cut-offs) is needed");
    }
    fill_profile_report(traces, options, p, profile_warnings);
    if (profile_done) profile_done(p);
  };
  if (direction_given(options)) {
    // The traces' direction does not wait for the areal side: both sides run at once (they only
    // read the floor; each keeps its own warnings, joined in the same order as below). An error
    // of the areal side still comes first.
    p.direction_deg = trace_direction(options, report.areal, p, report.warnings);
    std::future<void> profiles = std::async(std::launch::async, profile_side);
    report.areal = areal_side(hf, options, report.warnings);
    profiles.get();
  } else {
    report.areal = areal_side(hf, options, report.warnings);
    p.direction_deg = trace_direction(options, report.areal, p, report.warnings);
    profile_side();
  }
  report.warnings.insert(report.warnings.end(), profile_warnings.begin(), profile_warnings.end());
  // The waviness of a machined floor is often nil: its undefined Wsk/Wku/WSm are 0 without a
  // warning (docs/texture.md).
  return report;
}

}  // namespace cuspmap

// Texture report of a heightfield: ISO 4287 profile parameters across (or along) the lay with
// the ISO 4288 cut-off, and ISO 25178-2 areal parameters with the lay direction. Shared by
// `simulate` (report.json) and `texture`.
// Inputs: Heightfield (um over mm cells, NaN = unreached), TextureOptions; output: TextureReport
// with every number finite. Cost O(cells log cells) + O(traces * length * lc / cell).
// Method: ISO 4287:1997, ISO 4288:1996, ISO 16610-21:2011, ISO 3274:1996, ISO 25178-2:2012,
// ISO 16610-61:2015, ISO 1302:1992 (see docs/texture.md).
#pragma once

#include <cstdint>
#include <functional>
#include <optional>
#include <string>
#include <vector>

#include "core/heightfield.h"
#include "texture/areal_parameters.h"
#include "texture/extract_profiles.h"
#include "texture/fit_plane.h"
#include "texture/profile_parameters.h"
#include "texture/texture_direction.h"

namespace cuspmap {

/// Parallel traces averaged for the profile parameters (common practice, no source: ISO 4288
/// asks for several measurements on the surface; 64 spread traces bound the cost).
inline constexpr int kDefaultMaxTraces = 64;
/// A lay strength below this means no dominant lay (common practice, no source: a ground or
/// random surface scores under 0.1, a milled floor with visible cusps above 0.5).
inline constexpr double kMinLayStrength = 0.3;

/// Which way the profile is traced.
enum class ProfileDirection {
  Across,  ///< perpendicular to the lay (across the feed marks), the profilometer default
  Along,   ///< along the lay
  Angle,   ///< at TextureOptions::direction_deg
};

/// What to compute and how.
struct TextureOptions {
  ProfileDirection direction = ProfileDirection::Across;  ///< trace direction rule
  double direction_deg = 0.0;     ///< trace direction for Angle, deg from +X counter-clockwise
  std::optional<double> lay_deg;  ///< the lay when known (e.g. the path's pass direction); else
                                  ///< it is detected from the power spectrum
  double cutoff_mm = 0.0;         ///< lambda-c; 0 = chosen by the ISO 4288 rules
  double lambda_s_um = -1.0;      ///< lambda-s; < 0 = paired with lc by ISO 3274; 0 = none
  double s_filter_mm = 0.0;       ///< areal S-filter nesting index; 0 = none
  double l_filter_mm = 0.0;       ///< areal L-filter nesting index; 0 = none (plane removal only)
  int max_traces = kDefaultMaxTraces;  ///< parallel traces averaged
  double stylus_tip_um = 0.0;     ///< stylus tip radius: traces are closed by this disk (ISO
                                  ///< 16610-41) before the profile filters; 0 = the surface itself
};

/// Profile side of the report.
struct ProfileReport {
  ProfileParameters roughness;        ///< R parameters (Ra ... RSm), means over traces
  ProfileParameters primary;          ///< P parameters
  ProfileParameters waviness;         ///< W parameters
  double cutoff_mm = 0.0;             ///< lambda-c used
  double lambda_s_um = 0.0;           ///< lambda-s used
  double evaluation_length_mm = 0.0;  ///< sampling_lengths * cutoff
  int sampling_lengths = 0;    ///< sampling lengths per trace (5 unless the surface is short)
  int traces = 0;              ///< traces averaged
  std::string direction;       ///< "across", "along" or "angle"
  double direction_deg = 0.0;  ///< trace direction used, deg from +X, [0, 180)
  double lay_deg = 0.0;        ///< lay the direction was taken from, deg from +X, [0, 180)
  /// Where the lay came from: "known" (the path's passes or --lay), "detected" (power
  /// spectrum), "none" (no dominant lay: traced along X whatever the rule) or "not used"
  /// (direction given as an angle). Rows compared "across the lay" share a rule only when none
  /// is "none".
  std::string lay_source;
  std::string cutoff_rule;     ///< "RSm (periodic)", "Ra (non-periodic)" or "fixed"
  bool periodic = false;       ///< the autocorrelation test's verdict
  double acf_peak = 0.0;       ///< its score (>= 0.5 periodic)
  std::string iso1302_grade;   ///< grade of Ra, e.g. "N7"
  double stylus_tip_um = 0.0;  ///< tip radius the traces were closed with (0 = none)
};

/// Areal side of the report.
struct ArealReport {
  ArealParameters parameters;  ///< Sa ... Sdr of the S-F (or S-L) surface
  TextureDirection spatial;    ///< Sal, Str, lay
  Plane plane;                 ///< the removed least-squares plane
  double s_filter_mm = 0.0;    ///< S-filter applied (0 = none)
  double l_filter_mm = 0.0;    ///< L-filter applied (0 = none)
};

/// Everything `texture` prints and `simulate` embeds.
struct TextureReport {
  ProfileReport profile;              ///< ISO 4287 side
  ArealReport areal;                  ///< ISO 25178-2 side
  double cell_mm = 0.0;               ///< grid spacing
  double size_x_mm = 0.0;             ///< nx * cell
  double size_y_mm = 0.0;             ///< ny * cell
  std::int64_t cells = 0;             ///< nx * ny
  std::int64_t reached_cells = 0;     ///< finite cells
  std::vector<std::string> warnings;  ///< one line each, for people; also what was set to 0
};

/// Computes the texture report. Undefined values (Rsk of a flat profile, RSm without elements,
/// Sal that never decays) are set to 0 and named in `warnings`, so every number is finite.
/// @param[in] hf       heightfield (um over mm cells); NaN cells are left out of every statistic
/// @param[in] options  directions, cut-off and filters
/// @param[in] profile_done  optional: called with the finished profile side as soon as it is
///            done, on the thread that computed it (beside the areal side when the traces'
///            direction is given: an angle or a known lay), before texture_report returns
/// @throws InputError when no cell is finite, or the surface is too short for one sampling
///         length of the smallest cut-off (or of a fixed cut-off) in the trace direction
TextureReport texture_report(const Heightfield& hf, const TextureOptions& options,
                             const std::function<void(const ProfileReport&)>& profile_done = {});

/// The profile side from traces already extracted along p.direction_deg (set by the caller with
/// p.direction): ISO 4288 cut-off, R/P/W parameters, grade; notes appended to `warnings`.
/// @param[in] traces   non-empty finite traces of one spacing
/// @param[in] options  cut-off and lambda-s overrides
/// @param[in,out] p    filled except direction and direction_deg
void fill_profile_report(const std::vector<ProfileTrace>& traces, const TextureOptions& options,
                         ProfileReport& p, std::vector<std::string>& warnings);

}  // namespace cuspmap

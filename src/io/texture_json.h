// JSON form of a texture report: the `profile` and `areal` objects that `texture --json` prints
// and `simulate` embeds in report.json (keys per DESIGN.md: lengths *_mm, heights *_um).
// Inputs: TextureReport (finite numbers by construction); output: nlohmann::json. Cost O(1).
// Method: key contract of DESIGN.md `texture --json`; undefined values are 0 with a warning.
#pragma once

#include <nlohmann/json.hpp>

#include "texture/texture_report.h"
#include "texture/trace_report.h"

namespace cuspmap {

/// {Ra_um, Rq_um, Rp_um, Rv_um, Rz_um, Rt_um, Rsk, Rku, RSm_mm, cutoff_mm, direction,
///  direction_deg, lambda_s_um, evaluation_length_mm, sampling_lengths, traces, cutoff_rule,
///  periodic, acf_peak, iso1302_grade, Ra_uin, Rz_uin, primary{Pa_um ...}, waviness{Wa_um ...}}
nlohmann::json profile_json(const ProfileReport& profile);

/// {Sa_um, Sq_um, Sp_um, Sv_um, Sz_um, Ssk, Sku, Sdr, Str, Sal_mm, lay_deg, lay_strength,
///  s_filter_mm, l_filter_mm}
nlohmann::json areal_json(const ArealReport& areal);

/// The whole `texture --json` object: {profile, areal, cell_mm, size_mm: [x, y], cells,
/// reached_cells, warnings: [...]}.
nlohmann::json texture_report_json(const TextureReport& report);

/// The `texture --json` object of a measured trace: {kind: "trace", profile, spacing_mm,
/// length_mm, points, missing_points, warnings: [...]}.
nlohmann::json trace_report_json(const TraceReport& report, int points, int missing_points);

}  // namespace cuspmap

// report.json of `simulate`: the contract's keys (DESIGN.md "simulate") plus the settings a
// reader needs to trust the numbers (cut-off, filters, image scales, ignored keys, warnings).
// Inputs: Job, JobRun, image facts, write time; output: a JSON object (all numbers finite).
#pragma once

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "job/job.h"
#include "job/run_job.h"

namespace cuspmap {

/// What the pictures of a simulation show, for the report.
struct ImageFacts {
  double height_lo_um = 0.0;         ///< height drawn black in height.png
  double height_hi_um = 0.0;         ///< height drawn lightest in height.png
  double um_per_level = 0.0;         ///< height step of one gray level
  int cells_per_pixel = 1;           ///< k x k cells per pixel
  double light_azimuth_deg = 0.0;    ///< shaded.png light direction, from +X ccw
  double light_elevation_deg = 0.0;  ///< shaded.png light elevation above the floor
  double exaggeration = 1.0;         ///< shaded.png vertical exaggeration
};

/// Builds report.json.
/// @param[in] job, run  the job and what it produced
/// @param[in] images    facts about height.png and shaded.png
/// @param[in] files     names of the files written next to the report
/// @param[in] write_s   seconds spent writing those files (report.json itself excluded)
/// @param[in] elapsed_s wall time from start to the report
nlohmann::json simulate_report_json(const Job& job, const JobRun& run, const ImageFacts& images,
                                    const std::vector<std::string>& files, double write_s,
                                    double elapsed_s);

}  // namespace cuspmap

// The built-in demo scenario (an invented aluminium pump-cover floor finished four ways), shipped
// inside the binary as job texts so `cuspmap demo` needs no files.
#pragma once

#include <string>
#include <vector>

#include "job/job.h"

namespace cuspmap {

/// One demo job with its source text.
struct DemoJob {
  std::string file_name;  ///< name it is written under in the demo's output (e.g. "ball_raster.toml")
  std::string toml;       ///< the job text, as a user would write it
  Job job;                ///< parsed and validated
};

/// The four demo jobs: 6 mm ball raster 0.3 mm; 6 mm flat 1 deg dish one-way; the same zigzag with
/// 0.01 deg tram error; trochoidal loops of the ball.
/// @param[in] quick  smaller patches and coarser cells (for tests): same physics, less time
std::vector<DemoJob> demo_jobs(bool quick);

/// Target Ra (um) the demo's summary chooses against (an invented print callout: Ra 0.8 um).
inline constexpr double kDemoTargetRaUm = 0.8;

}  // namespace cuspmap

// The simulate pipeline for one job: build the path, sweep the floor, measure its texture.
// Inputs: validated Job (mm, deg), run settings; output: heightfield (um), path, ISO texture
// report and stage timings. Method: DESIGN.md data flow (path -> sweep -> texture).
#pragma once

#include <array>
#include <functional>
#include <vector>

#include "core/heightfield.h"
#include "job/job.h"
#include "job/run_estimate.h"
#include "job/wall_band.h"
#include "path/build_toolpath.h"
#include "sweep/simulate_bands.h"
#include "sweep/simulate_floor.h"
#include "texture/texture_report.h"

namespace cuspmap {

/// When the sweep streams the floor in bands instead of holding it whole.
enum class StreamMode {
  Never,  ///< in memory; a grid over the limit is an error
  Auto,   ///< stream when the grid exceeds the memory limit
  Always, ///< always stream (--stream)
};

/// Run-time settings that are not part of the job.
struct RunOptions {
  StreamMode stream = StreamMode::Never;   ///< streaming rule
  int threads = 0;                         ///< sweep threads; 0 = all hardware threads
  std::int64_t max_memory_bytes = 0;       ///< grid limit; 0 = half of physical memory
  std::function<void(double)> progress;    ///< sweep progress in [0, 1]; may be empty
  /// Called once, after the path is built and before the sweep, with the run's forecast (for the
  /// line a long run prints first). Empty = not wanted.
  std::function<void(const RunEstimate&)> before_sweep;
  /// In-memory runs only: called on its own thread with the swept floor while the texture report
  /// is computed (the caller draws its pictures meanwhile); run_job waits for it before it
  /// returns and rethrows what it threw. The floor must only be read. May be empty.
  std::function<void(const Heightfield&)> beside_texture;
  /// In-memory runs only: called with the swept floor and the texture report's profile side as
  /// soon as that side is done (texture_report's profile_done: on its own thread when the lay
  /// is known, beside the areal side and beside_texture), before run_job returns; exceptions
  /// propagate as the report's. Read only. May be empty.
  std::function<void(const Heightfield&, const ProfileReport&)> beside_profile;
  TextureOptions texture;                  ///< cut-off and direction overrides
  /// Streamed runs only (in-memory runs never call it): called once with the grid's columns and
  /// rows after the bands are planned and before any sweep; it may throw InputError to refuse
  /// the run (e.g. a file that cannot fit). Empty = nothing to prepare.
  std::function<void(int nx, int ny)> stream_begin;
  /// Streamed runs only: every band of the first pass, rows in order from j0 = 0, at full
  /// resolution (e.g. to write height.npy without holding the floor). Empty = not wanted.
  BandSink stream_band;
};

/// Everything one simulation produced.
struct JobRun {
  Patch patch;              ///< the patch simulated (derived from the program when not given)
  BuiltPath built;          ///< moves, warnings, spindle direction
  Heightfield floor;        ///< heights, um above the nominal floor; NaN = not reached. When
                            ///< streamed: the block-mean overview (cell = k x the grid's cell)
  bool streamed = false;    ///< the floor was swept in bands and never held whole
  int grid_nx = 0;          ///< columns of the simulated grid (also when streamed)
  int grid_ny = 0;          ///< rows of the simulated grid
  int bands = 0;            ///< bands swept per pass (streamed)
  int band_rows = 0;        ///< rows per band (streamed)
  std::int64_t peak_grid_bytes = 0;  ///< largest height grid held: the floor, or one band
  int overview_cells_per_pixel = 1;  ///< k of the overview (streamed)
  /// Streamed: the runs of the centre trace across ([0]) and along ([1]) the lay, as
  /// extract_profiles(floor, deg, 1, 0) gives them in memory, for profile.png; empty in memory.
  std::array<std::vector<ProfileTrace>, 2> centre_traces;
  SweepStats sweep;         ///< sweep counters
  TextureReport texture;    ///< ISO profile and areal parameters
  double path_length_mm = 0.0;   ///< feed and rapid moves
  double cycle_time_s = 0.0;     ///< feed moves at their feed, rapids at cut.rapid_mm_per_min
  double highest_point_um = 0.0; ///< highest point above the nominal floor (may be negative)
  double lowest_point_um = 0.0;  ///< lowest point (negative = below nominal, e.g. under tilt)
  /// Peak-to-valley of the periodic mark pattern across the lay, crests and valleys refined
  /// below the cell (texture/periodic_cusp.h); in memory from the report's traces, streamed
  /// from the centre trace across the lay. >= 0.
  double cusp_um = 0.0;
  int cusp_crests = 0;
  /// Walled offset pocket (path.edge = "wall"): the band within R of the wall, taken out of the
  /// floor (NaN in `floor`, left out of every statistic) and summarised here.
  bool walled = false;
  WallBand walls;           ///< crests the cusp is the median of (0: no pattern found)
  double path_s = 0.0;           ///< time to build the path, s
  double sweep_s = 0.0;          ///< time to sweep, s
  double texture_s = 0.0;        ///< time for the texture parameters, s
};

/// Runs one job. Streamed runs sweep twice (plane, then residuals) and report the exact
/// ISO 25178-2 height parameters; see texture/streamed_texture.h for what they leave out.
/// @throws InputError for a bad G-code file, a grid over the memory limit, or a floor that no
///         move reached.
JobRun run_job(const Job& job, const RunOptions& options);

}  // namespace cuspmap

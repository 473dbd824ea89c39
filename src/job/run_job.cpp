// The simulate pipeline: path -> sweep -> texture for one job, with stage timings.
// Inputs: Job, RunOptions; output: JobRun. Method: DESIGN.md "Layout and data flow".
#include "job/run_job.h"

#include <algorithm>
#include <cmath>
#include <future>
#include <limits>
#include <string>
#include <utility>

#include "core/input_error.h"
#include "core/stage_timer.h"
#include "path/patch_from_extent.h"
#include "sweep/simulate_bands.h"
#include "sweep/sweep_tiles.h"
#include "texture/extract_profiles.h"
#include "texture/periodic_cusp.h"
#include "texture/streamed_texture.h"
#include "texture/texture_direction.h"

namespace cuspmap {
namespace {

// A single straight groove's texture figures are its cross-section's: said beside them.
void add_single_groove_note(JobRun& run) {
  if (std::string n = single_groove_note(run.built.path); !n.empty()) {
    run.texture.warnings.push_back(std::move(n));
  }
}

// Texture options with the lay of built-in lanes (the pass direction); others are detected.
TextureOptions lay_options(const Job& job, const RunOptions& options) {
  TextureOptions texture = options.texture;
  if (!texture.lay_deg &&
      (job.path.kind == PathKind::Raster || job.path.kind == PathKind::Trochoidal)) {
    texture.lay_deg = job.path.angle_deg;
  }
  return texture;
}

std::string no_move_message(const Job& job) {
  return job.source + ": no move of the path reaches the patch; check [patch] size and origin, "
                      "[cut] depth and the program's Z values against floor_z";
}

// Peak memory of an in-memory run in grid sizes: the grid, the residual, the filtered and FFT
// copies of the texture report (measured: a 400 MB grid peaked at 5.7 GB RSS, 14 grids).
constexpr std::int64_t kInMemoryGrids = 16;

// Largest floor streamed: 4 x the 200 x 200 mm at 2 um case (1e10 cells, ~2 min CPU); beyond
// it a run would take hours, so it is refused by the in-memory grid check with its estimate.
constexpr double kMaxStreamedCells = 4e10;

bool should_stream(const Patch& patch, const RunOptions& options) {
  std::int64_t nx = 0, ny = 0;
  grid_dimensions(patch, nx, ny);
  if (static_cast<double>(nx) * static_cast<double>(ny) > kMaxStreamedCells) return false;
  if (options.stream == StreamMode::Always) return true;
  if (options.stream == StreamMode::Never) return false;
  const std::int64_t limit = options.max_memory_bytes > 0 ? options.max_memory_bytes
                                                          : physical_memory_bytes() / 2;
  return heightfield_bytes(patch) > limit / kInMemoryGrids;
}

// What the tooth-resolved sweep's cost depends on, for the forecast: its cell visits per move
// kind (counted only when the run is tooth-resolved; O(moves x rows)).
TeethWork tooth_work(const Job& job, const CutSpec& cut, const SimSpec& sim, const JobRun& run) {
  if (!sim.tooth_marks) return {};
  return teeth_work(job.cutter, run.built.path, cut, run.patch);
}

void set_cusp(const std::vector<ProfileTrace>& across_lay, JobRun& run) {
  const PeriodicCusp cusp = periodic_cusp(across_lay);
  run.cusp_um = std::max(0.0, cusp.cusp_um);
  run.cusp_crests = cusp.crests;
}

// Two passes of the band sweep: plane, overview and traces; then the residual moments.
void run_streamed(const Job& job, const CutSpec& cut, const SimSpec& sim,
                  const RunOptions& options, JobRun& run, StageTimer& timer) {
  const BandPlan plan = plan_bands(run.patch, sim.max_memory_bytes);
  if (options.stream_begin) options.stream_begin(plan.nx, plan.ny);
  if (options.before_sweep) {
    options.before_sweep(estimate_run(plan.nx, plan.ny, sim.tooth_marks, true, plan.band_bytes,
                                      tooth_work(job, cut, sim, run)));
  }
  StreamedTexture texture(plan.nx, plan.ny, run.patch.cell_mm, run.patch.origin_x_mm,
                          run.patch.origin_y_mm, lay_options(job, options),
                          sweep_threads(sim.threads));
  SimSpec pass = sim;
  if (sim.progress) pass.progress = [&](double f) { sim.progress(0.5 * f); };
  const auto& region = run.built.wall_region_mm;
  simulate_bands(job.cutter, run.built.path, cut, run.patch, pass, plan,
                 [&](const Heightfield& swept, int j0) {
                   Heightfield masked;
                   const Heightfield& band = region.empty() ? swept : (masked = swept);
                   split_wall_band(region, masked, run.walls);
                   texture.add_first_pass(band, j0);
                   if (options.stream_band) options.stream_band(band, j0);
                 },
                 &run.sweep);
  if (texture.reached() == 0) throw InputError(no_move_message(job));
  texture.finish_first_pass();
  if (sim.progress) pass.progress = [&](double f) { sim.progress(0.5 + 0.5 * f); };
  simulate_bands(job.cutter, run.built.path, cut, run.patch, pass, plan,
                 [&](const Heightfield& swept, int) {
                   Heightfield masked;
                   WallBand counted_already;
                   const Heightfield& band = region.empty() ? swept : (masked = swept);
                   split_wall_band(region, masked, counted_already);
                   texture.add_second_pass(band);
                 });
  run.sweep_s = timer.lap();
  run.streamed = true;
  run.grid_nx = plan.nx;
  run.grid_ny = plan.ny;
  run.bands = plan.bands;
  run.band_rows = plan.band_rows;
  run.peak_grid_bytes = plan.band_bytes;
  run.overview_cells_per_pixel = texture.overview_cells_per_block();
  run.floor = texture.overview();
  for (int k = 0; k < 2; ++k) run.centre_traces[k] = texture.centre_trace(k);
  run.highest_point_um = texture.max_um();
  run.lowest_point_um = texture.min_um();
  run.texture = texture.report();
  add_single_groove_note(run);
  set_cusp(run.centre_traces[0], run);
  run.texture_s = timer.lap();
}

}  // namespace

JobRun run_job(const Job& job, const RunOptions& options) {
  JobRun run;
  StageTimer timer;
  run.patch = job.patch;
  run.built = build_toolpath(job.path, job.cut, job.patch, job.cutter);
  if (job.patch_from_program) {
    run.patch = patch_from_extent(run.built.path, job.patch.cell_mm, job.patch.floor_z_mm,
                                  job.cutter.radius_mm());
  }
  run.path_length_mm = path_length_mm(program_moves(run.built), true);
  run.cycle_time_s = cycle_time_s(program_moves(run.built));
  run.path_s = timer.lap();
  run.walled = !run.built.wall_region_mm.empty();

  CutSpec cut = job.cut;
  cut.spindle = run.built.spindle;  // M3/M4 in a program overrides the job's default
  SimSpec sim = job.sim;
  sim.threads = options.threads != 0 ? options.threads : job.sim.threads;
  sim.max_memory_bytes = options.max_memory_bytes;
  sim.progress = options.progress;
  if (should_stream(run.patch, options)) {
    run_streamed(job, cut, sim, options, run, timer);
    return run;
  }
  // The forecast only for a grid that will be made: one over the limit is refused first, in one
  // line (make_heightfield), with nothing printed before it.
  const std::int64_t limit =
      options.max_memory_bytes > 0 ? options.max_memory_bytes : physical_memory_bytes() / 2;
  std::future<void> plans;
  if (heightfield_bytes(run.patch) <= limit) {
    std::int64_t nx = 0, ny = 0;
    grid_dimensions(run.patch, nx, ny);
    if (options.before_sweep) {
      options.before_sweep(
          estimate_run(nx, ny, sim.tooth_marks, false, 0, tooth_work(job, cut, sim, run)));
    }
    // The texture report's FFTW plans are made beside the sweep: the report's own planning then
    // finds them in the planner's cache (~125 M instructions off its path on a 12 x 12 mm floor
    // at 10 um, docs/performance.md "Sixth pass"). Waited for before returning.
    plans = std::async(std::launch::async, [nx, ny] {
      warm_texture_direction_plans(static_cast<int>(nx), static_cast<int>(ny));
    });
  }
  run.floor = simulate_floor(job.cutter, run.built.path, cut, run.patch, sim, &run.sweep);
  split_wall_band(run.built.wall_region_mm, run.floor, run.walls);
  run.sweep_s = timer.lap();
  run.grid_nx = run.floor.nx;
  run.grid_ny = run.floor.ny;
  run.peak_grid_bytes = run.floor.cells() * static_cast<std::int64_t>(sizeof(float));

  float lo = std::numeric_limits<float>::infinity(), hi = -lo;
  const float* z = run.floor.z_um.data();
  for (std::int64_t k = 0; k < run.floor.cells(); ++k) {
    if (!std::isfinite(z[k])) continue;
    lo = std::min(lo, z[k]);
    hi = std::max(hi, z[k]);
  }
  if (!(hi >= lo)) {
    throw InputError(no_move_message(job));
  }
  run.highest_point_um = hi;
  run.lowest_point_um = lo;

  // Whatever the caller does with the floor alone runs beside the texture report (both only read
  // the floor); waited for before the floor can move with `run`.
  std::future<void> beside;
  if (options.beside_texture) {
    beside = std::async(std::launch::async, [&] { options.beside_texture(run.floor); });
  }
  // Built-in lanes have a known lay: the pass direction. Others are detected from the surface.
  const TextureOptions texture = lay_options(job, options);
  std::function<void(const ProfileReport&)> profile_done;
  if (options.beside_profile) {
    profile_done = [&](const ProfileReport& p) { options.beside_profile(run.floor, p); };
  }
  run.texture = texture_report(run.floor, texture, profile_done);
  add_single_groove_note(run);
  set_cusp(extract_profiles(run.floor, run.texture.areal.spatial.lay_deg + 90.0,
                            texture.max_traces, 0.0),
           run);
  run.texture_s = timer.lap();
  if (beside.valid()) beside.get();
  return run;
}

}  // namespace cuspmap

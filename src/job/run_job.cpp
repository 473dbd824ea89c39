// The simulate pipeline: path -> sweep -> texture for one job, with stage timings.
// Inputs: Job, RunOptions; output: JobRun. Method: DESIGN.md "Layout and data flow".
#include "job/run_job.h"

#include <cmath>
#include <limits>

#include "core/input_error.h"
#include "core/stage_timer.h"
#include "path/patch_from_extent.h"

namespace cuspmap {

JobRun run_job(const Job& job, const RunOptions& options) {
  JobRun run;
  StageTimer timer;
  run.patch = job.patch;
  run.built = build_toolpath(job.path, job.cut, job.patch, job.cutter);
  if (job.patch_from_program) {
    run.patch = patch_from_extent(run.built.path, job.patch.cell_mm, job.patch.floor_z_mm);
  }
  run.path_length_mm = path_length_mm(run.built.path, true);
  run.cycle_time_s = cycle_time_s(run.built.path);
  run.path_s = timer.lap();

  CutSpec cut = job.cut;
  cut.spindle = run.built.spindle;  // M3/M4 in a program overrides the job's default
  SimSpec sim = job.sim;
  sim.threads = options.threads != 0 ? options.threads : job.sim.threads;
  sim.max_memory_bytes = options.max_memory_bytes;
  sim.progress = options.progress;
  run.floor = simulate_floor(job.cutter, run.built.path, cut, run.patch, sim, &run.sweep);
  run.sweep_s = timer.lap();

  float lo = std::numeric_limits<float>::infinity(), hi = -lo;
  const float* z = run.floor.z_um.data();
  for (std::int64_t k = 0; k < run.floor.cells(); ++k) {
    if (!std::isfinite(z[k])) continue;
    lo = std::min(lo, z[k]);
    hi = std::max(hi, z[k]);
  }
  if (!(hi >= lo)) {
    throw InputError(job.source + ": no move of the path reaches the patch; check [patch] size and "
                     "origin, [cut] depth and the program's Z values against floor_z");
  }
  run.max_scallop_um = hi;
  run.min_height_um = lo;

  TextureOptions texture = options.texture;
  // Built-in lanes have a known lay: the pass direction. Others are detected from the surface.
  if (!texture.lay_deg &&
      (job.path.kind == PathKind::Raster || job.path.kind == PathKind::Trochoidal)) {
    texture.lay_deg = job.path.angle_deg;
  }
  run.texture = texture_report(run.floor, texture);
  run.texture_s = timer.lap();
  return run;
}

}  // namespace cuspmap

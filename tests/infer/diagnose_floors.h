// Test floors for the inverse side: simulated raster floors (the real job pipeline) with
// measurement-like damage (noise, a setup plane, missing points), small enough for a fast suite.
#pragma once

#include <cmath>
#include <cstdint>
#include <random>

#include "core/heightfield.h"
#include "job/job.h"
#include "job/run_job.h"

namespace cuspmap::test {

/// A raster job on a square patch, tooth-resolved.
inline Job raster_job(CutterShape shape, double diameter_mm, double stepover_mm, double size_mm,
                      double cell_mm, double fz_mm, int teeth) {
  Job job;
  job.name = "diagnose round trip";
  job.patch.size_x_mm = size_mm;
  job.patch.size_y_mm = size_mm;
  job.patch.cell_mm = cell_mm;
  job.cutter.shape = shape;
  job.cutter.diameter_mm = diameter_mm;
  job.cutter.teeth = teeth;
  job.cut.rpm = 10000.0;
  job.cut.feed_mm_per_min = fz_mm * teeth * job.cut.rpm;
  job.path.kind = PathKind::Raster;
  job.path.stepover_mm = stepover_mm;
  job.sim.tooth_marks = true;
  return job;
}

/// The floor of a job (in memory, 2 threads).
inline Heightfield simulate(const Job& job) {
  RunOptions o;
  o.threads = 2;
  return run_job(job, o).floor;
}

/// Measurement-like damage: Gaussian noise (um rms), a setup plane (um/mm along X and Y) and a
/// fraction of cells dropped (NaN), from a fixed seed.
inline void damage(Heightfield& hf, double noise_um, double gx_um_per_mm, double gy_um_per_mm,
                   double missing_fraction, std::uint32_t seed) {
  std::mt19937 rng(seed);
  std::normal_distribution<double> noise(0.0, noise_um);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      float& z = hf.z_um(j, i);
      z = static_cast<float>(z + noise(rng) + gx_um_per_mm * hf.x_mm(i) +
                             gy_um_per_mm * hf.y_mm(j));
      if (u(rng) < missing_fraction) z = kUnreached;
    }
  }
}

/// The field without a margin of `margin` cells on every side: an interior window, as a
/// measurement of a part is (the simulated floor's edges lack the passes beyond the patch).
inline Heightfield crop(const Heightfield& hf, int margin) {
  Heightfield c = hf;
  c.nx = hf.nx - 2 * margin;
  c.ny = hf.ny - 2 * margin;
  c.origin_x_mm = hf.origin_x_mm + margin * hf.cell_mm;
  c.origin_y_mm = hf.origin_y_mm + margin * hf.cell_mm;
  c.z_um = hf.z_um.block(margin, margin, c.ny, c.nx);
  return c;
}

}  // namespace cuspmap::test

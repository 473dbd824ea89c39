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

/// A tooth-resolved raster of a flat end mill (or a bull-nose: corner_radius_mm > 0) with a
/// dished end, runout and a tram tilt (the floors of tools/tooth_campaign.py).
struct ToothCut {
  double diameter_mm = 6.0, stepover_mm = 1.0, size_mm = 5.0, cell_mm = 0.01, fz_mm = 0.05;
  int teeth = 2;
  double dish_deg = 1.0, runout_mm = 0.0, runout_phase_deg = 0.0, tilt_deg = 0.0,
         tilt_toward_deg = 0.0, angle_deg = 0.0, corner_radius_mm = 0.0;
};

/// The job of a ToothCut.
inline Job tooth_cut_job(const ToothCut& c) {
  Job job = raster_job(c.corner_radius_mm > 0.0 ? CutterShape::BullNose : CutterShape::Flat,
                       c.diameter_mm, c.stepover_mm, c.size_mm, c.cell_mm, c.fz_mm, c.teeth);
  job.cutter.corner_radius_mm = c.corner_radius_mm;
  job.cutter.dish_deg = c.dish_deg;
  job.cutter.runout_mm = c.runout_mm;
  job.cutter.runout_phase_deg = c.runout_phase_deg;
  job.cutter.tilt_deg = c.tilt_deg;
  job.cutter.tilt_toward_deg = c.tilt_toward_deg;
  job.path.angle_deg = c.angle_deg;
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

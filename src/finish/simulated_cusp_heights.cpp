// Simulated height parameters of a raster floor: a window of whole periods swept by the revolving
// envelope, plane removed, ISO 25178-2 Sz/Sv/Sp/Sa. Heights um, lengths mm.
// Method: simulate_floor + least-squares plane (ISO 25178-2:2012 §3.1.8) + §4.1 parameters.
#include "finish/simulated_cusp_heights.h"

#include <algorithm>
#include <cassert>
#include <cmath>

#include "finish/cusp_profile_heights.h"
#include "path/raster.h"
#include "sweep/simulate_floor.h"
#include "texture/areal_moments.h"
#include "texture/fit_plane.h"
#include "texture/streaming_areal.h"

namespace cuspmap {

SurfaceHeights simulated_cusp_heights(const Cutter& cutter, double stepover_mm,
                                      RasterDirection direction, const WindowSweep& sweep) {
  assert(stepover_mm > 0.0 && stepover_mm <= cutter.diameter_mm && "validated by the caller");
  // Cells per period: odd, at least kCellsPerPeriod, and kCellsPerArc across the arcs that lie
  // beyond a level band (bull-nose).
  const CuspProfile profile = cusp_profile(cutter);
  const double arc_mm = 0.5 * stepover_mm - profile.flat_half_width_mm;
  int cells = kCellsPerPeriod;
  if (arc_mm > 0.0) {
    const double wanted = kCellsPerArc * 0.5 * stepover_mm / arc_mm;
    cells =
        std::max(cells, static_cast<int>(std::min<double>(kMaxCellsPerPeriod, std::ceil(wanted))));
  }
  // Tooth marks: cells no wider than a fraction of the feed per tooth, so the marks along the
  // passes are resolved as finely as the cusps across them.
  const double feed_per_rev_mm = sweep.cut.feed_mm_per_min / sweep.cut.rpm;
  if (sweep.tooth_marks) {
    const double tooth_cell_mm = feed_per_rev_mm / (cutter.teeth * kCellsPerToothMark);
    cells = std::max(cells, static_cast<int>(std::min<double>(
                                kMaxCellsPerPeriod, std::ceil(stepover_mm / tooth_cell_mm))));
  }
  if (cells % 2 == 0) ++cells;
  // The window sits between two guard bands of whole periods, so every evaluated cell has all
  // the passes that can cut it lowest on both sides: a tilted, dished or running-out end can cut
  // lowest with its rim up to R away; an end whose lowest point is on its axis cuts no cell
  // lower from beyond the distance that bounds the nearest pass's cut, half a stepover across
  // and half the feed per revolution along (derived: its profile rises with the distance).
  const double cell_mm = stepover_mm / cells;
  const double reach_mm =
      raster_margin_passes(stepover_mm, cutter) > 0
          ? cutter.radius_mm() + cutter.runout_mm
          : std::hypot(0.5 * stepover_mm, sweep.tooth_marks ? 0.5 * feed_per_rev_mm : 0.0);
  const int guard_periods = static_cast<int>(std::ceil(reach_mm / stepover_mm)) + 1;
  const int rows = kWindowPeriods * cells;
  const int guard_rows = guard_periods * cells;
  Patch patch;
  patch.cell_mm = cell_mm;
  // Half a cell short of whole cells, so ceil(size / cell) gives exactly that many cells.
  patch.size_y_mm = (rows + 2 * guard_rows - 0.5) * cell_mm;
  int cells_along = kWindowCellsAlong;
  if (sweep.tooth_marks) {
    cells_along = std::max(
        cells_along, static_cast<int>(std::ceil(kWindowRevolutions * feed_per_rev_mm / cell_mm)));
  }
  patch.size_x_mm = (cells_along - 0.5) * cell_mm;
  PathSpec spec;
  spec.kind = PathKind::Raster;
  spec.stepover_mm = stepover_mm;
  spec.direction = direction;
  CutSpec cut = sweep.cut;
  cut.depth_mm = 0.0;  // heights above the tip plane; the plane is removed anyway
  SimSpec sim;
  sim.tooth_marks = sweep.tooth_marks;
  sim.threads = sweep.tooth_marks ? 0 : 1;  // a small envelope window: threads cost more than
                                            // they save; tooth by tooth the window is larger
  const Toolpath path = raster_path(spec, cut, patch, cutter);
  const Heightfield floor = simulate_floor(cutter, path, cut, patch, sim);
  assert(floor.ny == rows + 2 * guard_rows && "grid rows follow the half-cell-short size");
  Heightfield window;
  window.nx = floor.nx;
  window.ny = rows;
  window.cell_mm = floor.cell_mm;
  window.origin_x_mm = floor.origin_x_mm;
  window.origin_y_mm = floor.origin_y_mm + guard_rows * cell_mm;
  window.z_um = floor.z_um.block(guard_rows, 0, rows, floor.nx);
  // The height parameters need only the residuals' moments: no residual grid, no Sdr pass.
  ArealMoments moments;
  add_residual_band(window, fit_plane(window), 1, moments);
  const AmplitudeParameters a = amplitude_parameters(moments);
  SurfaceHeights h;
  h.sz_um = a.total_um;
  h.sv_um = a.valley_um;
  h.sp_um = a.peak_um;
  h.sa_um = a.mean_abs_um;
  h.ra_um = a.mean_abs_um;
  return h;
}

}  // namespace cuspmap

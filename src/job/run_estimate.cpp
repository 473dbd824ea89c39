// Forecast of a simulate run's cells, time and memory (see run_estimate.h).
// Method: measured rates (docs/performance.md, "Run forecast"), derived.
#include "job/run_estimate.h"

namespace cuspmap {
namespace {

// Whole-run rates in grid cells per second of wall time on the 2-core reference machine,
// sweep and texture together (docs/performance.md "Run forecast"): the in-memory envelope run
// is dominated by the texture report's filtered and FFT copies; the streamed run sweeps twice
// but measures cheaply.
// In memory: 1.44 M cells in 0.172 s and 48 M cells in 5.66 s, whole commands, idle (issue 15,
// docs/performance.md "Third pass"): ~8.5 M cells/s, taken as 8e6.
constexpr double kEnvelopeCellsPerS = 8e6;
constexpr double kStreamedCellsPerS = 1.5e8;
// Tooth-resolved sweep: cell visits (a cell within a move's reach, per tooth family) per second
// of wall time on 2 threads, by move kind. Each visit is a bound test against the cell's
// current height and, when the move can lower it, a few bracketed root solves of the bearing
// equation (lines: a series atan per step; arcs: a sin/cos/atan2 per step and the minima of the
// tooth's heights along the arc). Measured on the reference machine, unloaded: see
// docs/performance.md "Run forecast" (jobs, visits and times).
// Lines re-measured after the sweep's SIMD lanes (2026-12-05, docs/performance.md "Run
// forecast"): 3.9e8 (was 5.4e7 before them).
constexpr double kLineVisitsPerS = 3.9e8;
constexpr double kArcVisitsPerS = 9.3e5;

// Peak memory of an in-memory run in float grids of the floor's size: measured 14 bytes per
// cell on 48 M cells (670 MiB: floor, residual or brightness grid, the padded float ACF field,
// docs/performance.md), rounded up to 4 grids. (job/run_job.cpp streams above 16 grids' worth
// of the limit, a deliberate margin.) A streamed run holds a band, the next band, the overview.
constexpr double kInMemoryGrids = 4.0;
constexpr double kStreamedBands = 3.0;

}  // namespace

double teeth_sweep_seconds(const TeethWork& work) {
  return work.families * (work.line_visits / kLineVisitsPerS + work.arc_visits / kArcVisitsPerS);
}

RunEstimate estimate_run(std::int64_t nx, std::int64_t ny, bool tooth_marks, bool streamed,
                         std::int64_t band_bytes, const TeethWork& work) {
  RunEstimate e;
  e.cells = nx * ny;
  e.streamed = streamed;
  e.tooth_marks = tooth_marks;
  const double cells = static_cast<double>(e.cells);
  e.seconds = cells / (streamed ? kStreamedCellsPerS : kEnvelopeCellsPerS);
  // A streamed run sweeps every band twice.
  if (tooth_marks) e.seconds += (streamed ? 2.0 : 1.0) * teeth_sweep_seconds(work);
  e.bytes = streamed ? static_cast<std::int64_t>(kStreamedBands * static_cast<double>(band_bytes))
                     : static_cast<std::int64_t>(kInMemoryGrids * cells * sizeof(float));
  return e;
}

}  // namespace cuspmap

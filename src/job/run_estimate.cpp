// Forecast of a simulate run's cells, time and memory (see run_estimate.h).
// Method: measured cell rates (docs/performance.md, "Run forecast"), derived.
#include "job/run_estimate.h"

namespace cuspmap {
namespace {

// Whole-run rates in grid cells per second of wall time on the 2-core reference machine,
// sweep and texture together (docs/performance.md "Run forecast"): the in-memory envelope run
// is dominated by the texture report's filtered and FFT copies; the streamed run sweeps twice
// but measures cheaply; the tooth-resolved sweep costs ~O(teeth) Newton solves per cell.
constexpr double kEnvelopeCellsPerS = 2e6;
constexpr double kStreamedCellsPerS = 1.5e8;
// Tooth-resolved: tooth-edge crossings per second. A cell under the path is crossed by every
// tooth on every revolution while the tool passes over it: (path length x D / cell^2) cells
// swept x (D / feed per revolution) revolutions x teeth. Measured: the bracket pocket G-code
// job with tooth marks (4.4 M cell updates, 9e8 crossings) swept in 446 s on the loaded
// 2-core machine, ~2e6 crossings per s.
constexpr double kToothCrossingsPerS = 2e6;

// Peak grids of an in-memory run (job/run_job.cpp kInMemoryGrids: floor, residual, filtered
// and FFT copies of the texture report) and of a streamed run (band, next band, overview).
constexpr double kInMemoryGrids = 16.0;
constexpr double kStreamedBands = 3.0;

}  // namespace

RunEstimate estimate_run(std::int64_t nx, std::int64_t ny, bool tooth_marks, bool streamed,
                         std::int64_t band_bytes, const ToothWork& work) {
  RunEstimate e;
  e.cells = nx * ny;
  e.streamed = streamed;
  e.tooth_marks = tooth_marks;
  const double cells = static_cast<double>(e.cells);
  e.seconds = cells / (streamed ? kStreamedCellsPerS : kEnvelopeCellsPerS);
  if (tooth_marks && work.cell_mm > 0.0 && work.feed_mm_per_min > 0.0) {
    const double swept_cells = work.path_length_mm * work.diameter_mm / (work.cell_mm * work.cell_mm);
    const double revolutions = work.diameter_mm * work.rpm / work.feed_mm_per_min;
    e.seconds += (streamed ? 2.0 : 1.0) * swept_cells * revolutions * work.teeth /
                 kToothCrossingsPerS;
  }
  e.bytes = streamed ? static_cast<std::int64_t>(kStreamedBands * static_cast<double>(band_bytes))
                     : static_cast<std::int64_t>(kInMemoryGrids * cells * sizeof(float));
  return e;
}

}  // namespace cuspmap

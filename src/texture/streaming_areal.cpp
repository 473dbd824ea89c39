// Streaming plane sums (with the overview in the same read) and residual moments, row-parallel
// with per-row partials merged in row order. Inputs: bands (um, mm); outputs: PlaneSums,
// extremes, ArealMoments.
// Method: see streaming_areal.h.
#include "texture/streaming_areal.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <thread>
#include <vector>

#include "texture/band_row_sums.h"

namespace cuspmap {
namespace {

// Cells of a row per work item of pass 1: an L1-sized piece (32 KiB of floats) read by the
// plane kernel and again, still in cache, by the overview's.
constexpr int kChunkCells = 8192;
// Rows per work item when no overview groups them.
constexpr int kRowsPerRun = 16;

}  // namespace

void parallel_rows(int count, int threads, const std::function<void(int)>& body) {
  const int n = std::clamp(threads, 1, std::max(1, count));
  if (n == 1) {
    for (int k = 0; k < count; ++k) body(k);
    return;
  }
  std::vector<std::thread> pool;
  for (int t = 0; t < n; ++t) {
    pool.emplace_back([&, t] {
      for (int k = t; k < count; k += n) body(k);
    });
  }
  for (std::thread& th : pool) th.join();
}

StreamingPlane::StreamingPlane(int nx, int ny, double cell_mm, double origin_x_mm,
                               double origin_y_mm) {
  sums.x0_mm = origin_x_mm + 0.5 * nx * cell_mm;
  sums.y0_mm = origin_y_mm + 0.5 * ny * cell_mm;
}

void StreamingPlane::add_band(const Heightfield& band, int j0, int threads,
                              BlockMeanOverview* overview) {
  // Work items: a run of rows (those of one overview block row, so that no two items add to
  // the same block) times a column chunk of whole blocks; each row's chunks are merged in order.
  const int k = overview ? overview->cells_per_block() : 1;
  const int blocks = (band.nx + k - 1) / k;
  const int chunk_blocks = std::max(1, kChunkCells / k);
  const int chunks = (blocks + chunk_blocks - 1) / chunk_blocks;
  std::vector<int> run_start{0};
  for (int r = 1; r < band.ny; ++r) {
    if (overview ? (j0 + r) % k == 0 : r % kRowsPerRun == 0) run_start.push_back(r);
  }
  run_start.push_back(band.ny);
  const int runs = static_cast<int>(run_start.size()) - 1;
  std::vector<RowPlaneSums> partial(static_cast<std::size_t>(band.ny) * chunks);
  std::vector<double> x_mm(band.nx);
  positions_about({band.origin_x_mm, band.cell_mm, sums.x0_mm}, band.nx, x_mm.data());
  std::vector<AxisSums> chunk_axis(chunks);
  for (int c = 0; c < chunks; ++c) {
    const int i_lo = c * chunk_blocks * k, i_hi = std::min(band.nx, (c + 1) * chunk_blocks * k);
    chunk_axis[c] = axis_sums(x_mm.data() + i_lo, i_hi - i_lo);
  }
  parallel_rows(runs * chunks, threads, [&](int item) {
    const int run = item / chunks, c = item % chunks;
    const int b_lo = c * chunk_blocks, b_hi = std::min(blocks, b_lo + chunk_blocks);
    const int i_lo = b_lo * k, i_hi = std::min(band.nx, b_hi * k);
    for (int r = run_start[run]; r < run_start[run + 1]; ++r) {
      const float* row = band.z_um.data() + static_cast<std::int64_t>(r) * band.nx;
      row_plane_sums(row + i_lo, x_mm.data() + i_lo, i_hi - i_lo, chunk_axis[c],
                     partial[static_cast<std::size_t>(r) * chunks + c]);
      if (overview) overview->add_row(row, j0 + r, b_lo, b_hi);
    }
  });
  for (int j = 0; j < band.ny; ++j) {
    RowPlaneSums r;
    for (int c = 0; c < chunks; ++c) {
      const RowPlaneSums& p = partial[static_cast<std::size_t>(j) * chunks + c];
      r.n += p.n;
      r.sx += p.sx;
      r.sxx += p.sxx;
      r.sz += p.sz;
      r.sxz += p.sxz;
      r.lo = std::min(r.lo, p.lo);
      r.hi = std::max(r.hi, p.hi);
    }
    if (r.n == 0.0) continue;
    const double y = band.y_mm(j) - sums.y0_mm;
    sums.n += r.n;
    sums.sx += r.sx;
    sums.sy += y * r.n;
    sums.sxx += r.sxx;
    sums.sxy += y * r.sx;
    sums.syy += y * y * r.n;
    sums.sz += r.sz;
    sums.sxz += r.sxz;
    sums.syz += y * r.sz;
    min_um = reached == 0 ? r.lo : std::min(min_um, r.lo);
    max_um = reached == 0 ? r.hi : std::max(max_um, r.hi);
    reached += static_cast<std::int64_t>(r.n);
  }
}

void add_residual_band(const Heightfield& band, const Plane& plane, int threads,
                       ArealMoments& moments) {
  std::vector<ArealMoments> rows(band.ny);
  // Plane::at less its Y term, per column: z0 + gx (x - x0).
  std::vector<double> plane_x_um(band.nx);
  positions_about({band.origin_x_mm, band.cell_mm, plane.x0_mm}, band.nx, plane_x_um.data());
  for (double& q : plane_x_um) q = plane.z0_um + plane.gx_um_per_mm * q;
  parallel_rows(band.ny, threads, [&](int j) {
    const double y_part_um = plane.gy_um_per_mm * (band.y_mm(j) - plane.y0_mm);
    row_residual_moments(band.z_um.data() + static_cast<std::int64_t>(j) * band.nx,
                         plane_x_um.data(), band.nx, y_part_um, rows[j]);
  });
  for (const ArealMoments& m : rows) moments.merge(m);
}

}  // namespace cuspmap

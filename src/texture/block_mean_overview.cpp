// Block means accumulated band by band; block columns split across threads (each block's cells
// are summed by one thread in row order, so the sums do not depend on the thread count), rows
// by the row_block_sums kernel.
// Inputs: bands (um); output: reduced Heightfield. Method: see block_mean_overview.h.
#include "texture/block_mean_overview.h"

#include <algorithm>
#include <cmath>

#include "texture/band_row_sums.h"
#include "texture/streaming_areal.h"

namespace cuspmap {
namespace {

// Block columns per parallel work item: enough work per item, many items for the threads.
constexpr int kColumnsPerItem = 64;

}  // namespace

BlockMeanOverview::BlockMeanOverview(int nx, int ny, double cell_mm, double origin_x_mm,
                                     double origin_y_mm, int max_pixels)
    : nx_(nx), cell_mm_(cell_mm), origin_x_mm_(origin_x_mm), origin_y_mm_(origin_y_mm) {
  const int limit = std::max(max_pixels, 1);
  k_ = std::max(1, (std::max(nx, ny) + limit - 1) / limit);
  out_nx_ = (nx + k_ - 1) / k_;
  out_ny_ = (ny + k_ - 1) / k_;
  sum_.assign(static_cast<std::size_t>(out_nx_) * out_ny_, 0.0);
  count_.assign(sum_.size(), 0);
}

void BlockMeanOverview::add_band(const Heightfield& band, int j0, int threads) {
  const int items = (out_nx_ + kColumnsPerItem - 1) / kColumnsPerItem;
  parallel_rows(items, threads, [&](int item) {
    const int b_lo = item * kColumnsPerItem, b_hi = std::min(out_nx_, b_lo + kColumnsPerItem);
    for (int j = 0; j < band.ny; ++j) {
      add_row(band.z_um.data() + static_cast<std::int64_t>(j) * band.nx, j0 + j, b_lo, b_hi);
    }
  });
}

void BlockMeanOverview::add_row(const float* row, int grid_row, int b_lo, int b_hi) {
  const std::size_t o = static_cast<std::size_t>(grid_row / k_) * out_nx_ + b_lo;
  const int i_lo = b_lo * k_, i_hi = std::min(nx_, b_hi * k_);
  row_block_sums(row + i_lo, i_hi - i_lo, k_, sum_.data() + o, count_.data() + o);
}

Heightfield BlockMeanOverview::result() const {
  Heightfield hf;
  hf.nx = out_nx_;
  hf.ny = out_ny_;
  hf.cell_mm = cell_mm_ * k_;
  hf.origin_x_mm = origin_x_mm_;
  hf.origin_y_mm = origin_y_mm_;
  hf.z_um.resize(out_ny_, out_nx_);
  for (int bj = 0; bj < out_ny_; ++bj) {
    for (int bi = 0; bi < out_nx_; ++bi) {
      const std::size_t o = static_cast<std::size_t>(bj) * out_nx_ + bi;
      hf.z_um(bj, bi) = count_[o] == 0 ? kUnreached : static_cast<float>(sum_[o] / count_[o]);
    }
  }
  return hf;
}

}  // namespace cuspmap

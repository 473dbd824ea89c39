// Lay sums from the Hann-windowed power spectrum, in double precision on threads: rows by
// real-to-complex transforms, then columns in blocks of 8 bins, each block's sums taken while it
// is in cache and combined in block order (the same result for any thread count).
// Inputs: Heightfield um; output: LaySums. Cost O(N log N) / threads, 8 bytes per cell.
// Method: FFTW3 double precision (Frigo & Johnson 2005); Hann window; doubled angles.
#include "texture/lay_spectrum.h"

#include <fftw3.h>

#include <algorithm>
#include <cmath>
#include <numbers>
#include <optional>
#include <utility>
#include <vector>

#include "core/large_buffer.h"
#include "core/parallel_blocks.h"
#include "texture/fftw_plan.h"

namespace cuspmap {
namespace {

// Bins per column block: 8 complex doubles = two cache lines of each row.
constexpr int kColumnBlock = 8;
// Rows per work item of the row transforms and the windowed fill.
constexpr int kRowsPerTask = 16;

// The transform's field: ny rows of `stride` complex bins (whole column blocks), in place.
std::size_t complex_stride(int nx) {
  const int blocks = (nx / 2 + 1 + kColumnBlock - 1) / kColumnBlock;
  return static_cast<std::size_t>(blocks) * kColumnBlock;
}

// The two plans: rows windowed into a row beside the field (`model`, nx doubles) and transformed
// out of place into it, FFTW planning an out-of-place real transform in about half the time of
// an in-place one, a cost paid in every process (docs/performance.md, "Fourth pass"); then the
// columns in blocks of kColumnBlock bins, in place.
struct LayPlans {
  FftwPlan rows_fwd, cols_fwd;
  LayPlans(int nx, int ny, double* model, fftw_complex* spec0) {
    const int cstride = static_cast<int>(complex_stride(nx));
    rows_fwd = FftwPlan([&] {
      return fftw_plan_many_dft_r2c(1, &nx, 1, model, nullptr, 1, 0, spec0, nullptr, 1, 0,
                                    FFTW_ESTIMATE);
    });
    cols_fwd = FftwPlan([&] {
      return fftw_plan_many_dft(1, &ny, kColumnBlock, spec0, nullptr, cstride, 1, spec0, nullptr,
                                cstride, 1, FFTW_FORWARD, FFTW_ESTIMATE);
    });
  }
};

}  // namespace

LaySums lay_spectrum(const Heightfield& hf, int threads, const Plane* remove, LargeBytes* spent) {
  const int nx = hf.nx, ny = hf.ny, bins = nx / 2 + 1;
  const std::size_t stride = complex_stride(nx);  // complex per row
  const int blocks = static_cast<int>(stride / kColumnBlock);
  LargeBuffer<double> field(static_cast<std::size_t>(ny) * 2 * stride);
  const auto row = [&](int j) { return field.data() + static_cast<std::size_t>(j) * 2 * stride; };
  const auto spec = [&](int j) { return reinterpret_cast<fftw_complex*>(row(j)); };
  // Plans are made once (under the planner lock), then executed on every row or block.
  const auto row_doubles = static_cast<std::size_t>(nx);
  LargeBuffer<double> model(row_doubles);  // planned for: its address and alignment only
  const LayPlans plans(nx, ny, model.data(), spec(0));
  // Hann weights per column and row, computed once.
  const double two_pi = 2.0 * std::numbers::pi;
  std::vector<double> wx(static_cast<std::size_t>(nx));
  for (int i = 0; i < nx; ++i) {
    wx[static_cast<std::size_t>(i)] = 0.5 - 0.5 * std::cos(two_pi * (i + 0.5) / nx);
  }
  const int row_tasks = (ny + kRowsPerTask - 1) / kRowsPerTask;
  std::optional<ResidualRows> residual;  // as remove_plane
  if (remove != nullptr) residual.emplace(hf, *remove);
  parallel_blocks(row_tasks, threads, [&](int t) {
    LargeBuffer<double> beside(row_doubles);
    std::vector<float> residual_row(residual ? row_doubles : 0);
    for (int j = t * kRowsPerTask; j < std::min(ny, (t + 1) * kRowsPerTask); ++j) {
      const double wy = 0.5 - 0.5 * std::cos(two_pi * (j + 0.5) / ny);
      double* r = beside.data();
      const float* z = &hf.z_um(j, 0);
      if (residual) {
        residual->row(j, residual_row.data());
        z = residual_row.data();
      }
      for (int i = 0; i < nx; ++i) {
        const float v = z[i];
        r[i] = std::isnan(v) ? 0.0 : wx[static_cast<std::size_t>(i)] * wy * v;
      }
      fftw_execute_dft_r2c(plans.rows_fwd.get(), r, spec(j));
    }
  });
  // The doubled angle of k = (kx, ky) without trigonometry: cos 2phi = (kx^2 - ky^2) / |k|^2,
  // sin 2phi = 2 kx ky / |k|^2.
  std::vector<LaySums> part(static_cast<std::size_t>(blocks));
  parallel_blocks(blocks, threads, [&](int b) {
    fftw_complex* d = spec(0) + static_cast<std::size_t>(b) * kColumnBlock;
    fftw_execute_dft(plans.cols_fwd.get(), d, d);
    const int i0 = b * kColumnBlock, i1 = std::min(bins, i0 + kColumnBlock);
    LaySums sum;
    for (int j = 0; j < ny; ++j) {
      const double ky = (j <= ny / 2 ? j : j - ny) / (ny * hf.cell_mm);
      const fftw_complex* s = spec(j);
      for (int i = i0; i < i1; ++i) {
        if (i == 0 && j == 0) continue;
        const double kx = i / (nx * hf.cell_mm);
        // Columns 0 and nx/2 (even nx) hold both k and -k; the others stand for their mirror.
        const double weight = (i == 0 || 2 * i == nx) ? 1.0 : 2.0;
        const double p = weight * (s[i][0] * s[i][0] + s[i][1] * s[i][1]);
        const double k2 = kx * kx + ky * ky;
        sum.c += p * (kx * kx - ky * ky) / k2;
        sum.s += p * (2.0 * kx * ky) / k2;
        sum.total += p;
      }
    }
    part[static_cast<std::size_t>(b)] = sum;
  });
  LaySums out;
  for (const LaySums& p : part) {
    out.c += p.c;
    out.s += p.s;
    out.total += p.total;
  }
  if (spent != nullptr) *spent = std::move(field).release();
  return out;
}

void warm_lay_spectrum_plans(int nx, int ny) {
  // Mapped and never touched: FFTW_ESTIMATE plans read and write no data.
  LargeBuffer<double> field(static_cast<std::size_t>(ny) * 2 * complex_stride(nx));
  LargeBuffer<double> model(static_cast<std::size_t>(nx));
  const LayPlans plans(nx, ny, model.data(), reinterpret_cast<fftw_complex*>(field.data()));
}

}  // namespace cuspmap

// Row-column real FFT in single precision: one plan per kind (row forward, row inverse, column
// block forward and backward) executed on every row / block through FFTW's new-array interface.
// Inputs/outputs: SpectrumField. Cost O(N log N) / threads.
// Method: FFTW3 single precision (Frigo & Johnson 2005); Wiener-Khinchin theorem.
#include "texture/real_fft_2d.h"

#include <fftw3.h>

#include <algorithm>
#include <utility>

#include "core/parallel_blocks.h"
#include "texture/fftw_plan.h"

namespace cuspmap {
namespace {

// Rows per work item of the row transforms (enough to amortise the counter).
constexpr int kRowsPerTask = 16;

fftwf_complex* as_fftw(std::complex<float>* c) { return reinterpret_cast<fftwf_complex*>(c); }

// Column transform of one block of kFftColumnBlock bins, in place, over every row.
FftwfPlan column_plan(SpectrumField& f, int sign) {
  return FftwfPlan([&] {
    const int n = f.rows();
    const int stride = static_cast<int>(f.row_floats() / 2);
    fftwf_complex* d = as_fftw(f.spectrum_row(0));
    return fftwf_plan_many_dft(1, &n, kFftColumnBlock, d, nullptr, stride, 1, d, nullptr,
                               stride, 1, sign, FFTW_ESTIMATE);
  });
}

// Row transform, out of place between the field's first row and `beside` (a row of cols
// floats, 64-byte aligned like the field): forward real-to-complex or inverse.
FftwfPlan row_plan(SpectrumField& f, float* beside, bool forward) {
  return FftwfPlan([&] {
    const int n = f.cols();
    fftwf_complex* s = as_fftw(f.spectrum_row(0));
    return forward ? fftwf_plan_many_dft_r2c(1, &n, 1, beside, nullptr, 1, 0, s, nullptr, 1, 0,
                                             FFTW_ESTIMATE)
                   : fftwf_plan_many_dft_c2r(1, &n, 1, s, nullptr, 1, 0, beside, nullptr, 1, 0,
                                             FFTW_ESTIMATE);
  });
}

// The row transforms run out of place through a row beside the field (LargeBuffer: 64-byte
// aligned, as FFTW's own allocations): FFTW plans an out-of-place 1-D real transform in about
// half the time of an in-place one (measured: 7.7 vs 11.9 ms for r2c, 3.5 vs 13.0 ms for c2r at
// n = 1920, docs/performance.md "Fourth pass"), and planning is paid in every process.
// Forward: each row is copied beside and transformed into its own spectrum. Inverse: each
// spectrum is transformed beside (c2r out of place may overwrite its input, which the row's
// values then replace) and copied back.
void transform_rows(SpectrumField& f, const FftwfPlan& plan, bool forward, int row_begin, int row_end,
                    int threads) {
  const int tasks = (row_end - row_begin + kRowsPerTask - 1) / kRowsPerTask;
  const int n = f.cols();
  parallel_blocks(tasks, threads, [&](int t) {
    const int j0 = row_begin + t * kRowsPerTask, j1 = std::min(row_end, j0 + kRowsPerTask);
    LargeBuffer<float> beside(static_cast<std::size_t>(n));
    for (int j = j0; j < j1; ++j) {
      if (forward) {
        std::copy_n(f.row(j), n, beside.data());
        fftwf_execute_dft_r2c(plan.get(), beside.data(), as_fftw(f.spectrum_row(j)));
      } else {
        fftwf_execute_dft_c2r(plan.get(), as_fftw(f.spectrum_row(j)), beside.data());
        std::copy_n(beside.data(), n, f.row(j));
      }
    }
  });
}

}  // namespace

SpectrumField::SpectrumField(int rows, int cols) : SpectrumField(rows, cols, LargeBytes()) {}

SpectrumField::SpectrumField(int rows, int cols, LargeBytes spent) : rows_(rows), cols_(cols) {
  assert(rows >= 1 && cols >= 1 && "a field needs cells");
  const std::size_t bins = static_cast<std::size_t>(cols / 2 + 1);
  complex_stride_ = (bins + kFftColumnBlock - 1) / kFftColumnBlock * kFftColumnBlock;
  std::size_t stale_floats = 0;
  data_ = LargeBuffer<float>(static_cast<std::size_t>(rows) * row_floats(), std::move(spent),
                             &stale_floats);
  stale_rows_ = static_cast<int>((stale_floats + row_floats() - 1) / row_floats());
}

void SpectrumField::clear_stale_rows(int j0, int j1, int threads) {
  j1 = std::min(j1, stale_rows_);
  if (j1 <= j0) return;
  parallel_blocks(j1 - j0, threads, [&](int k) { std::fill_n(row(j0 + k), row_floats(), 0.0f); });
}

int spectrum_blocks(const SpectrumField& field) {
  return (field.bins() + kFftColumnBlock - 1) / kFftColumnBlock;
}

namespace {

// Forward rows, then per column block: forward columns, visit, and (inverse) columns back.
void run_columns(SpectrumField& f, int filled_rows, int threads, const SpectrumBlockVisit& visit,
                 bool inverse) {
  const int n = f.cols();
  // Plans are made once (under the planner lock), then executed on every row or block: the
  // same arithmetic whichever thread runs it.
  LargeBuffer<float> model(static_cast<std::size_t>(n));  // planned for: address, alignment
  const FftwfPlan rows_fwd = row_plan(f, model.data(), true);
  const FftwfPlan cols_fwd = column_plan(f, FFTW_FORWARD);
  const FftwfPlan cols_inv = column_plan(f, FFTW_BACKWARD);
  transform_rows(f, rows_fwd, true, 0, filled_rows, threads);
  parallel_blocks(spectrum_blocks(f), threads, [&](int b) {
    fftwf_complex* d = as_fftw(f.spectrum_row(0)) + static_cast<std::size_t>(b) * kFftColumnBlock;
    fftwf_execute_dft(cols_fwd.get(), d, d);
    visit(b, b * kFftColumnBlock, std::min(f.bins(), (b + 1) * kFftColumnBlock));
    if (inverse) fftwf_execute_dft(cols_inv.get(), d, d);
  });
}

}  // namespace

void forward_spectrum(SpectrumField& field, int filled_rows, int threads,
                      const SpectrumBlockVisit& visit) {
  run_columns(field, filled_rows, threads, visit, false);
}

void autocorrelate_field(SpectrumField& field, int filled_rows, int lag_rows, int threads) {
  const int rows = field.rows();
  run_columns(field, filled_rows, threads, [&](int, int bin0, int bin1) {
    for (int j = 0; j < rows; ++j) {
      std::complex<float>* s = field.spectrum_row(j);
      for (int k = bin0; k < bin1; ++k) s[k] = std::norm(s[k]);
    }
  }, true);
  LargeBuffer<float> model(static_cast<std::size_t>(field.cols()));  // planned for: alignment
  const FftwfPlan rows_inv = row_plan(field, model.data(), false);
  // Only rows holding lags |ty| <= lag_rows are brought back: 0..lag_rows and the wrapped ones.
  const int top = std::min(rows, lag_rows + 1);
  transform_rows(field, rows_inv, false, 0, top, threads);
  transform_rows(field, rows_inv, false, std::max(top, rows - lag_rows), rows, threads);
}

void warm_autocorrelation_plans(int rows, int cols) {
  // Mapped and never touched: FFTW_ESTIMATE plans read and write no data, they only look at the
  // addresses (alignment) and strides, which are the real field's.
  SpectrumField f(rows, cols);
  LargeBuffer<float> model(static_cast<std::size_t>(cols));
  const FftwfPlan plans[] = {row_plan(f, model.data(), true), column_plan(f, FFTW_FORWARD),
                             column_plan(f, FFTW_BACKWARD), row_plan(f, model.data(), false)};
}

}  // namespace cuspmap

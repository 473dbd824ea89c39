// Two-dimensional real FFT in single precision on threads, in place: rows by real-to-complex
// transforms, then columns in blocks of 16 bins, each block visited while it is in cache; and
// the circular autocorrelation built on it (power spectrum and inverse per column block).
// Inputs/outputs: a SpectrumField (rows x cols floats in FFTW's in-place layout). Cost
// O(N log N) / threads; bit-identical for any thread count (every row and column block runs the
// same plan, whichever thread takes it). Method: row-column FFT (FFTW3 single precision,
// Frigo & Johnson 2005); Wiener-Khinchin theorem for the autocorrelation.
#pragma once

#include <complex>
#include <cstddef>
#include <functional>

#include "core/large_buffer.h"

namespace cuspmap {

/// Columns of spectrum bins transformed together (16 complex floats = two cache lines per row).
inline constexpr int kFftColumnBlock = 16;

/// A rows x cols real field laid out for an in-place real-to-complex transform: each row holds
/// `row_floats` floats (2 x the row's complex bins, rounded up to whole column blocks). Fresh
/// fields are zero everywhere, padding included.
class SpectrumField {
 public:
  /// @param[in] rows, cols  field size, >= 1
  SpectrumField(int rows, int cols);
  /// As above, in the memory of a finished buffer (core/large_buffer.h reuse_bytes): rows from
  /// 0 to stale_rows() - 1 hold old values until written in full (row_floats() floats) or
  /// cleared (clear_stale_rows); the others are zero.
  SpectrumField(int rows, int cols, LargeBytes spent);
  /// Rows that may hold old values (0 for a fresh field).
  int stale_rows() const { return stale_rows_; }
  /// Zeroes rows [j0, j1) where they may hold old values (held pages: cheap), on threads.
  void clear_stale_rows(int j0, int j1, int threads);
  int rows() const { return rows_; }
  int cols() const { return cols_; }
  /// Complex bins of a row after the transform: cols / 2 + 1.
  int bins() const { return cols_ / 2 + 1; }
  /// Floats per row (twice the complex stride).
  std::size_t row_floats() const { return 2 * complex_stride_; }
  /// Row j's real values (cols used; the rest is padding that must stay zero before a transform).
  float* row(int j) { return data_.data() + static_cast<std::size_t>(j) * row_floats(); }
  const float* row(int j) const { return data_.data() + static_cast<std::size_t>(j) * row_floats(); }
  /// Row j's spectrum (bins() used) once transformed.
  std::complex<float>* spectrum_row(int j) {
    return reinterpret_cast<std::complex<float>*>(row(j));
  }

 private:
  int rows_ = 0, cols_ = 0;
  std::size_t complex_stride_ = 0;
  int stale_rows_ = 0;
  LargeBuffer<float> data_;
};

/// Visits a finished block of spectrum columns: bins [bin0, bin1) of every row; `block` numbers
/// the blocks 0, 1, ... (for per-block partial results combined in order).
using SpectrumBlockVisit = std::function<void(int block, int bin0, int bin1)>;

/// Number of column blocks a field's spectrum is visited in.
int spectrum_blocks(const SpectrumField& field);

/// Forward transform of the field (rows at and after `filled_rows` must be zero), then `visit`
/// on every column block of the spectrum (unnormalised FFTW sign convention e^{-i...}).
/// @param[in,out] field    real values in; spectrum out
/// @param[in] filled_rows  rows that may be non-zero, the first ones
/// @param[in] threads      workers, 0 = all hardware threads
/// @param[in] visit        called concurrently for different blocks
void forward_spectrum(SpectrumField& field, int filled_rows, int threads,
                      const SpectrumBlockVisit& visit);

/// Replaces the field by its circular autocorrelation, unnormalised: entry (ty, tx) becomes
/// rows * cols * sum_p a(p) a(p + t) (indices mod the sizes), for row lags |ty| <= lag_rows only
/// (the other rows are left undefined). Pad with zeros to keep the lags used free of wrap-around.
/// @param[in,out] field    real values in (rows >= filled_rows zero); autocorrelation out
/// @param[in] filled_rows  rows that may be non-zero, the first ones
/// @param[in] lag_rows     largest row lag needed, >= 0
/// @param[in] threads      workers, 0 = all hardware threads
void autocorrelate_field(SpectrumField& field, int filled_rows, int lag_rows, int threads);

/// Makes and drops the plans forward_spectrum and autocorrelate_field use on a fresh rows x cols
/// field, so that their own planning later finds them in FFTW's planner cache (planning the same
/// problem again costs ~0.03 ms instead of 7-11 ms at 1920 columns, measured). Thread-safe
/// (fftw_plan.h): meant to run beside other work before the transforms.
void warm_autocorrelation_plans(int rows, int cols);

}  // namespace cuspmap

// Circular autocorrelation of a real 1-D or 2-D array by FFT (|F|^2, then the inverse), the
// shared step of the profile periodicity test and the areal ACF. Inputs/outputs: a row-major
// array in an FFTW buffer, replaced by its autocorrelation times the element count.
// Cost O(N log N). Method: Wiener-Khinchin theorem; FFTW3 real transforms (Frigo & Johnson 2005).
#pragma once

#include <fftw3.h>

#include <cstddef>
#include <memory>

#include "texture/fftw_plan.h"

namespace cuspmap {

/// Frees memory from fftw_malloc.
struct FftwFree {
  void operator()(void* p) const { fftw_free(p); }
};
/// An fftw_malloc'd array of doubles (aligned for FFTW's SIMD kernels).
using FftwRealBuffer = std::unique_ptr<double, FftwFree>;

/// A zero-filled FFTW buffer of `count` doubles.
FftwRealBuffer fftw_real_buffer(std::size_t count);

/// Circular autocorrelation of rows x cols arrays of one size, planned once (FFTW's planning,
/// even with FFTW_ESTIMATE, costs more than a transform of a profile: measured ~3 M
/// instructions per plan against ~0.1 M per transform of 2400 samples). One object is not
/// thread-safe; several may be made and run on different threads (planner lock: fftw_plan.h).
class Autocorrelator {
 public:
  Autocorrelator(int rows, int cols);

  /// The rows x cols input, row-major (rows = 1 for a profile); zero after construction.
  double* data() { return data_.get(); }
  int rows() const { return rows_; }
  int cols() const { return cols_; }
  /// Replaces data() with its circular autocorrelation, unnormalised: entry (ty, tx) becomes
  /// rows * cols * sum_p a(p) a(p + t) (indices mod the sizes). Callers pad with zeros to keep
  /// the lags they use free of wrap-around.
  void run();

 private:
  int rows_ = 0, cols_ = 0;
  FftwRealBuffer data_;
  std::unique_ptr<fftw_complex, FftwFree> spec_;
  FftwPlan fwd_, inv_;
};

}  // namespace cuspmap

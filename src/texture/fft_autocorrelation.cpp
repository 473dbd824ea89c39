// Autocorrelation by FFT with FFTW3 real-to-complex and complex-to-real 2-D plans.
// Inputs/outputs: row-major doubles. Cost O(N log N).
// Method: Wiener-Khinchin theorem (ACF = inverse transform of the power spectrum).
#include "texture/fft_autocorrelation.h"

#include <algorithm>

namespace cuspmap {

FftwRealBuffer fftw_real_buffer(std::size_t count) {
  FftwRealBuffer buf(
      static_cast<double*>(fftw_malloc(sizeof(double) * std::max<std::size_t>(count, 1))));
  std::fill(buf.get(), buf.get() + count, 0.0);
  return buf;
}

Autocorrelator::Autocorrelator(int rows, int cols)
    : rows_(rows),
      cols_(cols),
      data_(fftw_real_buffer(static_cast<std::size_t>(rows) * static_cast<std::size_t>(cols))) {
  const std::size_t bins = static_cast<std::size_t>(rows) * static_cast<std::size_t>(cols / 2 + 1);
  spec_.reset(static_cast<fftw_complex*>(fftw_malloc(sizeof(fftw_complex) * bins)));
  // ESTIMATE plans cost no measuring time and do not overwrite the input while planning.
  fwd_ = FftwPlan([&] {
    return fftw_plan_dft_r2c_2d(rows, cols, data_.get(), spec_.get(), FFTW_ESTIMATE);
  });
  inv_ = FftwPlan([&] {
    return fftw_plan_dft_c2r_2d(rows, cols, spec_.get(), data_.get(), FFTW_ESTIMATE);
  });
}

void Autocorrelator::run() {
  const std::size_t bins = static_cast<std::size_t>(rows_) * static_cast<std::size_t>(cols_ / 2 + 1);
  fftw_execute(fwd_.get());
  fftw_complex* spec = spec_.get();
  for (std::size_t k = 0; k < bins; ++k) {
    const double re = spec[k][0], im = spec[k][1];
    spec[k][0] = re * re + im * im;
    spec[k][1] = 0.0;
  }
  fftw_execute(inv_.get());
}

}  // namespace cuspmap

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

void fft_autocorrelate(double* data, int rows, int cols) {
  const std::size_t bins = static_cast<std::size_t>(rows) * static_cast<std::size_t>(cols / 2 + 1);
  std::unique_ptr<fftw_complex, FftwFree> spec(
      static_cast<fftw_complex*>(fftw_malloc(sizeof(fftw_complex) * bins)));
  // ESTIMATE plans cost no measuring time and do not overwrite the input while planning.
  fftw_plan fwd = fftw_plan_dft_r2c_2d(rows, cols, data, spec.get(), FFTW_ESTIMATE);
  fftw_plan inv = fftw_plan_dft_c2r_2d(rows, cols, spec.get(), data, FFTW_ESTIMATE);
  fftw_execute(fwd);
  for (std::size_t k = 0; k < bins; ++k) {
    const double re = spec.get()[k][0], im = spec.get()[k][1];
    spec.get()[k][0] = re * re + im * im;
    spec.get()[k][1] = 0.0;
  }
  fftw_execute(inv);
  fftw_destroy_plan(fwd);
  fftw_destroy_plan(inv);
}

}  // namespace cuspmap

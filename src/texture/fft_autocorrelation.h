// Circular autocorrelation of a real 1-D or 2-D array by FFT (|F|^2, then the inverse), the
// shared step of the profile periodicity test and the areal ACF. Inputs/outputs: a row-major
// array in an FFTW buffer, replaced by its autocorrelation times the element count.
// Cost O(N log N). Method: Wiener-Khinchin theorem; FFTW3 real transforms (Frigo & Johnson 2005).
#pragma once

#include <fftw3.h>

#include <cstddef>
#include <memory>

namespace cuspmap {

/// Frees memory from fftw_malloc.
struct FftwFree {
  void operator()(void* p) const { fftw_free(p); }
};
/// An fftw_malloc'd array of doubles (aligned for FFTW's SIMD kernels).
using FftwRealBuffer = std::unique_ptr<double, FftwFree>;

/// A zero-filled FFTW buffer of `count` doubles.
FftwRealBuffer fftw_real_buffer(std::size_t count);

/// Replaces the rows x cols array with its circular autocorrelation, unnormalised: entry
/// (ty, tx) becomes rows * cols * sum_p a(p) a(p + t) (indices mod the sizes). Callers pad with
/// zeros to keep the lags they use free of wrap-around.
/// @param[in,out] data  rows x cols doubles, row-major (rows = 1 for a profile)
void fft_autocorrelate(double* data, int rows, int cols);

}  // namespace cuspmap

// The measured window of the floor fit: the floor decimated to at most kMaxFitSamples per side
// over at most kMaxFitPeriods stepovers, its finite samples and the plane basis over them.
// Inputs: Heightfield (um, mm cells), stepover mm; output: FitWindow. Cost O(window samples).
// Method: strided decimation; thin QR of [1, x, y] (Golub & Van Loan 2013, 5.2).
#pragma once

#include <vector>
#include <Eigen/Dense>

#include "core/heightfield.h"

namespace cuspmap {

// The measured window and the plane basis over its finite samples.
struct FitWindow {
  Patch patch;
  Heightfield measured;          // window samples, um (NaN = missing)
  std::vector<int> index;        // finite sample -> cell index in the window (row-major)
  Eigen::MatrixXd q;             // thin Q of [1, x, y] over the finite samples
  Eigen::MatrixXd basis;         // [1, x - x0, y - y0]
  double x0_mm = 0.0, y0_mm = 0.0;
  std::vector<double> v;         // finite sample -> across-lay coordinate (across_lay_mm), mm
  double v_max_mm = 0.0;         // largest |v| plus a stepover (offsets move passes that far)
};

/// The central window of `hf` for a floor of passes `stepover_mm` apart.
FitWindow make_fit_window(const Heightfield& hf, double stepover_mm);

}  // namespace cuspmap

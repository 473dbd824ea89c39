// Full-resolution window of a measured floor for the tooth-resolved fit: a centred block a few
// revolutions long along the lay and a few stepovers across it, its finite samples and the
// plane basis that is projected out of the residual. Inputs: Heightfield um over mm cells, lay,
// stepover and feed per revolution (mm); output: ToothWindow. Cost O(window cells).
// Method: variable projection of the plane (Golub & Pereyra 1973), as infer/floor_fit.
#pragma once

#include <Eigen/Core>
#include <vector>

#include "core/heightfield.h"

namespace cuspmap {

/// Most cells of the tooth window (one tooth-resolved sweep of one 6 mm pass over 64 000 cells
/// took ~30 ms on the shared 2-core machine, docs/performance.md; derived budget).
inline constexpr int kMaxToothWindowCells = 64000;
/// Revolutions the window spans along the lay at least (the marks' period; derived: 6 repeats
/// average the noise of one band's phase).
inline constexpr double kToothWindowRevolutions = 6.0;

/// The measured window.
struct ToothWindow {
  Patch patch;                 ///< its grid (cell centres at the measured cells)
  Heightfield measured;        ///< window samples, um (NaN = missing)
  std::vector<int> index;      ///< finite sample -> cell index (row-major)
  Eigen::MatrixXd q;           ///< thin Q of [1, x, y] over the finite samples
  Eigen::VectorXd values;      ///< measured heights at the finite samples, um

  /// Residual measured - model at the finite samples with the plane projected out (a sample
  /// the model does not reach counts as its measured height).
  Eigen::VectorXd residual(const Heightfield& model) const;
};

/// Cuts the window.
/// @param[in] hf             measured floor
/// @param[in] lay_deg        pass direction
/// @param[in] stepover_mm    distance between passes (> 0)
/// @param[in] revolution_mm  feed per revolution Z fz (> 0)
/// @param[in] revolutions    revolutions along the lay at least (the window grows past them up
///                           to max_cells)
/// @param[in] max_cells      most cells of the window
ToothWindow tooth_window(const Heightfield& hf, double lay_deg, double stepover_mm,
                         double revolution_mm, double revolutions = kToothWindowRevolutions,
                         int max_cells = kMaxToothWindowCells);

}  // namespace cuspmap

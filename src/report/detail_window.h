// The detail window of a floor's pictures: a square of about 1.5 mm, at native resolution, placed
// where the marks are deepest (largest RMS height after removing the window's least-squares
// plane). Inputs: heights um on cells of cell_mm; output: the window in cells and mm.
// Cost: O(cells) + O(windows) with tile sums. Method: ISO 25178-2 Sq on the F-operated
// (least-squares plane removed) window; summed tiles of the normal-equation moments.
#pragma once

#include "core/heightfield.h"

namespace cuspmap {

/// Side of the detail window aimed at, mm: 1-2 mm holds 10-60 tooth marks at feeds per tooth of
/// 0.03-0.1 mm and one or more stepovers of a finishing pass. Common practice, no source.
inline constexpr double kDetailTargetMm = 1.5;
/// Fewest cells along a window side: fewer cannot show a mark's shape (a coarse grid then gets
/// a window larger than kDetailTargetMm).
inline constexpr int kDetailMinCells = 32;
/// Most cells along a window side, so that the detail picture stays near screen size.
inline constexpr int kDetailMaxCells = 512;
/// Windows are tried at steps of a quarter window: the deepest patch of marks lies at least
/// three quarters inside one of them.
inline constexpr int kDetailStepsPerWindow = 4;

/// Windows whose plane-removed Sq is within this fraction of the deepest count as equally deep
/// (the nearest to the floor's centre is taken): differences of a few percent are sampling,
/// not a different finish. Common practice, no source.
inline constexpr double kDetailSqTolerance = 0.05;

/// A rectangle of cells and where it lies.
struct DetailWindow {
  int i0 = 0;              ///< first column
  int j0 = 0;              ///< first row (row 0 = lowest Y)
  int nx = 0;              ///< columns, >= 1
  int ny = 0;              ///< rows, >= 1
  double x0_mm = 0.0;      ///< X of the left edge, from the patch origin (hf.origin_x_mm + i0 cell)
  double y0_mm = 0.0;      ///< Y of the lower edge
  double size_x_mm = 0.0;  ///< nx x cell
  double size_y_mm = 0.0;  ///< ny x cell
  double sq_um = 0.0;      ///< RMS height of its reached cells about their least-squares plane
};

/// Chooses the detail window: side w = clamp(round(kDetailTargetMm / cell), kDetailMinCells,
/// kDetailMaxCells) cells, clipped to the grid; positions on a grid of w / 4 cells (the last one
/// flush with the far edge); among the windows whose cells are all reached (or, if none is, the
/// most reached ones) those whose plane-removed Sq is within kDetailSqTolerance of the largest,
/// and of these the one whose centre is nearest the grid's centre (first found on a tie).
/// @param[in] hf  heightfield, nx, ny >= 1, cell_mm > 0 (NaN = not reached)
DetailWindow choose_detail_window(const Heightfield& hf);

/// The cells of a window as a heightfield of their own (origin at the window's corner).
Heightfield crop_heightfield(const Heightfield& hf, const DetailWindow& window);

}  // namespace cuspmap

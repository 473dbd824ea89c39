// Tooth-resolved height one straight move leaves at a cell: the lowest of the tooth edges that
// pass over it, found without time stepping. Cost O(teeth) root solves per cell (a few atan2
// each) next to each local minimum of the revolving envelope along the move.
// Method: DESIGN.md "Tooth-resolved" (tooth trajectory, Altintas, Manufacturing Automation 2nd
// ed. 2012, ch. 2; runout after Kline & DeVor 1983): tooth k passes the cell when the cell's
// bearing from the axis equals the tooth angle (+ the runout's small bearing offset); along a
// line that condition is atan2(w, x) + kappa x = const, monotone between at most two turning
// points, so each crossing is a bracketed Newton root (Press et al., Numerical Recipes §9.4).
#pragma once

#include <array>
#include <limits>
#include <vector>

#include "sweep/bearing_series.h"
#include "sweep/prepare_moves.h"
#include "sweep/sweep_setup.h"
#include "tool/chord_min.h"

namespace cuspmap {

/// Tooth crossings of one non-vertical straight move, set up once and asked cell after cell.
/// Cells of a row parallel to the move share their chord (same lateral offset, same reach), so
/// the chord's minima and the bearings there are kept from the previous cell. Not thread-safe:
/// one per move per tile.
class LineTeeth {
 public:
  /// @param[in] setup  profiles, teeth, runout, tilt, spindle speed (must outlive this)
  /// @param[in] move   a Line move with length_xy_mm > 0 (must outlive this)
  LineTeeth(const SweepSetup& setup, const PreparedMove& move);

  /// Lowest tooth-edge height over a cell, mm above the floor (axial offsets included);
  /// +infinity when no tooth passes the cell within reach, or when the revolving envelope (a
  /// lower bound of every crossing) is not below bound_mm.
  /// @param[in] u_mm      cell coordinate along the move from its start
  /// @param[in] w_mm      cell coordinate to the move's left
  /// @param[in] bound_mm  the cell's current height (mm); +infinity when unreached
  double height_mm(double u_mm, double w_mm, double bound_mm);

  /// Lower bound of every height this move leaves on cells at lateral offset w_mm (a grid row
  /// parallel to the move), mm; +infinity out of reach. Also prepares the chord of the cells
  /// beside the move, so height_mm on that row reuses it.
  double row_low_mm(double w_mm);

  /// Folds this move's heights into a run of one grid row's cells, exactly as height_mm cell by
  /// cell (bound = the cell's height) would: where the cells share one chord (a row parallel to
  /// the move, away from its ends) their crossings are taken in SIMD lanes (teeth_line_run.cpp).
  /// @param[in] y_mm        the row's centre Y (mm)
  /// @param[in] i_lo, i_hi  the run's first and last column (inclusive)
  /// @param[in,out] row     the grid row (um, +infinity = unreached); cell i lowered to the height
  void sweep_run(double y_mm, int i_lo, int i_hi, float* row);

 private:
  // Prepares minima_, angles_ and low_mm_ for the chord [lo, hi] at offset w (cached).
  void prepare_chord(double w_mm, double lo, double hi);

  const SweepSetup& setup_;
  const PreparedMove& move_;
  double rise_ = 0.0;         // tip rise per mm along the move
  double slope_ = 0.0;        // rise plus the tilt's drop along the move (chord's linear term)
  double tilt_across_ = 0.0;  // tilt's drop per mm to the move's left
  double kappa_ = 0.0;        // tooth angle turned per mm of travel, rad/mm (signed)
  double phase0_ = 0.0;       // tooth 0's angle at the start less the move's direction, rad
  double walk_mm_ = 0.0;      // travel of the longest walk from a minimum (two revolutions)
  double turn_mm_ = 0.0;      // turning points of the chord's bearing at +-turn_mm_ (0: none)
  double half_w_ = std::numeric_limits<double>::quiet_NaN();  // offset half_ was computed for
  double half_ = 0.0;         // half length of the chord within reach at offset half_w_
  bool cached_ = false;       // minima_, angles_ and low_mm_ hold the chord below
  double cache_w_ = 0.0, cache_lo_ = 0.0, cache_hi_ = 0.0;
  double low_mm_ = 0.0;  // lowest family minimum plus its axial offset: bound of every crossing
  // Per tooth family (setup.families): local minima of that tooth's heights along the chord,
  // where its lowest crossings lie, and atan2(w, x) at each.
  std::vector<ChordMin> minima_;
  std::vector<std::array<double, kMaxChordCandidates>> angles_;
  // Per family and minimum: the lattice value there (bearing less tooth advance and runout
  // offset, without the cell's target) and the bearing series for closed-form crossings.
  struct Start {
    double f0 = 0.0;
    double s0 = 0.0;  // slope of the lattice value there, rad/mm
    BearingSeries series;
  };
  std::vector<std::array<Start, kMaxChordCandidates>> starts_;

  // sweep_run: whether the lanes can take the chord at lateral offset w (cached per offset).
  bool run_ready(double w_mm);
  double run_key_w_ = std::numeric_limits<double>::quiet_NaN();  // offset run_ok_ is for
  bool run_ok_ = false;
  bool run_line_profile_ = false;  // the tooth profile is one line piece (flat, dished flat)
  double run_w_ = 0.0, run_w2_ = 0.0, run_half_ = 0.0;  // height_mm's w, w^2 and half chord
};

}  // namespace cuspmap

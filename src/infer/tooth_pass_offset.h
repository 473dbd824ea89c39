// Pass offset of a tooth-resolved floor from its feed marks alone, no sweep: a flat end's rim arc
// at lateral distance d from a pass's axis lies sqrt(a^2 - d^2) ahead of the tool centre (a the
// rim radius), so along each line across the lay the phase of the marks' fundamental follows
// that circle of the pass cutting the line; with a tilt the line is cut by the pass whose rim's
// lowest point (d0 from its axis) runs nearest to it. Inputs: Heightfield (um over mm cells),
// lay (deg), stepover, rim radius, fz (mm), Z; output: a pass axis across the lay (mm) and the
// filter's contrast. Cost O(cells + trials x passes x lines). Method: matched filter of the
// per-line Fourier coefficients over the pass axis and d0 (derived geometry, see the .cpp).
#pragma once

#include "core/heightfield.h"

namespace cuspmap {

/// The marks' estimate of where the passes run.
struct MarksPassOffset {
  bool found = false;      ///< a filter score above noise was found
  double axis_mm = 0.0;    ///< a pass axis's position across the lay, (x, y) . n, n = lay + 90 deg
  double lowest_mm = 0.0;  ///< lateral distance of the rim's lowest point from the axis, + = n
  double contrast = 0.0;   ///< best score over the mean score of all trials (>= 1)
  double period_mm = 0.0;  ///< the marks' period whose fundamental gave it (fz or Z fz)
};

/// Least contrast (best over mean score) of an estimate the tooth stage uses (derived: the
/// score of a wrong axis is a sum of random phasors, ~1/sqrt(lines per band) of a coherent one;
/// the campaign floors measured 4-9).
inline constexpr double kMarksOffsetMinContrast = 3.0;

/// Matched filter: pass axes every half cell over one stepover, lowest points every two cells
/// within the rim, each line across the lay assigned to the pass whose lowest point runs
/// nearest; the score sums, per pass, |sum over its lines of the line's coefficient turned back
/// by the rim's circle| (leading or trailing rim, the better). Both periods fz and Z fz tried.
/// @param[in] hf           measured floor (NaN = missing)
/// @param[in] lay_deg      pass direction, deg from +X
/// @param[in] stepover_mm  pass spacing (> 0)
/// @param[in] rim_mm       radius of the rim that leaves the marks (the flat part's)
/// @param[in] fz_mm        feed per tooth (> 0)
/// @param[in] teeth        Z (>= 1)
MarksPassOffset marks_pass_offset(const Heightfield& hf, double lay_deg, double stepover_mm,
                                  double rim_mm, double fz_mm, int teeth);

}  // namespace cuspmap

// How much work a tooth-resolved sweep will do, counted the way the sweep does it: per move,
// the cells of each grid row within the cutter's reach (row_span), by move kind, times the tooth
// families searched per cell. Inputs: Cutter, Toolpath, CutSpec, Patch; output: counts.
// Cost O(moves x rows reached): no heights are computed. Method: sweep/row_span.h, derived.
#pragma once

#include <cstdint>

#include "core/heightfield.h"
#include "path/move.h"
#include "path/path_spec.h"
#include "tool/cutter.h"

namespace cuspmap {

/// Cell visits of a tooth-resolved sweep before any pruning.
struct TeethWork {
  double line_visits = 0.0;  ///< cells reached by straight moves with XY travel, summed over moves
  double arc_visits = 0.0;   ///< cells reached by arcs, helices and plunges, summed over moves
  int families = 1;          ///< tooth families searched per visit (1, or Z with runout/offsets)
};

/// Counts the visits of the tooth-resolved sweep of a path over a patch.
/// @param[in] cutter  validated cutter (reach, teeth, runout, axial offsets)
/// @param[in] path    moves in program coordinates
/// @param[in] cut     rpm, spindle direction
/// @param[in] patch   grid
TeethWork teeth_work(const Cutter& cutter, const Toolpath& path, const CutSpec& cut,
                     const Patch& patch);

}  // namespace cuspmap

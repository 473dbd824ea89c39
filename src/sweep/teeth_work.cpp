// Cell visits of a tooth-resolved sweep per move kind (see teeth_work.h).
// Inputs: Cutter, Toolpath, CutSpec, Patch; output: TeethWork. Method: row_span per row, derived.
#include "sweep/teeth_work.h"

#include <algorithm>
#include <cmath>
#include <vector>

#include "sweep/prepare_moves.h"
#include "sweep/row_span.h"
#include "sweep/sweep_setup.h"

namespace cuspmap {

TeethWork teeth_work(const Cutter& cutter, const Toolpath& path, const CutSpec& cut,
                     const Patch& patch) {
  const SweepSetup setup = sweep_setup(cutter, cut, patch);
  PreparedCounts counts;
  const std::vector<PreparedMove> moves = prepare_moves(path, cut, patch, setup.envelope.reach_mm,
                                                        setup.top_mm + kReachMarginMm, counts);
  TeethWork work;
  work.families = static_cast<int>(setup.families.size());
  const double reach = setup.envelope.reach_mm, cell = setup.cell_mm;
  for (const PreparedMove& m : moves) {
    const double y_lo = m.y_min_mm - reach, y_hi = m.y_max_mm + reach;
    const int j0 = std::max(0, static_cast<int>(std::floor(y_lo / cell - 0.5)));
    const int j1 = std::min(setup.ny - 1, static_cast<int>(std::ceil(y_hi / cell - 0.5)));
    double visits = 0.0;
    for (int j = j0; j <= j1; ++j) {
      int i_lo = 0, i_hi = -1;
      if (row_span(m, (j + 0.5) * cell, reach, cell, 0, setup.nx - 1, i_lo, i_hi)) {
        visits += i_hi - i_lo + 1;
      }
    }
    (m.kind == MoveKind::Line && !m.vertical() ? work.line_visits : work.arc_visits) += visits;
  }
  return work;
}

}  // namespace cuspmap

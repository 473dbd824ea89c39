// Picks the quickest option that meets a target Ra (ties: shallower marks) and says why.
// Inputs: StrategyScore list (um, s); output: StrategyChoice.
#include "finish/choose_strategy.h"

#include <cassert>

#include "core/display_quantity.h"
#include "core/units.h"

namespace cuspmap {

StrategyChoice choose_strategy(const std::vector<StrategyScore>& options, double target_ra_um) {
  assert(!options.empty() && target_ra_um > 0.0 && "at least one option and a positive target");
  StrategyChoice c;
  size_t closest = 0;
  for (size_t k = 0; k < options.size(); ++k) {
    const StrategyScore& o = options[k];
    c.meets.push_back(o.ra_um <= target_ra_um);
    if (o.ra_um < options[closest].ra_um) closest = k;
    if (!c.meets.back()) continue;
    if (!c.best) {
      c.best = k;
      continue;
    }
    const StrategyScore& b = options[*c.best];
    if (o.cycle_time_s < b.cycle_time_s ||
        (o.cycle_time_s == b.cycle_time_s && o.sz_um < b.sz_um)) {
      c.best = k;
    }
  }
  c.closest = closest;
  const std::string target = "Ra " + display_number(target_ra_um, 1e-6) + " um";
  if (c.best) {
    const StrategyScore& b = options[*c.best];
    size_t meeting = 0;
    for (bool m : c.meets) meeting += m ? 1 : 0;
    c.reason = b.name + ": meets " + target + " (predicted Ra " + display_number(b.ra_um, 1e-6) +
               " um) with the shortest machine time of the " + std::to_string(meeting) +
               " options that meet it (" + display_number(b.cycle_time_s, 1e-6) +
               " s); its marks are " + display_number(b.sz_um, 1e-6) +
               " um deep (Sz) if they must be sanded out.";
  } else {
    const StrategyScore& n = options[closest];
    c.reason = "No option meets " + target + "; the closest is " + n.name + " (Ra " +
               display_number(n.ra_um, 1e-6) + " um): use a finer stepover or plan to sand " +
               display_number(n.sz_um, 1e-6) + " um (Sz).";
  }
  return c;
}

}  // namespace cuspmap

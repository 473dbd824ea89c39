// Phase profile of the tooth-resolved stage: the runout vector turned and held, the rest solved,
// a compass search on the profile cost and its curvature. Inputs: ToothProblem, Z, fz (mm);
// output: PhaseProfile (deg, um^2), phase variance (deg^2).
// Method: profile likelihood (Bates & Watts 1988 §6.1); compass search (Kolda, Lewis & Torczon
// 2003, SIAM Review 45: a step kept while it improves, then halved).
#include "infer/tooth_phase_search.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

#include "infer/tooth_runout_scan.h"

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;
// First step of the search, deg: the runout scan's grid step (12 deg) less a third: the solver
// moves the phase only 2-3 deg from a start 10 deg off (measured on the damaged 3-flute round
// trip: stops at 41.1 and 58.1 deg from 38.5 and 58.5, truth 40; docs/diagnose.md).
constexpr double kFirstStepDeg = 8.0;
// Halvings of the step after the first (8 -> 4 deg: under the 15 deg phase tolerance
// with room; derived).
constexpr int kHalvings = 1;
// Moves at one step size at most (3 x 8 deg covers the 25 deg spread of the solver's stops
// measured from starts that differed in their last digits; docs/diagnose.md).
constexpr int kMaxMoves = 3;
// Solver iterations per profile point: the held runout leaves the shifts, dish and tilts to
// follow, which they do within 3-5 Jacobians (measured on the round trips).
constexpr int kProfileIterations = 4;
// Shift refinement step per tooth pitch (as the stage's last refinement).
constexpr double kRefineStepPitches = 1.0 / 32.0;

// The profile cost at phase psi with the magnitude e held: labels searched, then the rest of
// the state solved with the runout fixed.
double profile_point(ToothProblem& p, const ToothState& from, double e_um, double psi_deg,
                     int teeth, double fz_mm) {
  ToothState s = from;
  s.g[kRunoutCos] = e_um * std::cos(psi_deg * kDegToRad);
  s.g[kRunoutSin] = e_um * std::sin(psi_deg * kDegToRad);
  const bool free_cos = p.free[kRunoutCos], free_sin = p.free[kRunoutSin];
  p.free[kRunoutCos] = p.free[kRunoutSin] = false;
  p.set(s);
  search_labels(p, teeth, fz_mm);
  p.update_active();
  p.solve(kProfileIterations);
  p.refine_shifts(fz_mm * kRefineStepPitches);
  p.solve(kProfileIterations);
  p.free[kRunoutCos] = free_cos;
  p.free[kRunoutSin] = free_sin;
  return p.residual().squaredNorm();
}

}  // namespace

PhaseProfile search_phase(ToothProblem& p, int teeth, double fz_mm) {
  PhaseProfile out;
  const ToothState start = p.state();
  const double e = std::hypot(start.g[kRunoutCos], start.g[kRunoutSin]);
  out.psi_deg.push_back(std::atan2(start.g[kRunoutSin], start.g[kRunoutCos]) / kDegToRad);
  out.cost.push_back(p.residual().squaredNorm());
  if (teeth < 3 || !(e > 0.0)) return out;
  std::vector<ToothState> states{start};
  auto evaluated = [&](double psi) {
    return std::any_of(out.psi_deg.begin(), out.psi_deg.end(),
                       [&](double q) { return std::abs(q - psi) < 1e-9; });
  };
  double step = kFirstStepDeg;
  for (int h = 0; h <= kHalvings; ++h, step *= 0.5) {
    for (int moves = 0; moves < kMaxMoves; ++moves) {
      const size_t centre = static_cast<size_t>(out.best);
      bool moved = false;
      for (const double dir : {-1.0, 1.0}) {
        const double psi = out.psi_deg[centre] + dir * step;
        if (evaluated(psi)) continue;
        const double cost = profile_point(p, states[centre], e, psi, teeth, fz_mm);
        out.psi_deg.push_back(psi);
        out.cost.push_back(cost);
        states.push_back(p.state());
        if (cost < out.cost[static_cast<size_t>(out.best)]) {
          out.best = static_cast<int>(out.cost.size()) - 1;
          moved = true;
        }
      }
      if (!moved) break;
    }
  }
  p.set(states[static_cast<size_t>(out.best)]);
  return out;
}

double phase_profile_variance(const PhaseProfile& profile, double var) {
  const double inf = std::numeric_limits<double>::infinity();
  const size_t n = profile.psi_deg.size();
  if (n < 3 || !(var > 0.0)) return inf;
  const double x0 = profile.psi_deg[static_cast<size_t>(profile.best)];
  const double c0 = profile.cost[static_cast<size_t>(profile.best)];
  // The nearest point on each side of the best.
  int lo = -1, hi = -1;
  for (size_t k = 0; k < n; ++k) {
    const double d = profile.psi_deg[k] - x0;
    if (d < 0.0 && (lo < 0 || d > profile.psi_deg[static_cast<size_t>(lo)] - x0)) {
      lo = static_cast<int>(k);
    }
    if (d > 0.0 && (hi < 0 || d < profile.psi_deg[static_cast<size_t>(hi)] - x0)) {
      hi = static_cast<int>(k);
    }
  }
  if (lo < 0 || hi < 0) return inf;
  // Parabola through (x0 + dl, cl), (x0, c0), (x0 + dh, ch): its second coefficient.
  const double dl = profile.psi_deg[static_cast<size_t>(lo)] - x0;
  const double dh = profile.psi_deg[static_cast<size_t>(hi)] - x0;
  const double sl = (profile.cost[static_cast<size_t>(lo)] - c0) / dl;
  const double sh = (profile.cost[static_cast<size_t>(hi)] - c0) / dh;
  const double a = (sh - sl) / (dh - dl);
  return a > 0.0 ? var / a : inf;
}

}  // namespace cuspmap

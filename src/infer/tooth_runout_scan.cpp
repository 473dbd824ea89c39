// Runout scan: grid over the runout vector, each pass's tooth label chosen per point, best points
// kept. Inputs: ToothProblem (runout-free optimum), Z, fz mm; output: RunoutStart list.
// Cost: (magnitudes x phases) x (active passes x Z) one-pass sweeps.
// Method: Kline & DeVor 1983 runout model; exhaustive grid, coordinate-wise labels.
#include "infer/tooth_runout_scan.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;
// Phase step of the grid, deg: the solver's reach in phase from a start (measured: from 10 deg
// off the round trips converged to the same stop; derived: at 5 um the marks move
// e dpsi = 0.9 um per 10 deg, under a quarter of the smoothing's half-width).
constexpr double kPhaseStepDeg = 12.0;
// Magnitudes of the grid as fractions of fz: a tooth whose mark is moved by more than about
// fz / 2 leaves its neighbour's mark cut away (derived bound: e sqrt 3 < fz for Z = 3), and a
// factor of 2 between points is within the solver's reach (measured).
constexpr double kMagnitudeFz[] = {0.06, 0.12};

}  // namespace

void search_labels(ToothProblem& p, int teeth, double fz_mm) {
  for (size_t k = 0; k < p.state().shift_mm.size(); ++k) {
    if (!p.is_active(static_cast<int>(k))) continue;
    double best = p.residual().squaredNorm(), best_shift = p.state().shift_mm[k];
    for (int t = 1; t < teeth; ++t) {
      const double s = std::fmod(p.state().shift_mm[k] + t * fz_mm, teeth * fz_mm);
      const double c = p.cost_with_shift(static_cast<int>(k), s);
      if (c < best) best = c, best_shift = s;
    }
    if (best_shift != p.state().shift_mm[k]) {
      ToothState s = p.state();
      s.shift_mm[k] = best_shift;
      p.set(s);
    }
  }
}

std::vector<RunoutStart> scan_runout(ToothProblem& p, int teeth, double fz_mm, int keep) {
  const ToothState base = p.state();
  const double period = 360.0 / std::max(teeth, 1);
  // Z <= 2: only e cos psi shows (the labels give its sign), one phase.
  const int phases = teeth >= 3 ? static_cast<int>(std::ceil(period / kPhaseStepDeg)) : 1;
  const double step = period / phases;
  struct Point {
    double phase_deg;
    RunoutStart start;
  };
  std::vector<Point> points;
  for (const double frac : kMagnitudeFz) {
    const double e_um = frac * fz_mm * 1e3;
    for (int i = 0; i < phases; ++i) {
      const double psi = i * step;
      ToothState s = base;
      s.g[kRunoutCos] = e_um * std::cos(psi * kDegToRad);
      s.g[kRunoutSin] = teeth >= 3 ? e_um * std::sin(psi * kDegToRad) : 0.0;
      p.set(s);
      search_labels(p, teeth, fz_mm);
      points.push_back({psi, {p.residual().squaredNorm(), p.state()}});
    }
  }
  std::sort(points.begin(), points.end(),
            [](const Point& a, const Point& b) { return a.start.cost < b.start.cost; });
  std::vector<Point> kept;
  for (const Point& q : points) {
    if (static_cast<int>(kept.size()) >= keep) break;
    const bool near = std::any_of(kept.begin(), kept.end(), [&](const Point& k) {
      const double d = std::abs(std::remainder(q.phase_deg - k.phase_deg, period));
      return d <= 1.5 * step;
    });
    if (!near) kept.push_back(q);
  }
  p.set(base);
  std::vector<RunoutStart> out;
  for (const Point& k : kept) out.push_back(k.start);
  return out;
}

}  // namespace cuspmap

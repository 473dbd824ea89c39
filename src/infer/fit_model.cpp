// Forward model of the fit: trial tilt on the known cutter, straight passes across the window,
// the project's sweep over the window's sample grid.
// Inputs: FitModel, parameter vector; output: Heightfield um. Cost: one sweep of the window.
// Method: DESIGN.md "Geometry" (first-order tilt), raster contract (passes stepover apart).
#include "infer/fit_model.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;
// Strip cells from a pass's reach inside which its profile is interpolated in sqrt(reach - |w|)
// (see FitProfile::pass_at; the profile's curvature there falls as distance^-1.5, and 4 cells
// in its chord error in w is under 0.001 um on the round trips; derived).
constexpr double kReachCells = 4.0;

}  // namespace

Cutter fitted_cutter(const FitModel& model, const Eigen::VectorXd& p) {
  Cutter c = model.cutter;
  const double along = p[kTiltAlongDeg], across = p[kTiltAcrossDeg];
  c.tilt_deg = std::min(std::hypot(along, across), kMaxTiltDeg);
  // The tilt direction in the feed frame, turned into the machine frame by the lay angle.
  c.tilt_toward_deg = model.lay_deg + std::atan2(across, along) / kDegToRad;
  return c;
}

Toolpath fit_passes(const FitModel& model, const Eigen::VectorXd& p) {
  const Patch& w = model.window;
  const double stepover = p[kStepoverMm];
  const double radius = model.cutter.radius_mm();
  const Eigen::Vector2d centre(w.origin_x_mm + 0.5 * w.size_x_mm,
                               w.origin_y_mm + 0.5 * w.size_y_mm);
  const Eigen::Vector2d u(std::cos(model.lay_deg * kDegToRad), std::sin(model.lay_deg * kDegToRad));
  const Eigen::Vector2d n(-u.y(), u.x());
  // Every pass whose cutter can reach the window: centres within half the diagonal plus R.
  const double reach = 0.5 * std::hypot(w.size_x_mm, w.size_y_mm) + radius;
  const long k_lo = static_cast<long>(std::floor((-reach - p[kOffsetMm]) / stepover));
  const long k_hi = static_cast<long>(std::ceil((reach - p[kOffsetMm]) / stepover));
  Toolpath path;
  for (long k = k_lo; k <= k_hi; ++k) {
    const Eigen::Vector2d c = centre + n * (p[kOffsetMm] + static_cast<double>(k) * stepover);
    Eigen::Vector2d a = c - u * reach, b = c + u * reach;
    if (model.direction == RasterDirection::Zigzag && (k % 2 != 0)) std::swap(a, b);
    Move m;
    m.start_mm = Eigen::Vector3d(a.x(), a.y(), w.floor_z_mm);
    m.end_mm = Eigen::Vector3d(b.x(), b.y(), w.floor_z_mm);
    m.feed_mm_per_min = model.cut.feed_mm_per_min;
    path.moves.push_back(m);
  }
  return path;
}

double FitProfile::pass_at(double w_mm) const {
  if (std::abs(w_mm) > reach_mm || strip.ny < 2) return std::numeric_limits<double>::quiet_NaN();
  const double t = (w_mm - v0_mm) / strip.cell_mm;
  int j = std::clamp(static_cast<int>(std::floor(t)), 0, strip.ny - 2);
  // Within the reach but past the last cell the sweep reached: the line through the last two
  // reached cells on that side (the step where the pass ends stays at the reach).
  if (!std::isfinite(strip.z_um(j + 1, 0)) && j >= 1) --j;
  else if (!std::isfinite(strip.z_um(j, 0)) && j + 2 < strip.ny) ++j;
  double f = t - j;
  // Near the reach a pass's profile goes as sqrt(reach - |w|) (the cutter's widest circle is
  // met with a vertical tangent: a tilted flat's rim leaves -tan(along) sqrt(R^2 - w^2) -
  // tan(across) w, derived), which a chord in w misses by up to tan(along) sqrt(2 R cell) / 4
  // in the last cells (0.03 um on a 9.4 mm flat at 0.01 deg along, 12.5 um cells: random round
  // trips, tools/diagnose_campaign.py seed 2029 rs14). There the chord is taken in
  // sqrt(reach - |w|), in which the profile is smooth (error ~ tan(across) cell / 4, derived).
  const double d = reach_mm - std::abs(w_mm);
  if (d < kReachCells * strip.cell_mm) {
    const double wj = v0_mm + j * strip.cell_mm;
    const double sj = std::sqrt(std::max(0.0, reach_mm - std::abs(wj)));
    const double sk = std::sqrt(std::max(0.0, reach_mm - std::abs(wj + strip.cell_mm)));
    if (sk != sj) f = (std::sqrt(d) - sj) / (sk - sj);
  }
  return (1.0 - f) * strip.z_um(j, 0) + f * strip.z_um(j + 1, 0);
}

double FitProfile::at(double v_mm, double* other) const {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double u = v_mm - offset_mm;
  if (other != nullptr) *other = nan;
  // A pass whose reach ends within band_mm of v, on either side: v's phase (u modulo the
  // stepover) within band_mm of a +reach end's phase (reach modulo the stepover) or of a
  // -reach end's (the rounding of the nearest end's index is left for the rare case; perf:
  // two llround calls a sample were 4 % of a fit's CPU).
  const double q = std::floor(u / stepover_mm);
  const double phase = u - q * stepover_mm;
  const auto wrapped = [&](double d) {
    return std::abs(d - stepover_mm * std::floor(d * per_stepover + 0.5));
  };
  const bool near_edge =
      wrapped(phase - reach_phase_mm) < band_mm || wrapped(phase + reach_phase_mm) < band_mm;
  // Candidate passes: the lowest at the nodes either side of v's phase (and, near a pass's
  // end, the second lowest and the ending pass too).
  long cand[6];
  int n = 0;
  if (lowest.size() >= 2) {
    const int i = std::clamp(static_cast<int>(phase / node_mm), 0,
                             static_cast<int>(lowest.size()) - 2);
    const long shift = static_cast<long>(q);
    const std::array<long, 2>& l0 = lowest[static_cast<size_t>(i)];
    const std::array<long, 2>& l1 = lowest[static_cast<size_t>(i) + 1];
    if (!near_edge) {
      // The same pass lowest at both nodes is lowest between them (passes cross at most once
      // within a strip cell; derived); two passes, at their crossing, are both weighed.
      const double za = pass_at(u - static_cast<double>(l0[0] + shift) * stepover_mm);
      if (l1[0] == l0[0]) return za;
      const double zb = pass_at(u - static_cast<double>(l1[0] + shift) * stepover_mm);
      return std::isfinite(zb) && !(zb >= za) ? zb : za;
    }
    for (const long k : {l0[0], l0[1], l1[0], l1[1]}) cand[n++] = k + shift;
  }
  cand[n++] = std::lround((u - reach_mm) / stepover_mm);  // the pass whose +reach end is near v
  cand[n++] = std::lround((u + reach_mm) / stepover_mm);  // the pass whose -reach end is near v
  double z = nan;
  long edge = 0;
  bool at_edge = false;
  for (int c = 0; c < n; ++c) {
    const double w = u - static_cast<double>(cand[c]) * stepover_mm;
    if (std::abs(std::abs(w) - reach_mm) < band_mm) edge = cand[c], at_edge = true;
    const double h = pass_at(w);
    if (std::isfinite(h) && !(h >= z)) z = h;
  }
  if (other == nullptr || !at_edge) return z;
  // The floor on either side of that pass's end: with the pass (its height at the reach) and
  // without it.
  double without = nan;
  for (int c = 0; c < n; ++c) {
    if (cand[c] == edge) continue;
    const double h = pass_at(u - static_cast<double>(cand[c]) * stepover_mm);
    if (std::isfinite(h) && !(h >= without)) without = h;
  }
  const double w = u - static_cast<double>(edge) * stepover_mm;
  // Its height at the reach; more than a strip cell inside it (the band of a stylus tip), its
  // own height there.
  const double end = pass_at(std::abs(w) < reach_mm - strip.cell_mm
                                 ? w
                                 : std::clamp(w, -reach_mm, reach_mm));
  const double with = std::isfinite(without) ? std::min(without, end) : end;
  if (!std::isfinite(with) || !std::isfinite(without) || with == without) return z;
  *other = std::abs(w) <= reach_mm ? without : with;
  return std::abs(w) <= reach_mm ? with : without;
}

double across_lay_mm(const FitModel& model, double x_mm, double y_mm) {
  const Patch& w = model.window;
  const double cx = w.origin_x_mm + 0.5 * w.size_x_mm, cy = w.origin_y_mm + 0.5 * w.size_y_mm;
  return -(x_mm - cx) * std::sin(model.lay_deg * kDegToRad) +
         (y_mm - cy) * std::cos(model.lay_deg * kDegToRad);
}

FitProfile simulate_fit_profile(const FitModel& model, const Eigen::VectorXd& p) {
  // One pass along +X through y = 0 (lay 0, the tilt turned with it: fitted_cutter adds the
  // lay), long enough to enter and leave the strip fully; the strip one cell wide along Y.
  FitModel strip = model;
  strip.lay_deg = 0.0;
  strip.threads = 1;  // a strip of a few thousand cells: threads cost more than they save
  const double h = model.window.cell_mm / kProfileCellsPerSample;
  const double reach = model.cutter.radius_mm();
  const int cells = 2 * static_cast<int>(std::ceil(reach / h)) + 3;  // odd: a cell on w = 0
  strip.window.cell_mm = h;
  strip.window.size_x_mm = 0.5 * h;
  strip.window.origin_x_mm = -0.5 * h;
  strip.window.size_y_mm = (cells - 0.5) * h;
  strip.window.origin_y_mm = -0.5 * cells * h;
  Toolpath path;
  Move m;
  const double run = reach + 2.0 * h;
  m.start_mm = Eigen::Vector3d(-run, 0.0, model.window.floor_z_mm);
  m.end_mm = Eigen::Vector3d(run, 0.0, model.window.floor_z_mm);
  m.feed_mm_per_min = model.cut.feed_mm_per_min;
  path.moves.push_back(m);
  SimSpec sim;
  sim.tooth_marks = false;
  sim.threads = 1;
  FitProfile f;
  f.strip = simulate_floor(fitted_cutter(strip, p), path, model.cut, strip.window, sim);
  // Cell j's centre lies at y = origin + (j + 0.5) h.
  f.v0_mm = f.strip.y_mm(0);
  f.reach_mm = reach;
  f.band_mm = std::max(h, model.stylus_tip_mm);
  f.offset_mm = p[kOffsetMm];
  f.stepover_mm = p[kStepoverMm];
  f.reach_phase_mm = reach - std::floor(reach / f.stepover_mm) * f.stepover_mm;
  f.per_stepover = 1.0 / f.stepover_mm;
  // The two lowest passes at each node over one period (phase phi from the offset).
  const int nodes = std::max(2, static_cast<int>(std::ceil(f.stepover_mm / h))) + 1;
  f.lowest.resize(static_cast<size_t>(nodes));
  f.node_mm = f.stepover_mm / static_cast<double>(nodes - 1);
  for (int i = 0; i < nodes; ++i) {
    const double phi = f.stepover_mm * i / (nodes - 1);
    const long k_lo = static_cast<long>(std::floor((phi - reach) / f.stepover_mm));
    const long k_hi = static_cast<long>(std::ceil((phi + reach) / f.stepover_mm));
    double z1 = std::numeric_limits<double>::infinity(), z2 = z1;
    std::array<long, 2> best{0, 0};
    for (long k = k_lo; k <= k_hi; ++k) {
      const double z = f.pass_at(phi - static_cast<double>(k) * f.stepover_mm);
      if (!std::isfinite(z)) continue;
      if (z < z1) {
        z2 = z1, best[1] = best[0];
        z1 = z, best[0] = k;
      } else if (z < z2) {
        z2 = z, best[1] = k;
      }
    }
    if (!std::isfinite(z2)) best[1] = best[0];
    f.lowest[static_cast<size_t>(i)] = best;
  }
  return f;
}

Heightfield simulate_fit_window(const FitModel& model, const Eigen::VectorXd& p) {
  SimSpec sim;
  sim.tooth_marks = model.tooth_marks;
  sim.threads = model.threads;
  return simulate_floor(fitted_cutter(model, p), fit_passes(model, p), model.cut, model.window,
                        sim);
}

}  // namespace cuspmap

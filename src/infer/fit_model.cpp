// Forward model of the fit: trial tilt on the known cutter, straight passes across the window,
// the project's sweep over the window's sample grid.
// Inputs: FitModel, parameter vector; output: Heightfield um. Cost: one sweep of the window.
// Method: DESIGN.md "Geometry" (first-order tilt), raster contract (passes stepover apart).
#include "infer/fit_model.h"

#include <algorithm>
#include <cmath>
#include <numbers>

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;

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

Heightfield simulate_fit_window(const FitModel& model, const Eigen::VectorXd& p) {
  SimSpec sim;
  sim.tooth_marks = model.tooth_marks;
  sim.threads = model.threads;
  return simulate_floor(fitted_cutter(model, p), fit_passes(model, p), model.cut, model.window,
                        sim);
}

}  // namespace cuspmap

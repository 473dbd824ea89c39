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

double FitProfile::at(double v_mm) const {
  const double t = (v_mm - v0_mm) / strip.cell_mm;
  const int j = std::clamp(static_cast<int>(std::floor(t)), 0, strip.ny - 2);
  const double f = t - j;
  return (1.0 - f) * strip.z_um(j, 0) + f * strip.z_um(j + 1, 0);
}

double across_lay_mm(const FitModel& model, double x_mm, double y_mm) {
  const Patch& w = model.window;
  const double cx = w.origin_x_mm + 0.5 * w.size_x_mm, cy = w.origin_y_mm + 0.5 * w.size_y_mm;
  return -(x_mm - cx) * std::sin(model.lay_deg * kDegToRad) +
         (y_mm - cy) * std::cos(model.lay_deg * kDegToRad);
}

FitProfile simulate_fit_profile(const FitModel& model, const Eigen::VectorXd& p, double v_max_mm) {
  // Passes along +X (lay 0, the tilt turned with them: fitted_cutter adds the lay), one cell
  // wide, across the passes along Y, centred on 0 so that the offset means what it does in the
  // window.
  FitModel strip = model;
  strip.lay_deg = 0.0;
  strip.threads = 1;  // a strip of a few thousand cells: threads cost more than they save
  const double h = model.window.cell_mm / kProfileCellsPerSample;
  const int cells = static_cast<int>(std::ceil(2.0 * v_max_mm / h)) + 2;
  strip.window.cell_mm = h;
  strip.window.size_x_mm = 0.5 * h;
  strip.window.origin_x_mm = -0.5 * h;
  strip.window.size_y_mm = (cells - 0.5) * h;
  strip.window.origin_y_mm = -0.5 * strip.window.size_y_mm;
  FitProfile f;
  f.strip = simulate_fit_window(strip, p);
  // Cell j's centre lies at y = origin + (j + 0.5) h; the passes are placed about the strip
  // window's centre, origin + size / 2 = 0.
  f.v0_mm = f.strip.y_mm(0);
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

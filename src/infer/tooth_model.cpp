// Tooth-resolved forward model: passes of the envelope fit, one sweep per pass so that each
// pass's start shift (spindle phase) can change alone; floors combined by the cell-wise minimum.
// Inputs: ToothModel, ToothParams, shift mm; output: Heightfield um. Cost: one pass's sweep.
// Method: DESIGN.md "Tooth-resolved"; first-order tilt as infer/fit_model.
#include "infer/tooth_model.h"

#include <cmath>
#include <numbers>

#include "sweep/simulate_floor.h"

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;
// Spindle speed of the model, rev/min: any value works (only feed / rpm = Z fz matters).
constexpr double kModelRpm = 10000.0;

struct Frame {
  Eigen::Vector2d centre, u, n;
  double reach_mm = 0.0;  // half the window diagonal plus R: passes and lengths reach past it
};

Frame frame_of(const ToothModel& m) {
  const Patch& w = m.window;
  Frame f;
  f.centre = Eigen::Vector2d(w.origin_x_mm + 0.5 * w.size_x_mm, w.origin_y_mm + 0.5 * w.size_y_mm);
  f.u = Eigen::Vector2d(std::cos(m.lay_deg * kDegToRad), std::sin(m.lay_deg * kDegToRad));
  f.n = Eigen::Vector2d(-f.u.y(), f.u.x());
  f.reach_mm = 0.5 * std::hypot(w.size_x_mm, w.size_y_mm) + m.cutter.radius_mm();
  return f;
}

}  // namespace

void place_passes(ToothModel& model, RasterDirection direction, int zigzag_parity) {
  const Frame f = frame_of(model);
  const double s = model.stepover_mm;
  const long k_lo = static_cast<long>(std::floor((-f.reach_mm - model.offset_mm) / s));
  const long k_hi = static_cast<long>(std::ceil((f.reach_mm - model.offset_mm) / s));
  model.pass_index.clear();
  model.pass_sense.clear();
  for (long k = k_lo; k <= k_hi; ++k) {
    model.pass_index.push_back(static_cast<int>(k));
    const bool odd = ((k % 2) + 2) % 2 != zigzag_parity;
    model.pass_sense.push_back(direction == RasterDirection::Zigzag && odd ? -1 : 1);
  }
}

Cutter tooth_cutter(const ToothModel& model, const ToothParams& g) {
  Cutter c = model.cutter;
  const double along = g.tilt_along_deg, across = g.tilt_across_deg;
  c.tilt_deg = std::min(std::hypot(along, across), kMaxTiltDeg);
  c.tilt_toward_deg = model.lay_deg + std::atan2(across, along) / kDegToRad;
  c.runout_mm = std::hypot(g.runout_cos_um, g.runout_sin_um) * 1e-3;
  c.runout_phase_deg = std::atan2(g.runout_sin_um, g.runout_cos_um) / kDegToRad;
  if (c.shape != CutterShape::Ball) c.dish_deg = std::max(0.0, g.dish_deg);
  return c;
}

Heightfield simulate_tooth_pass(const ToothModel& model, const Cutter& cutter, int pass,
                                double shift_mm) {
  const Frame f = frame_of(model);
  const double k = model.pass_index[static_cast<size_t>(pass)];
  const double sense = model.pass_sense[static_cast<size_t>(pass)];
  const Eigen::Vector2d c = f.centre + f.n * (model.offset_mm + k * model.stepover_mm);
  const Eigen::Vector2d dir = sense * f.u;
  const Eigen::Vector2d a = c - dir * (f.reach_mm + shift_mm), b = c + dir * f.reach_mm;
  Move m;
  m.start_mm = Eigen::Vector3d(a.x(), a.y(), model.window.floor_z_mm);
  m.end_mm = Eigen::Vector3d(b.x(), b.y(), model.window.floor_z_mm);
  CutSpec cut;
  cut.rpm = kModelRpm;
  cut.feed_mm_per_min = model.revolution_mm() * kModelRpm;
  cut.spindle = model.spindle;
  m.feed_mm_per_min = cut.feed_mm_per_min;
  Toolpath path;
  path.moves.push_back(m);
  SimSpec sim;
  sim.tooth_marks = true;
  sim.threads = model.threads;
  return simulate_floor(cutter, path, cut, model.window, sim);
}

void min_into(const Heightfield& pass_floor, Heightfield& floor) {
  const auto& p = pass_floor.z_um;
  auto& z = floor.z_um;
  for (Eigen::Index i = 0; i < z.size(); ++i) {
    const float v = p.data()[i];
    float& out = z.data()[i];
    // Quiet tests only: an ordered comparison with a NaN cell raises invalid-operation.
    if (std::isfinite(v) && (std::isnan(out) || v < out)) out = v;
  }
}

}  // namespace cuspmap

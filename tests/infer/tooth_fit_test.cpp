// Round trips of the tooth-resolved stage (infer/tooth_fit): tooth-resolved floors of known
// runout, dish and tilt, simulated by the job pipeline, damaged like a measurement, read back
// through the envelope fit and the tooth stage.
#include "infer/tooth_fit.h"

#include <algorithm>
#include <catch2/catch.hpp>
#include <cmath>
#include <numbers>

#include "infer/diagnose_floors.h"
#include "infer/floor_fit.h"
#include "infer/surface_estimates.h"
#include "infer/tooth_model.h"
#include "infer/tooth_verdict.h"
#include "infer/tooth_window.h"
#include "path/build_toolpath.h"
#include "path/move.h"

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;

// The issue-17 floor: 6 mm flat, 1 deg dish, fz 0.05 mm, 0.8 mm one-way raster, 5 um runout,
// 0.05 deg tilt, on a 4 x 4 mm patch of 5 um cells, with 0.01 um noise and a setup plane.
struct Case {
  int teeth = 3;
  double runout_um = 5.0, phase_deg = 40.0, toward_deg = 60.0, dish_deg = 1.0, tilt_deg = 0.05;
};

Job case_job(const Case& c) {
  Job job = test::raster_job(CutterShape::Flat, 6.0, 0.8, 4.0, 0.005, 0.05, c.teeth);
  job.cutter.dish_deg = c.dish_deg;
  job.cutter.runout_mm = c.runout_um * 1e-3;
  job.cutter.runout_phase_deg = c.phase_deg;
  job.cutter.tilt_deg = c.tilt_deg;
  job.cutter.tilt_toward_deg = c.toward_deg;
  return job;
}

ToothFitOptions case_options(const Job& job) {
  ToothFitOptions o;
  o.cutter = job.cutter;
  o.cutter.dish_deg = 0.0;  // what the stage fits is not given to it
  o.cutter.runout_mm = 0.0;
  o.cutter.tilt_deg = 0.0;
  o.feed_per_tooth_mm = job.cut.feed_mm_per_min / (job.cut.rpm * job.cutter.teeth);
  o.threads = 2;
  return o;
}

// The floor through the surface estimates and the envelope fit into the tooth stage.
ToothFit fit_through_envelope(const Heightfield& hf, const Case& c, const Job& job) {
  SurfaceOptions so;
  so.teeth = c.teeth;
  const SurfaceEstimates e = surface_estimates(hf, so);
  FloorFitOptions fo;
  fo.cutter = case_options(job).cutter;
  fo.threads = 2;
  return fit_teeth(hf, tooth_fit_start(fit_floor(hf, e, fo)), case_options(job));
}

}  // namespace

TEST_CASE("simulate_tooth_pass: the job's floor to the bit with the true per-pass shifts",
          "[infer][tooth]") {
  // The clock of sweep/prepare_moves: every move with a length and a feed adds length / feed;
  // a pass starting at time t has tooth 0 at rpm/60 t turns, so the model's pass (tooth 0 at 0
  // when it starts `shift` behind its usual start) matches it at shift = (model start - job
  // start) + turns x Z fz modulo Z fz (derived).
  const Case c;
  const Job job = case_job(c);
  const Heightfield hf = test::simulate(job);
  const BuiltPath built = build_toolpath(job.path, job.cut, job.patch, job.cutter);
  const double rev = 0.15;
  const ToothWindow w = tooth_window(hf, 0.0, 0.8, rev);
  ToothModel m;
  m.cutter = job.cutter;
  m.stepover_mm = 0.8;
  m.feed_per_tooth_mm = 0.05;
  m.window = w.patch;
  m.threads = 2;
  const double cy = w.patch.origin_y_mm + 0.5 * w.patch.size_y_mm;
  const double cx = w.patch.origin_x_mm + 0.5 * w.patch.size_x_mm;
  m.offset_mm = std::round(cy / 0.8) * 0.8 - cy;
  place_passes(m, RasterDirection::OneWay, 0);
  const double reach = 0.5 * std::hypot(w.patch.size_x_mm, w.patch.size_y_mm) + 3.0;
  double clock_s = 0.0;
  std::vector<double> t0, ys, xs;
  for (const Move& mv : built.path.moves) {
    const double len = move_length_mm(mv);
    if (!(len > 0.0) || !(mv.feed_mm_per_min > 0.0)) continue;
    if (!mv.rapid) {
      t0.push_back(clock_s);
      ys.push_back(mv.start_mm.y());
      xs.push_back(mv.start_mm.x());
    }
    clock_s += len / mv.feed_mm_per_min * 60.0;
  }
  Heightfield floor = w.measured;
  floor.z_um.setConstant(kUnreached);
  for (size_t p = 0; p < m.pass_index.size(); ++p) {
    const double y = cy + m.offset_mm + m.pass_index[p] * 0.8;
    size_t q = 0;
    while (q < ys.size() && std::abs(ys[q] - y) > 1e-6) ++q;
    REQUIRE(q < ys.size());
    double shift = cx - reach - xs[q] + job.cut.rpm / 60.0 * t0[q] * rev;
    shift -= std::floor(shift / rev) * rev;
    min_into(simulate_tooth_pass(m, job.cutter, static_cast<int>(p), shift), floor);
  }
  double worst = 0.0;
  for (Eigen::Index k = 0; k < floor.z_um.size(); ++k) {
    worst = std::max(worst, std::abs(static_cast<double>(floor.z_um.data()[k]) -
                                     w.measured.z_um.data()[k]));
  }
  // Same sweep, same float arithmetic: equal to float rounding (measured: 0).
  REQUIRE(worst < 1e-4);
}

TEST_CASE("fit_teeth: a 3-flute floor gives the dish and the along-feed sign",
          "[infer][tooth]") {
  // Noise-free floor through the envelope fit (docs/diagnose.md "Tooth-resolved stage").
  const Case c;
  const Job job = case_job(c);
  const Heightfield hf = test::simulate(job);
  const ToothFit f = fit_through_envelope(hf, c, job);
  REQUIRE(f.ran);
  CAPTURE(f.runout_um.value, f.runout_um.sigma, f.runout_phase_deg.value, f.dish_deg.value,
          f.dish_deg.sigma, f.tilt_along_deg.value, f.along_sign_cost_sigmas, f.sweeps);
  // Kline & DeVor 1983 runout model (derived): with 3 teeth the phase is known modulo 120 deg.
  REQUIRE_FALSE(f.runout_projection_only);
  REQUIRE(f.runout_phase_period_deg == Approx(120.0));
  // Dish within 20 % (measured 0.998 deg through the CLI, 1.094 +- 0.027 here on its branch and
  // 1.160 once the envelope stage's start search changed: the experimental stage depends on its
  // start and its sigma does not yet cover the error, docs/diagnose.md "Tooth-resolved stage").
  REQUIRE(std::abs(f.dish_deg.value - c.dish_deg) <= 0.2 * c.dish_deg);
  // ... and within 3 sigma (Bates & Watts 1988 §2.3; measured 0.840 +- 0.122).
  REQUIRE(std::abs(f.dish_deg.value - c.dish_deg) <= 3.0 * f.dish_deg.sigma);
  REQUIRE_FALSE(f.marks_misfit);
  REQUIRE(f.runout_not_read);
  // Along-feed sign: tilt toward 60 deg on passes along +X puts the lowest point ahead
  // (along = 0.05 cos 60 = 0.025 deg > 0; derived).
  REQUIRE(f.along_sign_known);
  REQUIRE(f.tilt_along_deg.value > 0.0);
  REQUIRE(std::abs(f.tilt_along_deg.value - c.tilt_deg * std::cos(c.toward_deg * kDegToRad)) <=
          0.2 * c.tilt_deg);
}

TEST_CASE("fit_teeth: a damaged 3-flute floor: dish within its sigma, runout said unread",
          "[infer][tooth]") {
  // The floor with 0.01 um noise, a 0.8 / -0.4 um/mm setup plane and 1 % missing
  // points, through the envelope fit (before the plane was removed ahead of the smoothing the
  // stage returned 0.916 deg here; once 0.05 deg: docs/diagnose.md).
  const Case c;
  const Job job = case_job(c);
  Heightfield hf = test::simulate(job);
  test::damage(hf, 0.01, 0.8, -0.4, 0.01, 7);
  const ToothFit f = fit_through_envelope(hf, c, job);
  REQUIRE(f.ran);
  CAPTURE(f.runout_um.value, f.runout_phase_deg.value, f.dish_deg.value, f.dish_deg.sigma,
          f.tilt_along_deg.value, f.along_sign_cost_sigmas, f.smoothed_residual_ratio, f.sweeps);
  REQUIRE_FALSE(f.marks_misfit);
  // Dish within 3 sigma (Bates & Watts 1988 §2.3: the covariance; the sigma's floor is the
  // measured spread of the solver's stops) and within 10 % (the tolerance).
  REQUIRE(f.dish_deg.resolved);
  REQUIRE(std::abs(f.dish_deg.value - c.dish_deg) <= 3.0 * f.dish_deg.sigma);
  REQUIRE(std::abs(f.dish_deg.value - c.dish_deg) <= 0.1 * c.dish_deg);
  // Runout and phase are not read reliably yet: unresolved, and the verdict says so instead of
  // a number (Kline & DeVor 1983 model; the round trips' spread, docs/diagnose.md).
  REQUIRE(f.runout_not_read);
  REQUIRE_FALSE(f.runout_um.resolved);
  REQUIRE_FALSE(f.runout_phase_deg.resolved);
  const ToothVerdict v = tooth_verdict(f);
  REQUIRE(std::any_of(v.cannot_tell.begin(), v.cannot_tell.end(), [](const std::string& s) {
    return s.starts_with("runout and its phase: the tooth-resolved fit does not yet");
  }));
  // Along-feed sign when known: + (0.05 cos 60 deg = 0.025 deg ahead; derived).
  if (f.along_sign_known) REQUIRE(f.tilt_along_deg.value > 0.0);
}

TEST_CASE("fit_teeth: an undished, untilted flat shows no runout", "[infer][tooth]") {
  Case c;
  c.dish_deg = 0.0;
  c.tilt_deg = 0.0;
  const Job job = case_job(c);
  Heightfield hf = test::simulate(job);
  test::damage(hf, 0.01, 0.0, 0.0, 0.0, 5);
  ToothFitStart s;
  s.stepover_mm = 0.8;
  const ToothFit f = fit_teeth(hf, s, case_options(job));
  REQUIRE(f.ran);
  CAPTURE(f.runout_um.value, f.runout_um.sigma, f.dish_deg.value, f.dish_deg.sigma);
  // The flat bottom cuts the floor level whatever the runout (derived: no dish, no tilt).
  REQUIRE_FALSE(f.runout_um.resolved);
  const ToothVerdict v = tooth_verdict(f);
  REQUIRE(v.lines.empty());
  REQUIRE(v.cannot_tell.size() == 1);
  REQUIRE(v.cannot_tell[0].find("no tooth marks") != std::string::npos);
}

TEST_CASE("fit_teeth: skipped with its reason", "[infer][tooth]") {
  Heightfield hf;
  hf.nx = hf.ny = 8;
  hf.cell_mm = 0.005;
  hf.z_um.setZero(8, 8);
  ToothFitOptions o;
  o.cutter.shape = CutterShape::Ball;
  o.feed_per_tooth_mm = 0.05;
  ToothFit f = fit_teeth(hf, ToothFitStart{}, o);
  REQUIRE_FALSE(f.ran);
  REQUIRE(f.skipped.find("ball end mill") != std::string::npos);
  o.cutter.shape = CutterShape::Flat;
  o.feed_per_tooth_mm = 0.0;
  f = fit_teeth(hf, ToothFitStart{}, o);
  REQUIRE(f.skipped.find("feed per tooth are not known") != std::string::npos);
  o.feed_per_tooth_mm = 0.01;  // two cells per tooth
  f = fit_teeth(hf, ToothFitStart{}, o);
  REQUIRE(f.skipped.find("too coarse") != std::string::npos);
  REQUIRE(tooth_verdict(f).cannot_tell.size() == 1);
}

}  // namespace cuspmap

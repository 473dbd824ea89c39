// Round trips for the inverse simulation: floors simulated with known tilt (magnitude and
// direction), stepover and pass pattern, damaged like a measurement (noise, a setup plane,
// missing points), read back by surface_estimates + fit_floor.
#include "infer/floor_fit.h"

#include <catch2/catch.hpp>
#include <chrono>
#include <cmath>
#include <numbers>

#include "infer/diagnose_floors.h"
#include "infer/fit_uncertainty.h"
#include "infer/fit_verdict.h"
#include "test_support.h"

namespace cuspmap {
namespace {

double angle_error_deg(double got, double want) {
  const double d = std::fmod(std::abs(got - want), 360.0);
  return std::min(d, 360.0 - d);
}

// A tilted flat end mill on a raster (revolving envelope), measured-like.
Heightfield tilted_flat_floor(RasterDirection dir, double tilt_deg, double toward_deg,
                              double stepover_mm, double noise_um = 0.02) {
  Job job = test::raster_job(CutterShape::Flat, 3.0, stepover_mm, 8.0, 0.02, 0.05, 2);
  job.sim.tooth_marks = false;
  job.cutter.dish_deg = 1.0;
  job.cutter.tilt_deg = tilt_deg;
  job.cutter.tilt_toward_deg = toward_deg;
  job.path.direction = dir;
  // The interior 6 x 6 mm: a pass missing beyond the patch edge changes the floor up to
  // R - s = 0.3 mm inside it (derived); a measured field lies inside its part likewise.
  Heightfield hf = test::crop(test::simulate(job), 50);
  test::damage(hf, noise_um, 1.5, -0.7, 0.02, 31u);
  return hf;
}

}  // namespace

TEST_CASE("fit_floor: tilted flat, one-way and zigzag, recovers tilt, direction, stepover",
          "[infer]") {
  for (RasterDirection dir : {RasterDirection::OneWay, RasterDirection::Zigzag}) {
    CAPTURE(dir == RasterDirection::Zigzag);
    const double tilt = 0.05, toward = 30.0, stepover = 1.2;
    const Heightfield hf = tilted_flat_floor(dir, tilt, toward, stepover);
    SurfaceOptions so;
    so.lay_deg = 0.0;
    const SurfaceEstimates e = surface_estimates(hf, so);
    CAPTURE(e.stepover.period_mm, e.stepover.sigma_mm);
    FloorFitOptions o;
    o.cutter.shape = CutterShape::Flat;
    o.cutter.diameter_mm = 3.0;
    o.cutter.dish_deg = 1.0;
    o.direction = dir;
    o.threads = 2;
    const auto t0 = std::chrono::steady_clock::now();
    const FloorFit fit = fit_floor(hf, e, o);
    const double secs =
        std::chrono::duration<double>(std::chrono::steady_clock::now() - t0).count();
    const FittedErrors f = fitted_errors(fit);
    CAPTURE(secs, fit.evaluations, fit.residual_rms_um, f.tilt_deg.value, f.tilt_deg.sigma,
            f.tilt_toward_deg.value, f.tilt_toward_deg.sigma, f.tilt_toward_alt_deg,
            f.stepover_mm.value, f.stepover_mm.sigma, f.tilt_along_deg.value,
            f.tilt_across_deg.value);
    // Issue 17's tolerances: tilt within 10 % or 0.002 deg, and within its reported uncertainty
    // (3 sigma); direction within 10 deg (of one of the two candidates the envelope allows:
    // lowest point ahead or behind, derived); stepover within 1 %.
    REQUIRE(std::abs(f.tilt_deg.value - tilt) <= std::max(0.1 * tilt, 0.002));
    REQUIRE(std::abs(f.tilt_deg.value - tilt) <= 3.0 * f.tilt_deg.sigma + 1e-4);
    const double dir_err = std::min(angle_error_deg(f.tilt_toward_deg.value, toward),
                                    angle_error_deg(f.tilt_toward_alt_deg, toward));
    REQUIRE(dir_err <= 10.0);
    REQUIRE(std::abs(f.stepover_mm.value - stepover) <= 0.01 * stepover);
    REQUIRE(std::abs(f.stepover_mm.value - stepover) <= 3.0 * f.stepover_mm.sigma + 1e-5);
    // The added setup plane (1.5 and -0.7 um/mm; the tilted floor itself has no mean slope
    // beyond its saw-tooth, which the model carries).
    REQUIRE_NEAR(f.setup_gx_um_per_mm.value, 1.5, 0.05);
    REQUIRE_NEAR(f.setup_gy_um_per_mm.value, -0.7, 0.05);
    // The residual is the added noise (0.02 um rms) and little else.
    REQUIRE(fit.residual_rms_um < 0.03);
  }
}

TEST_CASE("fit_floor: heel lifted, tilt along the feed bounded, not measured", "[infer]") {
  // 6 mm flat end mill, 1 deg dish, tilted 0.05 deg toward +X, one-way passes toward +X,
  // tooth-resolved (the floor of surface_estimates_test's heel case): only the leading rim
  // marks the floor. Along the feed the tilt changes the floor by tan(0.05 deg) (3 - sqrt(9 -
  // 0.25)) mm = 0.037 um (derived, DESIGN.md first-order tilt), under the tooth marks the
  // envelope model leaves in the residual: the fit may only bound it.
  Job job = test::raster_job(CutterShape::Flat, 6.0, 1.0, 8.0, 0.02, 0.1, 2);
  job.cutter.dish_deg = 1.0;
  job.cutter.tilt_deg = 0.05;
  job.cutter.tilt_toward_deg = 0.0;
  Heightfield hf = test::crop(test::simulate(job), 75);  // interior 5 x 5 mm
  test::damage(hf, 0.005, 0.8, 0.3, 0.01, 11u);
  SurfaceOptions so;
  so.lay_deg = 0.0;
  const SurfaceEstimates e = surface_estimates(hf, so);
  CAPTURE(e.stepover.period_mm, e.passes.next_pass, e.passes.second_pass, e.passes.mirror,
          e.lay_pass_share);
  REQUIRE(e.heel == "lifted");
  FloorFitOptions o;
  o.cutter = job.cutter;
  o.threads = 2;
  const FloorFit fit = fit_floor(hf, e, o);
  const FittedErrors f = fitted_errors(fit);
  const FitVerdict v = fit_verdict(f, fit, e);
  CAPTURE(f.tilt_along_deg.value, f.tilt_along_deg.sigma, f.tilt_along_deg.bound,
          f.tilt_across_deg.value, f.tilt_across_deg.sigma, v.heel_min_tilt_deg,
          fit.residual_rms_um);
  REQUIRE(v.heel_lifted);
  // Passes 1 mm apart are over the beat crossing sqrt(3 x 0.1) = 0.548 mm (infer/arc_beat,
  // derived): the stepover is read.
  REQUIRE_FALSE(v.arc_beat);
  // The true 0.05 deg lies between the heel's lower bound and the fit's upper bound (or, when
  // the fit resolves it, within its uncertainty and issue 17's 10 % / 0.002 deg).
  REQUIRE(v.heel_min_tilt_deg <= 0.05);
  if (f.tilt_along_deg.resolved) {
    REQUIRE(std::abs(f.tilt_along_deg.value - 0.05) <= std::max(0.005, 3 * f.tilt_along_deg.sigma));
  } else {
    REQUIRE(f.tilt_along_deg.bound >= 0.05);
  }
  // No tilt across the feed (derived: tilt toward +X is along the passes).
  REQUIRE(std::abs(f.tilt_across_deg.value) <= std::max(0.002, 3 * f.tilt_across_deg.sigma));
  bool says_lifted = false;
  for (const std::string& line : v.lines) says_lifted |= line.find("heel is lifted") != std::string::npos;
  REQUIRE(says_lifted);
  // Stepover within 1 % (issue 17).
  REQUIRE(std::abs(f.stepover_mm.value - 1.0) <= 0.01);
}

TEST_CASE("fit_floor: ball floor fits stepover and plane, refuses tilt", "[infer]") {
  // 6 mm ball, stepover 0.3 mm, zigzag, tooth-resolved, noise, plane and missing points.
  Job job = test::raster_job(CutterShape::Ball, 6.0, 0.3, 3.0, 0.01, 0.08, 2);
  job.path.direction = RasterDirection::Zigzag;
  Heightfield hf = test::crop(test::simulate(job), 30);  // interior 2.4 x 2.4 mm
  test::damage(hf, 0.02, 2.0, -1.0, 0.01, 17u);
  const SurfaceEstimates e = surface_estimates(hf, {});
  FloorFitOptions o;
  o.cutter = job.cutter;
  o.direction = RasterDirection::Zigzag;
  o.threads = 2;
  const FloorFit fit = fit_floor(hf, e, o);
  const FittedErrors f = fitted_errors(fit);
  const FitVerdict v = fit_verdict(f, fit, e);
  CAPTURE(f.stepover_mm.value, f.stepover_mm.sigma, fit.residual_rms_um, fit.measured_rms_um);
  REQUIRE(!f.tilt_deg.fitted);
  // Issue 17: within 1 %. Not checked against sigma here: the residual is the feed marks the
  // envelope model lacks, correlated along every pass, so sigma from independent residuals is
  // a lower bound (docs/diagnose.md); the noise-only floors above check the sigma.
  REQUIRE(std::abs(f.stepover_mm.value - 0.3) <= 0.003);
  REQUIRE_NEAR(f.setup_gx_um_per_mm.value, 2.0, 0.05);
  REQUIRE_NEAR(f.setup_gy_um_per_mm.value, -1.0, 0.05);
  // The ball's cusps (3.75 um, Machinery's Handbook) are matched: what is left is the feed
  // marks and the noise, well under the measured rms.
  REQUIRE(fit.residual_rms_um < 0.5 * fit.measured_rms_um);
  REQUIRE(!v.cannot_tell.empty());
  CHECK(v.cannot_tell.front().find("ball") != std::string::npos);
}

}  // namespace cuspmap

namespace cuspmap {

TEST_CASE("fit_floor: faint cusp, the uncertainty covers the error", "[infer]") {
  // issue_17: 3 mm flat, 0.5 mm stepover, tilt 0.03 deg: a step of 0.5 tan(0.03 deg) = 0.26 um
  // across passes at most (derived), a 0.04 um cusp under 0.01 um noise.
  for (double toward : {90.0, 30.0}) {
    CAPTURE(toward);
    const double tilt = 0.03, stepover = 0.5;
    const Heightfield hf = tilted_flat_floor(RasterDirection::OneWay, tilt, toward, stepover, 0.01);
    SurfaceOptions so;
    so.lay_deg = 0.0;
    const SurfaceEstimates e = surface_estimates(hf, so);
    FloorFitOptions o;
    o.cutter.shape = CutterShape::Flat;
    o.cutter.diameter_mm = 3.0;
    o.cutter.dish_deg = 1.0;
    o.threads = 2;
    const FloorFit fit = fit_floor(hf, e, o);
    const FittedErrors f = fitted_errors(fit);
    CAPTURE(fit.residual_rms_um, fit.measured_rms_um, f.tilt_deg.value, f.tilt_deg.sigma,
            f.tilt_toward_deg.value, f.tilt_toward_deg.sigma, f.tilt_toward_alt_deg,
            f.stepover_mm.value, f.stepover_mm.sigma, f.tilt_along_deg.value,
            f.tilt_across_deg.value, fit.evaluations);
    // Within 3 reported sigma (issue 17), and the profile's interval holds the truth.
    REQUIRE(std::abs(f.tilt_deg.value - tilt) <= 3.0 * f.tilt_deg.sigma);
    REQUIRE(fit.tilt_interval_deg.first <= tilt + 1e-4);
    REQUIRE(fit.tilt_interval_deg.second >= tilt - 1e-4);
    const double dir_err = std::min(angle_error_deg(f.tilt_toward_deg.value, toward),
                                    angle_error_deg(f.tilt_toward_alt_deg, toward));
    REQUIRE(dir_err <= std::max(10.0, 3.0 * f.tilt_toward_deg.sigma));
    if (toward == 90.0) {
      // Tilt across the feed: the face steps 0.5 tan(0.03 deg) = 0.26 um between passes
      // (derived): resolved, issue 17's 10 % or 0.002 deg and 10 deg hold.
      REQUIRE(std::abs(f.tilt_deg.value - tilt) <= std::max(0.1 * tilt, 0.002));
      REQUIRE(dir_err <= 10.0);
    } else {
      // At 30 deg the passes overlap past the rim's lowest point (a sin 30 = 0.75 mm < a - s/2,
      // derived), so the floor is shallow cusps whose depth fixes only tan(tilt) / cos^2(dir)
      // (the rim's curvature there, derived): that combination is recovered within 10 %, the
      // split between magnitude and direction is only bounded (reported sigma, checked above).
      const double dir_fit = (f.tilt_toward_deg.value - 0.0) * std::numbers::pi / 180.0;
      const double combo_fit = f.tilt_deg.value / std::pow(std::cos(dir_fit), 2);
      const double combo_true = tilt / std::pow(std::cos(toward * std::numbers::pi / 180.0), 2);
      REQUIRE(std::abs(combo_fit - combo_true) <= 0.1 * combo_true);
      // The direction is reported as uncertain (the linearised 0.08 deg was not).
      REQUIRE(f.tilt_toward_deg.sigma >= 5.0);
      // issue_17: the verdict says in words that only the interval and the combination are
      // known, and the combination it names is the fitted one (derived, as above).
      // Unresolved here (a weak fit): the verdict gives the bound, which holds the truth.
      const FitVerdict v = fit_verdict(f, fit, e);
      if (!f.tilt_deg.resolved) REQUIRE(f.tilt_deg.bound >= tilt);
    }
  }
}

}  // namespace cuspmap

namespace cuspmap {

TEST_CASE("fit_verdict: issue_17: a tilt known only as an interval is said so", "[infer]") {
  // Hand-made fit on the ridge: 0.05 deg (+-0.005) resolved, but the direction profile lets
  // 0.035-0.07 deg fit as well (wider than kIntervalOnlyWidth x 0.05 = 0.01 deg).
  FloorFit fit;
  fit.model.cutter.shape = CutterShape::Flat;
  fit.model.cutter.diameter_mm = 6.0;
  fit.params = Eigen::VectorXd::Zero(kFitParams);
  fit.params << 0.03, 0.04, 0.5, 0.0;
  fit.covariance = Eigen::MatrixXd::Identity(kFitParams, kFitParams) * 1e-10;
  fit.covariance(0, 0) = fit.covariance(1, 1) = 2.5e-5;  // sigma 0.005 deg on each component
  fit.free = {true, true, true, true};
  fit.tilt_interval_deg = {0.035, 0.07};
  fit.measured_rms_um = 1.0;
  fit.residual_rms_um = 0.1;
  const FittedErrors f = fitted_errors(fit);
  REQUIRE(f.tilt_deg.resolved);
  const FitVerdict v = fit_verdict(f, fit, SurfaceEstimates{});
  REQUIRE(v.tilt_interval_only);
  bool says = false;
  for (const std::string& line : v.lines) {
    says |= line.find("known only as an interval: 0.035 to 0.07 deg") != std::string::npos &&
            line.find("fixes only tan(tilt) / cos^2(direction from the passes)") !=
                std::string::npos;
  }
  REQUIRE(says);
  // Derived: direction atan2(0.04, 0.03) from the lay, cos^2 = 0.36; tan(0.05 deg) / 0.36.
  REQUIRE_NEAR(std::tan(v.ridge_tilt_deg * std::numbers::pi / 180.0),
               std::tan(0.05 * std::numbers::pi / 180.0) / 0.36, 1e-12);
  // A tilt known to a narrow interval reads as a plain value (no interval sentence).
  fit.tilt_interval_deg = {0.049, 0.051};
  REQUIRE_FALSE(fit_verdict(fitted_errors(fit), fit, SurfaceEstimates{}).tilt_interval_only);
}

}  // namespace cuspmap

namespace cuspmap {

TEST_CASE("fit_floor: issue_17: lay 0 and 179.99 give the same fit (along-feed mirror)",
          "[infer]") {
  // 6 mm flat, 1 deg dish, stepover 1.5 mm, 0.08 deg toward 250 deg, zigzag, 0.02 um noise
  // (case 3 of tests/cli/diagnose_roundtrip_oracle.py). With the lay given as 0 the truth has
  // its lowest point behind the feed, and the fit reports the mirrored point ahead; with 179.99
  // it is ahead already. The revolving envelope of a tilted flat on a straight pass is the rim's
  // height at x = +-sqrt(a^2 - w^2) (derived, along-feed mirror symmetry of the revolving
  // envelope), the same for either sign of the along-feed tilt: both fits must reach the same
  // tilt, stepover, residual and uncertainty. Formerly (forward differences only) the lay-0
  // fit of this floor stalled beside a step of the floor (the rim's lateral extreme): stepover
  // 1.49987 +- 3.8e-6 mm, residual 0.02017 um against 1.50002 +- 8.4e-5 mm, 0.01995 um.
  Job job = test::raster_job(CutterShape::Flat, 6.0, 1.5, 14.0, 0.02, 0.05, 2);
  job.sim.tooth_marks = false;
  job.cutter.dish_deg = 1.0;
  job.cutter.tilt_deg = 0.08;
  job.cutter.tilt_toward_deg = 250.0;
  job.path.direction = RasterDirection::Zigzag;
  Heightfield hf = test::crop(test::simulate(job), 150);  // interior 8 x 8 mm
  test::damage(hf, 0.02, 0.8, -0.4, 0.02, 5u);
  FloorFitOptions o;
  o.cutter.shape = CutterShape::Flat;
  o.cutter.diameter_mm = 6.0;
  o.cutter.dish_deg = 1.0;
  o.direction = RasterDirection::Zigzag;
  o.threads = 2;
  FloorFit fits[2];
  FittedErrors errs[2];
  const double lays[2] = {0.0, 179.99};
  for (int k = 0; k < 2; ++k) {
    SurfaceOptions so;
    so.lay_deg = lays[k];
    fits[k] = fit_floor(hf, surface_estimates(hf, so), o);
    errs[k] = fitted_errors(fits[k]);
  }
  CAPTURE(errs[0].tilt_deg.value, errs[1].tilt_deg.value, errs[0].tilt_toward_deg.value,
          errs[1].tilt_toward_deg.value, errs[0].stepover_mm.value, errs[1].stepover_mm.value,
          errs[0].stepover_mm.sigma, errs[1].stepover_mm.sigma, fits[0].residual_rms_um,
          fits[1].residual_rms_um);
  // Same optimum to a few of the fit's own sigma (1e-4 deg, 8e-5 mm; the two lays differ by
  // 0.01 deg and by where the strip's cells fall, not in the floor).
  REQUIRE(std::abs(errs[0].tilt_deg.value - errs[1].tilt_deg.value) <= 3e-4);
  REQUIRE(std::abs(errs[0].stepover_mm.value - errs[1].stepover_mm.value) <= 3e-5);
  REQUIRE(std::abs(fits[0].residual_rms_um - fits[1].residual_rms_um) <=
          0.002 * fits[1].residual_rms_um);
  // The same direction, or its along-feed mirror (derived, as above), within 1 deg.
  REQUIRE(std::min(angle_error_deg(errs[0].tilt_toward_deg.value, errs[1].tilt_toward_deg.value),
                   angle_error_deg(errs[0].tilt_toward_alt_deg, errs[1].tilt_toward_deg.value)) <=
          1.0);
  // The uncertainty is the same too (the stalled fit's was 20x too small).
  REQUIRE(errs[0].stepover_mm.sigma >= 0.5 * errs[1].stepover_mm.sigma);
  REQUIRE(errs[0].stepover_mm.sigma <= 2.0 * errs[1].stepover_mm.sigma);
  // And the truth within issue 17's tolerances: tilt 10 %, stepover 1 %.
  REQUIRE(std::abs(errs[0].tilt_deg.value - 0.08) <= 0.008);
  REQUIRE(std::abs(errs[0].stepover_mm.value - 1.5) <= 0.015);
}

}  // namespace cuspmap

// Tests of fit_shop_calibration / apply_shop_calibration: recovery of a known floor and scale
// from noisy synthetic measurements, the standard errors' meaning, and the one-parameter
// fallback when the data cannot support two.
#include <random>

#include "finish/shop_calibration.h"
#include "test_support.h"

namespace cuspmap {

TEST_CASE("fit_shop_calibration: exact line through noise-free points", "[finish]") {
  // Derived: points on measured = 0.15 + 1.3 p are fitted exactly, residuals 0.
  std::vector<CalibrationPoint> pts;
  for (double p : {0.1, 0.3, 0.6, 1.2}) pts.push_back({p, 0.15 + 1.3 * p});
  const ShopCalibration c = fit_shop_calibration(pts);
  REQUIRE(c.model == CalibrationModel::FloorAndScale);
  REQUIRE_NEAR(c.floor_um, 0.15, 1e-12);
  REQUIRE_NEAR(c.scale, 1.3, 1e-12);
  REQUIRE_NEAR(c.rms_after_um, 0.0, 1e-12);
  REQUIRE(c.floor_sd_um < 1e-9);
  REQUIRE(c.rows == 4);
  // rms before: residuals 0.15 + 0.3 p for p above.
  double ss = 0.0;
  for (double p : {0.1, 0.3, 0.6, 1.2}) ss += (0.15 + 0.3 * p) * (0.15 + 0.3 * p);
  REQUIRE_NEAR(c.rms_before_um, std::sqrt(ss / 4.0), 1e-12);
}

TEST_CASE("fit_shop_calibration: recovers a known floor and scale from noisy data", "[finish]") {
  // Synthetic shop: measured = 0.2 um + 1.4 x kinematic, instrument noise sd 0.02 um.
  // OLS is unbiased with sd(b) = sigma / sqrt(Sxx) (Draper & Smith 1998, sec. 1.4): over many
  // seeds about 95 % of fits lie within 2 standard errors of the truth; we require 3 per seed
  // and check the coverage over 200 seeds.
  int covered = 0;
  const int kSeeds = 200;
  for (int seed = 0; seed < kSeeds; ++seed) {
    std::mt19937 rng(static_cast<unsigned>(seed));
    std::normal_distribution<double> noise(0.0, 0.02);
    std::vector<CalibrationPoint> pts;
    for (int k = 0; k < 12; ++k) {
      const double p = 0.1 + 0.1 * k;
      pts.push_back({p, 0.2 + 1.4 * p + noise(rng)});
    }
    const ShopCalibration c = fit_shop_calibration(pts);
    CAPTURE(seed);
    REQUIRE(c.model == CalibrationModel::FloorAndScale);
    REQUIRE(std::abs(c.floor_um - 0.2) <= 4.0 * c.floor_sd_um);
    REQUIRE(std::abs(c.scale - 1.4) <= 4.0 * c.scale_sd);
    REQUIRE(c.rms_after_um < c.rms_before_um);
    if (std::abs(c.scale - 1.4) <= 2.0 * c.scale_sd) ++covered;
  }
  // Student t with 10 dof: P(|t| <= 2) = 0.927 (t tables); allow sampling spread over 200 seeds.
  REQUIRE(covered >= static_cast<int>(0.86 * kSeeds));
}

TEST_CASE("fit_shop_calibration: floor only when the data cannot separate floor and scale",
          "[finish]") {
  SECTION("two rows") {
    const ShopCalibration c = fit_shop_calibration({{0.2, 0.5}, {0.8, 1.0}});
    REQUIRE(c.model == CalibrationModel::FloorOnly);
    REQUIRE(c.why == "2 rows fit one parameter only; give 3 or more to fit a scale too");
    // Derived: floor = mean(m - p) = (0.3 + 0.2) / 2, sd = s / sqrt(n), s^2 = sum r^2 / (n - 1).
    REQUIRE_NEAR(c.floor_um, 0.25, 1e-12);
    REQUIRE_NEAR(c.floor_sd_um, std::sqrt(0.005 / 1.0 / 2.0), 1e-12);
    REQUIRE(c.scale == 1.0);
  }
  SECTION("predictions bunched together") {
    const ShopCalibration c = fit_shop_calibration({{0.50, 0.8}, {0.52, 0.85}, {0.55, 0.83}});
    REQUIRE(c.model == CalibrationModel::FloorOnly);
    REQUIRE(c.why ==
            "the predictions span too little (9 %, need 25 %) to tell a floor from a scale");
  }
  SECTION("measured falls as predicted rises") {
    const ShopCalibration c = fit_shop_calibration({{0.2, 0.9}, {0.5, 0.7}, {0.9, 0.6}});
    REQUIRE(c.model == CalibrationModel::FloorOnly);
    REQUIRE(c.why.find("scale was not positive") != std::string::npos);
  }
}

TEST_CASE("apply_shop_calibration: value and propagated uncertainty", "[finish]") {
  ShopCalibration c;
  c.model = CalibrationModel::FloorAndScale;
  c.floor_um = 0.1;
  c.floor_sd_um = 0.03;
  c.scale = 2.0;
  c.scale_sd = 0.1;
  c.cov_floor_scale_um = -0.002;
  const CalibratedValue v = apply_shop_calibration(c, 0.5);
  REQUIRE_NEAR(v.value_um, 1.1, 1e-12);
  // Derived (first-order propagation, GUM JCGM 100:2008 eq. 13): var = sa^2 + p^2 sb^2 + 2 p cov.
  REQUIRE_NEAR(v.sd_um, std::sqrt(0.0009 + 0.25 * 0.01 - 0.002), 1e-12);
}

}  // namespace cuspmap

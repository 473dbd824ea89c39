// Feed-mark detection of the tooth window (infer/tooth_marks): marks that repeat each
// revolution are seen with their rms, noise alone is not.
#include "infer/tooth_marks.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <numbers>
#include <random>

namespace cuspmap {
namespace {

// 300 x 200 cells of 5 um: a cosine of `amp_um` with period `rev_mm` along the lay (0 or 30 deg;
// over whole periods its least-squares plane is level, so the window's plane removal leaves it
// whole, derived), Gaussian noise of `noise_um`, a setup plane, a missing cell.
ToothWindow marked_window(double amp_um, double noise_um, double lay_deg, double rev_mm) {
  Heightfield hf;
  hf.nx = 300;
  hf.ny = 200;
  hf.cell_mm = 0.005;
  hf.z_um.resize(hf.ny, hf.nx);
  std::mt19937 rng(11);
  std::normal_distribution<double> noise(0.0, noise_um);
  const double a = lay_deg * std::numbers::pi / 180.0;
  for (int j = 0; j < hf.ny; ++j) {
    for (int i = 0; i < hf.nx; ++i) {
      const double along = hf.x_mm(i) * std::cos(a) + hf.y_mm(j) * std::sin(a);
      const double marks = amp_um * std::cos(2.0 * std::numbers::pi * along / rev_mm);
      hf.z_um(j, i) =
          static_cast<float>(marks + 0.5 * hf.x_mm(i) - 0.3 * hf.y_mm(j) + noise(rng));
    }
  }
  hf.z_um(100, 150) = kUnreached;
  return tooth_window(hf, lay_deg, 0.4, rev_mm, 3.0, 60000);
}

}  // namespace

TEST_CASE("tooth_marks: marks repeating each revolution are seen, noise alone is not",
          "[infer]") {
  // A cosine of amplitude A has rms A / sqrt 2 (derived); the noise's rms is its sigma. Period
  // 0.15 mm = 30 cells (a whole number: every phase bin holds one phase).
  const ToothMarks m = tooth_marks(marked_window(0.2, 0.01, 0.0, 0.15), 0.0, 0.15);
  CAPTURE(m.variance_ratio, m.critical_ratio, m.marks_rms_um, m.noise_rms_um);
  REQUIRE(m.seen);
  REQUIRE(m.marks_rms_um == Approx(0.2 / std::sqrt(2.0)).epsilon(0.02));
  REQUIRE(m.noise_rms_um == Approx(0.01).epsilon(0.05));
  // Noise alone: F near 1, under the 3-sigma critical ratio (Fisher's F test).
  const ToothMarks n = tooth_marks(marked_window(0.0, 0.01, 0.0, 0.15), 0.0, 0.15);
  CAPTURE(n.variance_ratio, n.critical_ratio, n.detection_rms_um);
  REQUIRE_FALSE(n.seen);
  REQUIRE(n.variance_ratio == Approx(1.0).margin(n.critical_ratio - 1.0));
  REQUIRE(n.marks_rms_um <= n.detection_rms_um);
  // Marks at a slant lay (30 deg; bins then hold phases up to a cell apart) and 0.13 mm (26
  // cells) are seen; marks at a quarter of the noise over the whole window too (F grows with
  // the samples).
  REQUIRE(tooth_marks(marked_window(0.2, 0.01, 30.0, 0.13), 30.0, 0.13).seen);
  REQUIRE(tooth_marks(marked_window(0.005, 0.01, 0.0, 0.15), 0.0, 0.15).seen);
  // A noise-free level floor shows none (float rounding only).
  REQUIRE_FALSE(tooth_marks(marked_window(0.0, 0.0, 0.0, 0.15), 0.0, 0.15).seen);
}

}  // namespace cuspmap

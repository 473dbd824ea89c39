// The stepover from the bands' low quantile (the feed marks' bottoms, the swept envelope) where
// the band means carry how neighbouring passes' marks overlap: band_quantiles on a closed-form
// floor, surface_estimates on passes with a spindle phase of their own and on a simulated
// bull-nose floor with runout.
#include <catch2/catch.hpp>
#include <cmath>
#include <numbers>
#include <random>
#include <string>
#include <vector>

#include "core/input_error.h"
#include "infer/band_means.h"
#include "infer/diagnose_floors.h"
#include "infer/repeat_period.h"
#include "infer/surface_estimates.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// Passes along X every `s` mm, each a parabola of radius `r_mm` across (the envelope) plus
// feed marks a_um (1 - cos(2 pi (x - phase) / f)) / 2 >= 0 along it, with a phase of its own
// (drawn uniformly from a fixed seed): the floor is the lowest pass at every cell.
Heightfield phased_passes(double s, double r_mm, double f, double a_um, int n, double cell,
                          std::uint32_t seed) {
  Heightfield hf;
  hf.nx = hf.ny = n;
  hf.cell_mm = cell;
  hf.z_um.setZero(n, n);
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> u(0.0, 1.0);
  const int passes = static_cast<int>(n * cell / s) + 3;
  std::vector<double> phase(static_cast<size_t>(passes) + 2);
  for (double& p : phase) p = u(rng) * f;
  for (int j = 0; j < n; ++j) {
    const double y = j * cell;
    for (int i = 0; i < n; ++i) {
      const double x = i * cell;
      double z = 1e9;
      for (int k = -1; k <= passes; ++k) {
        const double dy = y - k * s;
        if (std::abs(dy) > 2.0 * s) continue;
        const double envelope = 1e3 * dy * dy / (2.0 * r_mm);
        const double mark =
            a_um * 0.5 * (1.0 - std::cos(2.0 * std::numbers::pi * (x - phase[k + 1]) / f));
        z = std::min(z, envelope + mark);
      }
      hf.z_um(j, i) = static_cast<float>(z);
    }
  }
  return hf;
}

}  // namespace

TEST_CASE("band_quantiles: a band's lowest height is its envelope under marks that touch it",
          "[infer]") {
  // z = E(y) + a (1 - cos(2 pi x / f)) / 2 with f a whole number of cells: every row reaches
  // E(y) at x = k f, so the 0 quantile of each band along X is E(y) (derived), and the 1
  // quantile E(y) + a (the marks' crests at x = (k + 1/2) f, also on the grid).
  Heightfield hf;
  hf.nx = hf.ny = 80;
  hf.cell_mm = 0.01;
  hf.z_um.setZero(80, 80);
  const auto envelope = [](int j) { return 0.3 * std::sin(0.37 * j); };
  for (int j = 0; j < 80; ++j) {
    for (int i = 0; i < 80; ++i) {
      hf.z_um(j, i) =
          static_cast<float>(envelope(j) + 2.0 * 0.5 * (1.0 - std::cos(2.0 * std::numbers::pi * i / 10.0)));
    }
  }
  hf.z_um(5, 0) = kUnreached;  // a missing cell is skipped (row 5 still holds x = k f)
  const BandMeans low = band_quantiles(hf, 0.0, 0.0);
  const BandMeans high = band_quantiles(hf, 0.0, 1.0);
  REQUIRE(low.z_um.size() == 80u);
  REQUIRE(high.z_um.size() == 80u);
  REQUIRE(low.spacing_mm == hf.cell_mm);
  REQUIRE(band_quantiles(Heightfield{}, 0.0, 0.01).z_um.empty());  // no cells, no bands
  for (int j = 0; j < 80; ++j) {
    CAPTURE(j);
    REQUIRE_NEAR(low.z_um[j], envelope(j), 1e-5);         // derived (float heights)
    REQUIRE_NEAR(high.z_um[j], envelope(j) + 2.0, 1e-5);  // derived
  }
}

TEST_CASE("surface_estimates: passes whose marks change phase from pass to pass read the "
          "envelope's stepover",
          "[infer]") {
  // A 0.9 mm stepover whose envelope cusp (s^2 / (8 r) = 0.2 um, r 500 mm: a bull-nose's corner
  // at this scale) lies under 3 um feed marks 0.185 mm apart, each pass at its own spindle
  // phase. The band means carry how neighbouring passes' marks overlap (their phase
  // difference, new at every pass): their comb found no repeat and main refused the floor ("no
  // across-lay period", measured; seed 2031 tc3 of the tooth campaign likewise).
  const double s = 0.9;
  const Heightfield hf = phased_passes(s, 500.0, 0.185, 3.0, 500, 0.01, 1u);
  SurfaceOptions o;
  o.lay_deg = 0.0;
  const SurfaceEstimates e = surface_estimates(hf, o);
  CAPTURE(e.stepover.period_mm, e.stepover.sigma_mm, e.notes);
  // Derived: the lowest height of each band is the envelope, s-periodic whatever the phases.
  REQUIRE(std::abs(e.stepover.period_mm - s) <= 0.01 * s);
  REQUIRE(std::abs(e.stepover.period_mm - s) <= 3.0 * e.stepover.sigma_mm);
  bool noted = false;
  for (const std::string& n : e.notes) noted = noted || n.find("marks' bottoms") != n.npos;
  REQUIRE(noted);
  // The failure itself: the band means' comb does not find the stepover (derived above).
  const BandMeans bands = band_means(hf, 0.0);
  const ProfileTrace profile = smoothed_band_profile(bands);
  const int n = static_cast<int>(profile.z_um.size());
  const RepeatPeriod means = comb_period(mean_autocorrelation({profile}, 3 * n / 4),
                                         bands.spacing_mm, kBandSmoothCells, n / 4.0);
  CAPTURE(means.found, means.period_mm);
  REQUIRE((!means.found || std::abs(means.period_mm - s) > 0.01 * s));
}

TEST_CASE("surface_estimates: a bull-nose floor under runout reads its stepover from the "
          "marks' bottoms",
          "[infer]") {
  // Seed 2031 tc6 of tools/tooth_campaign.py on a 0.01 mm grid (8.8 mm bull-nose r 1.04 mm, 3
  // teeth, 1.05 deg dish, 5.45 um runout at 101.3 deg, tilt 0.0388 deg toward 207.7 deg, fz
  // 0.0618 mm, s 0.907 mm at 2.4 deg, one-way; 1 mm rim cropped): the band means repeated at
  // 0.878 mm (-3.2 %, measured on main, as on the campaign's 0.0075 mm floor).
  const Job job = test::tooth_cut_job({.diameter_mm = 8.8, .stepover_mm = 0.907, .size_mm = 6.1,
                                        .cell_mm = 0.01, .fz_mm = 0.0618, .teeth = 3,
                                        .dish_deg = 1.05, .runout_mm = 0.00545,
                                        .runout_phase_deg = 101.3, .tilt_deg = 0.0388,
                                        .tilt_toward_deg = 207.7, .angle_deg = 2.4,
                                        .corner_radius_mm = 1.04});
  Heightfield hf = test::crop(test::simulate(job), 100);
  test::damage(hf, 0.005, 1.68, -0.2, 0.016, 2031u);
  const SurfaceEstimates e = surface_estimates(hf, {});
  CAPTURE(e.lay_deg, e.stepover.period_mm, e.stepover.sigma_mm, e.notes);
  // Derived: the raster's passes run at path.angle_deg, path.stepover apart.
  REQUIRE(std::abs(e.lay_deg - 2.4) < 0.5);
  REQUIRE(std::abs(e.stepover.period_mm - 0.907) <= 0.01 * 0.907);
  REQUIRE(std::abs(e.stepover.period_mm - 0.907) <= 3.0 * e.stepover.sigma_mm);
}

}  // namespace cuspmap

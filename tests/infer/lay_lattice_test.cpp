// The passes' lay among the rows of a tooth-mark lattice: repeats along and across a direction
// on a closed-form lattice of marks, and a simulated dished flat floor whose largest band-mean
// share lies along a row of its marks.
#include "infer/lay_lattice.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <numbers>

#include "infer/diagnose_floors.h"
#include "infer/surface_estimates.h"

namespace cuspmap {
namespace {

double lay_error_deg(double got, double want) {
  const double d = std::fmod(std::abs(got - want), 180.0);
  return std::min(d, 180.0 - d);
}

// Marks as round bumps (Gaussian, sigma 2 cells, 1 um) on the lattice (i f + k d, k s): feed f
// along +X, passes s apart, each pass's marks shifted by d. The field starts at the origin.
Heightfield mark_lattice(double f, double s, double d, double size_mm, double cell_mm) {
  Heightfield hf;
  hf.nx = hf.ny = static_cast<int>(std::lround(size_mm / cell_mm));
  hf.cell_mm = cell_mm;
  hf.z_um.setZero(hf.ny, hf.nx);
  const double sigma = 2.0 * cell_mm;
  for (int j = 0; j < hf.ny; ++j) {
    const double y = hf.y_mm(j);
    const int k0 = static_cast<int>(std::floor(y / s));
    for (int i = 0; i < hf.nx; ++i) {
      const double x = hf.x_mm(i);
      double z = 0.0;
      for (int k = k0; k <= k0 + 1; ++k) {
        const double dy = y - k * s;
        const double u = x - k * d;
        const double dx = u - f * std::round(u / f);  // nearest mark of pass k
        z += std::exp(-(dx * dx + dy * dy) / (2.0 * sigma * sigma));
      }
      hf.z_um(j, i) = static_cast<float>(z);
    }
  }
  return hf;
}

}  // namespace

TEST_CASE("lay_repeats: along the passes the feed, along another lattice row the pass vector",
          "[infer]") {
  // Derived (a 2-D lattice with basis (f, 0) and (d, s)): along the passes (0 deg) the traces
  // repeat every f and the rows of marks lie s apart; along the row v = (d, s) the traces
  // repeat every |v| and the rows lie f s / |v| apart (the cell's area over |v|).
  const double f = 0.2, s = 0.8, d = 0.3, cell = 0.01;
  const Heightfield hf = mark_lattice(f, s, d, 5.0, cell);
  const LayRepeats passes = lay_repeats(hf, 0.0);
  CAPTURE(passes.across_mm, passes.along_mm);
  REQUIRE(passes.across_mm == Approx(s).margin(cell));
  REQUIRE(passes.along_mm == Approx(f).margin(cell));
  REQUIRE(passes.passes_like());

  const double v = std::hypot(d, s);
  const double row_deg = std::atan2(s, d) * 180.0 / std::numbers::pi;
  const LayRepeats row = lay_repeats(hf, row_deg);
  CAPTURE(row_deg, row.across_mm, row.along_mm);
  REQUIRE(row.across_mm == Approx(f * s / v).margin(cell));
  REQUIRE(row.along_mm == Approx(v).margin(2.0 * cell));
  REQUIRE_FALSE(row.passes_like());
}

TEST_CASE("passes_among_rows: a lay that looks like passes is kept", "[infer]") {
  // The same lattice: its passes (0 deg) repeat along shorter than across (derived above), so
  // no other share peak is sought whichever peak is largest.
  const Heightfield hf = mark_lattice(0.2, 0.8, 0.3, 5.0, 0.01);
  REQUIRE_FALSE(passes_among_rows(hf, PassLay{0.0, 0.5}, lay_peaks(hf, kRowPeaks)).has_value());
}

TEST_CASE("issue_17: a dished flat floor whose marks' row out-shares its passes reads the passes' "
          "lay", "[infer]") {
  // Seed 2030 tc4 of tools/tooth_campaign.py (8.3 mm flat, 3 teeth, 0.87 deg dish, 7.46 um
  // runout, tilted 0.0573 deg toward 24.3 deg, fz 0.0511, s 1.264 at 0.3 deg, one-way): the band
  // means along a row of its runout marks (108.8 deg) carried 4.7 % of the variance, the passes'
  // 2.7 %; the lay was read 108.8 deg and the stepover 0.145 mm (measured, docs/diagnose.md).
  const Job job = test::tooth_cut_job({.diameter_mm = 8.3, .stepover_mm = 1.264, .size_mm = 7.7,
                                        .cell_mm = 0.01, .fz_mm = 0.0511, .teeth = 3,
                                        .dish_deg = 0.87, .runout_mm = 0.00746,
                                        .runout_phase_deg = 144.1, .tilt_deg = 0.0573,
                                        .tilt_toward_deg = 24.3, .angle_deg = 0.3});
  Heightfield hf = test::crop(test::simulate(job), 100);  // 1 mm margin, as the campaign
  test::damage(hf, 0.01, 0.5, -0.3, 0.01, 2030u);
  const SurfaceEstimates e = surface_estimates(hf, {});
  CAPTURE(e.lay_deg, e.lay_pass_share, e.stepover.period_mm, e.stepover.sigma_mm, e.notes);
  // Derived: the raster's passes run at path.angle_deg.
  REQUIRE(lay_error_deg(e.lay_deg, 0.3) < 0.5);
  // The note names the row it set aside (its lay is no pass direction: > 2 deg away).
  bool noted = false;
  for (const std::string& n : e.notes) noted = noted || n.find("row of the feed marks") != n.npos;
  REQUIRE(noted);
  // Issue 17: the stepover within its reported uncertainty (3 standard errors; the surface
  // reading, 1.2 % long here, which the fit refines).
  REQUIRE(std::abs(e.stepover.period_mm - 1.264) <= 3.0 * e.stepover.sigma_mm);
}

}  // namespace cuspmap

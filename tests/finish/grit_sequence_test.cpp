// Tests of the layered scratch model of a grit sequence: thickness per grade, the skipping rule,
// linear scaling of volumes and times with area, and the built-in FEPA P-grade table.
#include "finish/grit_sequence.h"

#include "test_support.h"

namespace cuspmap {
namespace {

// Hand-built table (test data, invented values; the model is what is tested):
//   grade  particle  scratch  Ra    rate
//   A      100 um    8 um     1.0   10 mm^3/min
//   B      50 um     4 um     0.5   5 mm^3/min
//   C      25 um     2 um     0.25  2 mm^3/min
GritTable abc_table() {
  GritTable t;
  t.grits = {{"A", 100.0, 8.0, 1.0, 10.0}, {"B", 50.0, 4.0, 0.5, 5.0}, {"C", 25.0, 2.0, 0.25, 2.0}};
  t.sequence = {"A", "B", "C"};
  t.source = "test table";
  return t;
}

SurfaceHeights marks(double sz_um, double sv_um) {
  SurfaceHeights h;
  h.sz_um = sz_um;
  h.sv_um = sv_um;
  h.sp_um = sz_um - sv_um;
  h.ra_um = 0.2566 * sz_um;  // ideal cusp profile Ra = 4h/(9 sqrt 3) (DESIGN.md)
  return h;
}

}  // namespace

TEST_CASE("grit_sequence: each grade removes the marks or scratches before it", "[finish]") {
  const GritTable t = abc_table();
  const double area = 10000.0;  // 100 cm^2
  const GritSequence seq = grit_sequence(marks(30.0, 10.0), t, t.sequence, area);
  REQUIRE(seq.skipped.empty());
  REQUIRE(seq.steps.size() == 3);
  // Model (docs/finishing.md): first grade Sv + c1/2, then (c_{i-1} + c_i)/2.
  REQUIRE_NEAR(seq.steps[0].remove_um, 10.0 + 4.0, 1e-12);
  REQUIRE_NEAR(seq.steps[1].remove_um, (8.0 + 4.0) / 2.0, 1e-12);
  REQUIRE_NEAR(seq.steps[2].remove_um, (4.0 + 2.0) / 2.0, 1e-12);
  // Volume = thickness x area (um -> mm); time = volume / rate (min -> s).
  REQUIRE_NEAR(seq.steps[0].volume_mm3, 14.0e-3 * area, 1e-9);
  REQUIRE_NEAR(seq.steps[0].time_s, 14.0e-3 * area / 10.0 * 60.0, 1e-9);
  REQUIRE_NEAR(seq.steps[2].time_s, 3.0e-3 * area / 2.0 * 60.0, 1e-9);
  // Bookkeeping identity: machined mean -> final mean = Sv + (final mean below the valleys).
  REQUIRE_NEAR(seq.deepest_below_valleys_um, 8.0 + 4.0 + 2.0, 1e-12);
  REQUIRE_NEAR(seq.mean_below_valleys_um, 14.0 - 1.0, 1e-12);
  REQUIRE_NEAR(seq.total_remove_um, 10.0 + seq.mean_below_valleys_um, 1e-12);
  REQUIRE_NEAR(seq.total_time_s, seq.steps[0].time_s + seq.steps[1].time_s + seq.steps[2].time_s,
               1e-9);
  REQUIRE(seq.final_ra_um == 0.25);
  REQUIRE(seq.final_scratch_um == 2.0);
}

TEST_CASE("grit_sequence: volumes and times scale linearly with area", "[finish]") {
  const GritTable t = abc_table();
  const GritSequence one = grit_sequence(marks(12.0, 4.0), t, t.sequence, 2500.0);
  for (const double factor : {0.0, 2.0, 7.5}) {
    CAPTURE(factor);
    const GritSequence scaled = grit_sequence(marks(12.0, 4.0), t, t.sequence, 2500.0 * factor);
    REQUIRE(scaled.steps.size() == one.steps.size());
    for (std::size_t k = 0; k < one.steps.size(); ++k) {
      CAPTURE(k);
      REQUIRE_NEAR(scaled.steps[k].volume_mm3, factor * one.steps[k].volume_mm3, 1e-9);
      REQUIRE_NEAR(scaled.steps[k].time_s, factor * one.steps[k].time_s, 1e-9);
      REQUIRE(scaled.steps[k].remove_um == one.steps[k].remove_um);  // thickness: no area in it
    }
    REQUIRE_NEAR(scaled.total_time_s, factor * one.total_time_s, 1e-9);
  }
}

TEST_CASE("grit_sequence: grades whose scratches are deeper than the marks are skipped",
          "[finish]") {
  const GritTable t = abc_table();
  // Sz 5 um: A (8 um scratches) would cut deeper than the marks; B (4 um) starts.
  const GritSequence seq = grit_sequence(marks(5.0, 1.7), t, t.sequence, 100.0);
  REQUIRE(seq.skipped == std::vector<std::string>{"A"});
  REQUIRE(seq.steps.front().grit == "B");
  REQUIRE_NEAR(seq.steps.front().remove_um, 1.7 + 2.0, 1e-12);
  // Sz 2 um (Ra 0.51 um): only the last grade runs, removing Sv plus half its own scratches.
  const GritSequence fine = grit_sequence(marks(2.0, 0.7), t, t.sequence, 100.0);
  REQUIRE(fine.steps.size() == 1);
  REQUIRE(fine.steps.front().grit == "C");
  REQUIRE_NEAR(fine.total_remove_um, 0.7 + 1.0, 1e-12);
  REQUIRE(fine.steps.front().ra_after_um == 0.25);
}

TEST_CASE("grit_sequence: issue_13: no sanding when the last grade would leave it rougher",
          "[finish]") {
  const GritTable t = abc_table();
  // No marks at all (Ra 0): every grade ends at its own Ra, rougher than machined.
  const GritSequence smooth = grit_sequence(marks(0.0, 0.0), t, t.sequence, 100.0);
  REQUIRE_FALSE(smooth.needed);
  REQUIRE(smooth.steps.empty());
  REQUIRE(smooth.total_remove_um == 0.0);
  REQUIRE(smooth.mean_below_valleys_um == 0.0);
  REQUIRE(smooth.final_ra_um == 0.0);
  REQUIRE(smooth.finer_grit.empty());  // nothing in the table beats Ra 0
  // Ra 0.3 um on a sequence that stops at B (Ra 0.5): no sanding, and C (Ra 0.25) is offered.
  SurfaceHeights m = marks(1.2, 0.4);
  m.ra_um = 0.3;
  const GritSequence ab = grit_sequence(m, t, {"A", "B"}, 100.0);
  REQUIRE_FALSE(ab.needed);
  REQUIRE(ab.finer_grit == "C");
  REQUIRE(ab.final_ra_um == 0.3);
  REQUIRE(ab.verdict ==
          "no sanding needed: the machined Ra 0.3 um is already at or below the Ra B leaves "
          "(0.5 um)");
}

TEST_CASE("default_grit_table: FEPA P-grade sizes and the labelled fractions", "[finish]") {
  const GritTable t = default_grit_table();
  // FEPA P-grade mean particle sizes, from memory (agreeing with public secondary charts).
  REQUIRE(find_grit(t, "P180")->particle_um == 82.0);
  REQUIRE(find_grit(t, "P240")->particle_um == 58.5);
  REQUIRE(find_grit(t, "P320")->particle_um == 46.2);
  REQUIRE(find_grit(t, "P400")->particle_um == 35.0);
  REQUIRE(find_grit(t, "P9999") == nullptr);
  // Coarse to fine, and every grade's derived values are the stated fractions.
  for (std::size_t k = 0; k < t.grits.size(); ++k) {
    CAPTURE(t.grits[k].name);
    if (k > 0) REQUIRE(t.grits[k].particle_um < t.grits[k - 1].particle_um);
    REQUIRE_NEAR(t.grits[k].scratch_um, kScratchDepthPerParticle * t.grits[k].particle_um, 1e-12);
    REQUIRE_NEAR(t.grits[k].ra_um, kRaPerParticle * t.grits[k].particle_um, 1e-12);
  }
  REQUIRE(t.sequence == std::vector<std::string>{"P180", "P240", "P320", "P400"});
}

}  // namespace cuspmap

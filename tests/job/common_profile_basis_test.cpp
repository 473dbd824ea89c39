// Compared floors share one profile basis: the longest ISO 4288 cut-off of the rows, the same
// trace direction rule, or a reason why not (issue 13 item 1).
// Sources: DESIGN.md ideal periodic cusp profile Ra = 4h/(9 sqrt 3) (independent of lc once lc
// spans several periods); ISO 4288:1996 Table 3 (RSm 0.1 mm -> lc 0.25 mm, RSm 0.5 mm -> lc
// 2.5 mm, from memory).
#include "job/common_profile_basis.h"

#include <cmath>
#include <random>

#include "test_support.h"

using namespace cuspmap;

namespace {

// Passes along X at y = k * stepover leave parabolic arcs of height h between them (derived).
JobRun cusp_run(double stepover_mm, double h_um) {
  JobRun run;
  Heightfield& hf = run.floor;
  hf.nx = 40;
  hf.ny = 3200;
  hf.cell_mm = 0.005;
  hf.z_um.resize(hf.ny, hf.nx);
  for (int j = 0; j < hf.ny; ++j) {
    const double y = hf.y_mm(j);
    const double u = 2.0 * (y - stepover_mm * std::round(y / stepover_mm)) / stepover_mm;
    for (int i = 0; i < hf.nx; ++i) hf.z_um(j, i) = static_cast<float>(h_um * u * u);
  }
  TextureOptions o;
  o.lay_deg = 0.0;  // the passes' direction, as run_job gives it for a raster
  run.texture = texture_report(hf, o);
  return run;
}

// Gaussian noise: no dominant lay, so "across the lay" falls back to tracing along X.
JobRun noise_run() {
  JobRun run;
  Heightfield& hf = run.floor;
  hf.nx = 600;
  hf.ny = 600;
  hf.cell_mm = 0.01;
  hf.z_um.resize(hf.ny, hf.nx);
  std::mt19937 rng(3);
  std::normal_distribution<float> n(0.0f, 1.0f);
  for (int k = 0; k < hf.nx * hf.ny; ++k) hf.z_um.data()[k] = n(rng);
  run.texture = texture_report(hf, TextureOptions{});
  return run;
}

}  // namespace

TEST_CASE("common_profile_basis: issue_13: rows share the roughest row's ISO 4288 cut-off",
          "[job]") {
  JobRun fine = cusp_run(0.1, 1.0), coarse = cusp_run(0.5, 10.0);
  REQUIRE_NEAR(fine.texture.profile.cutoff_mm, 0.25, 1e-12);   // ISO 4288 Table 3
  REQUIRE_NEAR(coarse.texture.profile.cutoff_mm, 2.5, 1e-12);  // ISO 4288 Table 3
  const ProfileBasis b = common_profile_basis({&fine, &coarse}, TextureOptions{}, {"1", "2"});
  REQUIRE(b.rankable());
  REQUIRE_NEAR(b.cutoff_mm, 2.5, 1e-12);
  REQUIRE_NEAR(fine.texture.profile.cutoff_mm, 2.5, 1e-12);
  REQUIRE_NEAR(coarse.texture.profile.cutoff_mm, 2.5, 1e-12);
  REQUIRE(b.notes.size() == 1);
  REQUIRE(fine.texture.profile.direction_deg == 90.0);  // still across its passes
  // Ideal cusp Ra = 4h/(9 sqrt 3) (DESIGN.md); 0.5 % for the 20-cell period and lambda-s.
  const double ideal = 4.0 * 1.0 / (9.0 * std::sqrt(3.0));
  REQUIRE_NEAR(fine.texture.profile.roughness.a_um, ideal, 5e-3 * ideal);
}

TEST_CASE("common_profile_basis: a fixed cut-off is common as given", "[job]") {
  TextureOptions o;
  o.cutoff_mm = 0.8;
  JobRun a = cusp_run(0.3, 5.0), b = cusp_run(0.3, 5.0);
  const ProfileBasis basis = common_profile_basis({&a, &b}, o, {"1", "2"});
  REQUIRE(basis.rankable());
  REQUIRE(basis.cutoff_mm == 0.8);
  REQUIRE(basis.cutoff_rule == "fixed by --cutoff");
}

TEST_CASE("common_profile_basis: issue_13: a row without a lay breaks the direction rule",
          "[job]") {
  JobRun cusp = cusp_run(0.3, 5.0), noise = noise_run();
  REQUIRE(noise.texture.profile.lay_source == "none");
  REQUIRE(cusp.texture.profile.lay_source == "known");
  const ProfileBasis b = common_profile_basis({&cusp, &noise}, TextureOptions{}, {"row 1", "row 2"});
  REQUIRE_FALSE(b.common_direction);
  REQUIRE_FALSE(b.rankable());
  REQUIRE(b.reasons.size() == 1);
  REQUIRE(b.reasons[0] ==
          "row 2 had no dominant lay and was traced along X, the others across their lay: give "
          "--direction as an angle to trace all alike");
}

TEST_CASE("common_profile_basis: a streamed row keeps its cut-off and is not ranked", "[job]") {
  JobRun fine = cusp_run(0.1, 1.0), coarse = cusp_run(0.5, 10.0);
  fine.streamed = true;
  const ProfileBasis b = common_profile_basis({&fine, &coarse}, TextureOptions{}, {"1", "2"});
  REQUIRE_FALSE(b.common_cutoff);
  REQUIRE_NEAR(fine.texture.profile.cutoff_mm, 0.25, 1e-12);
  REQUIRE(b.reasons.size() == 1);
}

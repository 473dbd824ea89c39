// End-to-end texture report on analytic cusp floors: periodicity, ISO 4288 cut-off choice,
// direction across the lay, Ra of the ideal cusp, warnings for short surfaces, errors.
// Sources: DESIGN.md ideal periodic cusp profile Ra = 4h/(9 sqrt 3), RSm = stepover;
// ISO 4288:1996 Table 3 (RSm 0.5 mm -> lc 2.5 mm; RSm 0.3 mm -> lc 0.8 mm, from memory).
#include "texture/texture_report.h"

#include <algorithm>
#include <cmath>
#include <random>
#include <string>

#include "core/input_error.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

// Passes along X at y = k * stepover leave parabolic arcs of height h between them.
Heightfield cusp_floor(double stepover_mm, double h_um, int nx, int ny, double cell_mm) {
  Heightfield hf;
  hf.nx = nx;
  hf.ny = ny;
  hf.cell_mm = cell_mm;
  hf.z_um.resize(ny, nx);
  for (int j = 0; j < ny; ++j) {
    const double y = hf.y_mm(j);
    const double d = y - stepover_mm * std::round(y / stepover_mm);  // distance to nearest pass
    const double u = 2.0 * d / stepover_mm;
    for (int i = 0; i < nx; ++i) hf.z_um(j, i) = static_cast<float>(h_um * u * u);
  }
  return hf;
}

bool has_warning(const TextureReport& r, const std::string& part) {
  return std::any_of(r.warnings.begin(), r.warnings.end(),
                     [&](const std::string& w) { return w.find(part) != std::string::npos; });
}

}  // namespace

TEST_CASE("texture_report: ideal cusp floor, cut-off by RSm, Ra = 4h/(9 sqrt 3)", "[texture]") {
  const double h = 10.0, s = 0.5;
  const TextureReport r = texture_report(cusp_floor(s, h, 40, 3200, 0.005), TextureOptions{});
  const ProfileReport& p = r.profile;
  REQUIRE(p.periodic);
  REQUIRE(p.cutoff_rule == "RSm (periodic)");
  REQUIRE_NEAR(p.cutoff_mm, 2.5, 1e-12);    // ISO 4288 Table 3: 0.4 < RSm <= 1.3
  REQUIRE_NEAR(p.lambda_s_um, 8.0, 1e-12);  // ISO 3274 pair of 2.5 mm
  REQUIRE(p.sampling_lengths == 5);
  REQUIRE_NEAR(p.evaluation_length_mm, 12.5, 1e-9);
  REQUIRE_NEAR(p.direction_deg, 90.0, 1e-9);  // across passes that run along X
  REQUIRE(p.direction == "across");
  // Discretisation (100 samples per stepover) and the 8 um lambda-s filter: < 0.1 %.
  REQUIRE_NEAR(p.roughness.a_um, 4 * h / (9 * std::sqrt(3.0)), 1e-3 * p.roughness.a_um);
  REQUIRE_NEAR(p.roughness.sm_mm, s, 1e-3 * s);
  // Cell centres sit half a cell off the cusp tips: Rz falls short by ~2 cell/(s/2) = 2 %.
  REQUIRE_NEAR(p.roughness.z_um, h, 0.025 * h);
  REQUIRE(p.iso1302_grade == "N8");  // 2.566 um: 1.6 < Ra <= 3.2
  REQUIRE_NEAR(r.areal.parameters.sa_um, 4 * h / (9 * std::sqrt(3.0)), 2e-3 * p.roughness.a_um);
  REQUIRE(std::min(r.areal.spatial.lay_deg, 180.0 - r.areal.spatial.lay_deg) < 0.5);
  REQUIRE_FALSE(has_warning(r, "fewer than the 5"));
}

TEST_CASE("texture_report: stepover 0.3 mm selects the 0.8 mm cut-off", "[texture]") {
  const TextureReport r = texture_report(cusp_floor(0.3, 5.0, 20, 1000, 0.005), TextureOptions{});
  REQUIRE_NEAR(r.profile.cutoff_mm, 0.8, 1e-12);  // ISO 4288 Table 3: 0.13 < RSm <= 0.4
  REQUIRE(r.profile.sampling_lengths == 5);
}

TEST_CASE("texture_report: a short surface uses fewer sampling lengths and says so", "[texture]") {
  const TextureReport r = texture_report(cusp_floor(0.5, 10.0, 20, 1200, 0.005), TextureOptions{});
  REQUIRE_NEAR(r.profile.cutoff_mm, 2.5, 1e-12);
  REQUIRE(r.profile.sampling_lengths == 1);
  REQUIRE(
      has_warning(r, "holds 1 sampling length(s) of 2.5 mm, fewer than the 5 ISO 4288 asks for"));
}

TEST_CASE("texture_report: a surface shorter than two rule cut-offs falls back with a warning",
          "[texture]") {
  // 4 mm across the passes: 2.5 mm needs 5 mm, so the 0.8 mm cut-off is used (and named).
  const TextureReport r = texture_report(cusp_floor(0.5, 10.0, 20, 800, 0.005), TextureOptions{});
  REQUIRE_NEAR(r.profile.cutoff_mm, 0.8, 1e-12);
  REQUIRE(has_warning(
      r, "ISO 4288 asks for cut-off 2.5 mm but the longest profile is 3.995 mm; used 0.8 mm"));
}

TEST_CASE("texture_report: along the lay and fixed cut-off", "[texture]") {
  TextureOptions o;
  o.direction = ProfileDirection::Along;
  o.cutoff_mm = 0.25;
  const TextureReport r = texture_report(cusp_floor(0.5, 10.0, 400, 400, 0.005), o);
  REQUIRE(r.profile.cutoff_rule == "fixed");
  REQUIRE_NEAR(r.profile.direction_deg, 0.0, 1e-9);
  // Along a pass the height is constant: a flat roughness profile, reported as 0 with warnings.
  REQUIRE(r.profile.roughness.a_um < 1e-5);
  REQUIRE(has_warning(r, "roughness profile is flat"));
}

TEST_CASE("texture_report: random surface is non-periodic, cut-off by Ra", "[texture]") {
  Heightfield hf;
  hf.nx = 600;
  hf.ny = 100;
  hf.cell_mm = 0.01;
  hf.z_um.resize(hf.ny, hf.nx);
  std::mt19937 rng(3);
  std::normal_distribution<float> n(0.0f, 1.0f);
  for (int k = 0; k < hf.nx * hf.ny; ++k) hf.z_um.data()[k] = n(rng);
  TextureOptions o;
  o.direction = ProfileDirection::Angle;
  const TextureReport r = texture_report(hf, o);
  REQUIRE_FALSE(r.profile.periodic);
  REQUIRE(r.profile.cutoff_rule == "Ra (non-periodic)");
  REQUIRE_NEAR(r.profile.cutoff_mm, 0.8, 1e-12);  // Ra ~ 0.8 um: ISO 4288 Table 1, 0.1 < Ra <= 2
}

TEST_CASE("texture_report: unreached cells are counted and skipped", "[texture]") {
  Heightfield hf = cusp_floor(0.3, 5.0, 40, 1000, 0.005);
  for (int j = 0; j < hf.ny; ++j) hf.z_um(j, 0) = kUnreached;
  const TextureReport r = texture_report(hf, TextureOptions{});
  REQUIRE(r.reached_cells == 39 * 1000);
  REQUIRE(has_warning(r, "1000 of 40000 cells are unreached (NaN) and left out"));
  REQUIRE(std::isfinite(r.profile.roughness.a_um));
  REQUIRE(std::isfinite(r.areal.parameters.sa_um));
}

TEST_CASE("texture_report: errors name the problem", "[texture]") {
  Heightfield hf = cusp_floor(0.5, 10.0, 10, 10, 0.01);
  REQUIRE_THROWS_WITH(texture_report(hf, TextureOptions{}),
                      "surface too short for a profile at 90 deg: the longest trace is 0.09 mm, "
                      "at least 0.16 mm (two cut-offs) is needed");
  hf.z_um.setConstant(kUnreached);
  REQUIRE_THROWS_WITH(texture_report(hf, TextureOptions{}),
                      "surface has no finite height: every cell is unreached (NaN)");
}

// A measured trace's profile report across dropouts: short gaps bridged (one run, the whole
// length, the same Ra as the unbroken trace), longer gaps kept apart.
// Sources: Ra of a sinusoid of amplitude A is 2A / pi (ISO 4287:1997 s. 4.2.1 definition,
// derived); the Gaussian filter's transmission at a 0.5 mm wavelength under a 2.5 mm cut-off is
// 1 - exp(-pi (alpha lc / lambda)^2) ~ 1 (ISO 16610-21 s. 4.2, derived).
#include "texture/trace_report.h"

#include <cmath>
#include <numbers>
#include <string>
#include <vector>

#include "test_support.h"
#include "texture/bridge_trace_gaps.h"

using namespace cuspmap;

namespace {

constexpr double kSpacingMm = 0.005;
constexpr int kPoints = 2401;  // 12 mm
constexpr double kAmplitudeUm = 1.0;
constexpr double kWavelengthMm = 0.5;

double sine_um(int k) {
  return kAmplitudeUm * std::sin(2.0 * std::numbers::pi * k * kSpacingMm / kWavelengthMm + 0.3);
}

// The trace split into runs at gaps of `gap` missing points every `every` samples.
std::vector<ProfileTrace> runs_with_gaps(int every, int gap) {
  std::vector<ProfileTrace> runs;
  ProfileTrace cur;
  cur.spacing_mm = kSpacingMm;
  for (int k = 0; k < kPoints;) {
    if (k > 0 && k % every == 0 && k + gap < kPoints) {
      runs.push_back(cur);
      cur.z_um.clear();
      k += gap;
      cur.start_mm = k * kSpacingMm;
      continue;
    }
    cur.z_um.push_back(sine_um(k));
    ++k;
  }
  runs.push_back(cur);
  return runs;
}

bool has_bridge_warning(const TraceReport& r) {
  for (const std::string& w : r.warnings) {
    if (w.find("bridged by straight lines") != std::string::npos) return true;
  }
  return false;
}

}  // namespace

TEST_CASE("trace_report: single-point dropouts are bridged, the trace read whole", "[texture]") {
  const TraceReport whole = trace_report(runs_with_gaps(kPoints + 1, 0), {});
  const TraceReport gappy = trace_report(runs_with_gaps(200, 1), {});
  CHECK_FALSE(has_bridge_warning(whole));
  CHECK(has_bridge_warning(gappy));
  CHECK(gappy.length_mm == Approx(whole.length_mm).margin(1e-9));
  CHECK(gappy.profile.cutoff_mm == whole.profile.cutoff_mm);
  // ISO 4287 Ra of a sinusoid, 2A / pi (derived), through a filter that passes it (derived).
  CHECK(whole.profile.roughness.a_um == Approx(2.0 * kAmplitudeUm / std::numbers::pi)
                                           .epsilon(0.02));
  // 11 filled samples of 2 400: Ra moves by far less than 1 %.
  CHECK(gappy.profile.roughness.a_um == Approx(whole.profile.roughness.a_um).epsilon(0.01));
}

TEST_CASE("bridge_trace_gaps: gaps longer than the limit keep the runs apart", "[texture]") {
  int bridged = -1;
  const std::vector<ProfileTrace> kept =
      bridge_trace_gaps(runs_with_gaps(600, kMaxBridgedTracePoints + 1), kMaxBridgedTracePoints,
                        &bridged);
  CHECK(bridged == 0);
  CHECK(kept.size() == 4);
  const std::vector<ProfileTrace> joined =
      bridge_trace_gaps(runs_with_gaps(600, kMaxBridgedTracePoints), kMaxBridgedTracePoints,
                        &bridged);
  REQUIRE(joined.size() == 1);
  CHECK(bridged == 3);
  // A filled sample lies on the chord between its neighbours (linear interpolation, derived).
  const std::vector<double>& z = joined.front().z_um;
  const double a = z[599], b = z[600 + kMaxBridgedTracePoints];
  CHECK(z[600] == Approx(a + (b - a) / (kMaxBridgedTracePoints + 1)).margin(1e-12));
}

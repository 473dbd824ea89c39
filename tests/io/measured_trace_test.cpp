// Tests of the two-column trace reader: the trace-or-grid rule, even and uneven steps, missing
// points, and the error lines (verbatim).
#include "io/measured_trace.h"

#include <catch2/catch.hpp>
#include <cmath>
#include <string>

#include "core/input_error.h"
#include "test_support.h"

namespace cuspmap {
namespace {

// n rows "x,z" with x = x0 + i dx (mm) and z = f(i).
template <class F>
std::string rows(int n, double dx, F f, const char* sep = ",") {
  std::string s = "# x_mm, z_um\n";
  for (int i = 0; i < n; ++i) s += std::to_string(i * dx) + sep + std::to_string(f(i)) + "\n";
  return s;
}

}  // namespace

TEST_CASE("looks_like_trace: two numbers per data row, comments and blanks skipped", "[io]") {
  CHECK(looks_like_trace("# x z\n0 1\n\n0.1 2\n"));
  CHECK(looks_like_trace("0,1\n0.1,2\n"));
  CHECK_FALSE(looks_like_trace("0,1,2\n0.1,2,3\n"));
  CHECK_FALSE(looks_like_trace("0,1\n0.1,2,3\n"));
  CHECK_FALSE(looks_like_trace("# only a comment\n"));
}

TEST_CASE("issue_17: a first row of column names is skipped", "[io]") {
  // Profilometers write column names above the data; with spaces in them ("X [mm]") the file
  // was read as a grid ("4 values, expected 3 (X Y Z)"), with none it was refused (random round
  // trips, tools/diagnose_campaign.py).
  const std::string tab = "X [mm]\tZ [um]\n" + rows(20, 0.001, [](int i) { return 0.5 * i; }, "\t");
  CHECK(looks_like_trace(tab));
  CHECK(looks_like_trace("x_mm,z_um\n0,1\n0.1,2\n"));
  CHECK_FALSE(looks_like_trace("x,y,z\n0,1,2\n0.1,2,3\n"));
  const MeasuredTrace t = decode_trace(tab, "t.txt", 1.0, 1.0);
  CHECK(t.points == 20);
  REQUIRE_NEAR(t.runs[0].z_um[3], 1.5, 1e-9);  // derived: 0.5 um per row
  // Only the first data row may name columns: a later word is still an error with its line.
  CHECK_THROWS_WITH(decode_trace("x,z\n0,1\nabc,def\n", "bad.csv", 1.0, 1.0),
                    "bad.csv:3: x 'abc' is not a finite number");
}

TEST_CASE("decode_trace: even steps keep every height, units scale x and z", "[io]") {
  const std::string text = rows(40, 0.002, [](int i) { return 0.001 * i; });
  const MeasuredTrace t = decode_trace(text, "t.csv", 25.4, 1000.0);  // x in inches, z in mm
  REQUIRE(t.runs.size() == 1);
  CHECK_FALSE(t.resampled);
  CHECK(t.points == 40);
  REQUIRE_NEAR(t.spacing_mm, 0.002 * 25.4, 1e-9);
  REQUIRE_NEAR(t.length_mm, 39 * 0.002 * 25.4, 1e-9);
  REQUIRE(t.runs[0].z_um.size() == 40);
  REQUIRE_NEAR(t.runs[0].z_um[7], 7.0, 1e-9);  // 0.007 mm = 7 um
}

TEST_CASE("decode_trace: uneven x is resampled linearly on the median step", "[io]") {
  // z = 3 x (um, x in mm) is linear, so linear resampling reproduces it exactly (derived).
  std::string text;
  double x = 0.0;
  for (int i = 0; i < 30; ++i) {
    text += std::to_string(x) + " " + std::to_string(3.0 * x) + "\n";
    x += (i % 3 == 0) ? 0.015 : 0.01;
  }
  const MeasuredTrace t = decode_trace(text, "u.txt", 1.0, 1.0);
  CHECK(t.resampled);
  REQUIRE_NEAR(t.spacing_mm, 0.01, 1e-9);
  const ProfileTrace& r = t.runs.at(0);
  for (size_t i = 0; i < r.z_um.size(); ++i) {
    CAPTURE(i);
    REQUIRE_NEAR(r.z_um[i], 3.0 * (i * t.spacing_mm), 1e-5);  // 6-digit text
  }
}

TEST_CASE("decode_trace: NaN heights split the trace into runs", "[io]") {
  std::string text = rows(20, 0.01, [](int i) { return 1.0 * i; });
  text += "0.2,NaN\n";
  for (int i = 21; i < 40; ++i) text += std::to_string(i * 0.01) + "," + std::to_string(i) + "\n";
  const MeasuredTrace t = decode_trace(text, "n.csv", 1.0, 1.0);
  CHECK(t.missing_points == 1);
  REQUIRE(t.runs.size() == 2);
  CHECK(t.runs[0].z_um.size() == 20);
  CHECK(t.runs[1].z_um.size() == 19);
}

TEST_CASE("decode_trace: bad rows are refused with their line", "[io]") {
  auto message = [](const std::string& text) {
    try {
      decode_trace(text, "bad.csv", 1.0, 1.0);
    } catch (const InputError& e) {
      return std::string(e.what());
    }
    return std::string("no error");
  };
  CHECK(message("0,1\n0.1,2,3\n") == "bad.csv:2: 3 values, a trace row holds exactly two (x, z)");
  CHECK(message("0,1\n0,2\n") ==
        "bad.csv:2: x 0 mm does not increase (previous row 0 mm); a trace lists x in increasing "
        "order");
  CHECK(message("0,1\nabc,2\n") == "bad.csv:2: x 'abc' is not a finite number");
  CHECK(message("0,1\n0.1,2\n") == "bad.csv: 2 trace points, at least 16 are needed");
}

}  // namespace cuspmap

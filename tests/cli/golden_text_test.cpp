// Golden text: the human output of a few commands in mm and in inch mode, compared verbatim with
// tests/data/golden/<name>.txt (the display layer's rounding and units, issue 14). A run's output
// folder is written as OUT. To accept a deliberate change, run with CUSPMAP_UPDATE_GOLDEN=1 and
// review the diff of tests/data/golden/.
#include <cstdlib>
#include <string>
#include <vector>

#include "test_support.h"

namespace cuspmap {
namespace {

struct GoldenCase {
  const char* name;               // tests/data/golden/<name>.txt
  std::vector<std::string> args;  // "OUT" is replaced by a fresh temp folder
  std::vector<std::string> before = {};  // a run that prepares OUT first (same replacement)
};

std::string replace_all(std::string text, const std::string& from, const std::string& to) {
  for (size_t at = text.find(from); at != std::string::npos; at = text.find(from, at + to.size()))
    text.replace(at, from.size(), to);
  return text;
}

void check_golden(const GoldenCase& c) {
  CAPTURE(c.name);
  test::TempDir dir;
  const auto with_out = [&](const std::vector<std::string>& in) {
    std::vector<std::string> out;
    for (const std::string& a : in) out.push_back(replace_all(a, "OUT", dir.file("out")));
    return out;
  };
  if (!c.before.empty()) REQUIRE(test::run_cuspmap(with_out(c.before)).exit_code == 0);
  const std::vector<std::string> args = with_out(c.args);
  const test::RunResult r = test::run_cuspmap(args);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  const std::string got = replace_all(r.out, dir.file("out"), "OUT");
  const std::string file = test::data_path(std::string("golden/") + c.name + ".txt");
  if (std::getenv("CUSPMAP_UPDATE_GOLDEN") != nullptr) test::write_text(file, got);
  const std::string want = test::read_text(file);
  INFO("got:\n" << got);
  REQUIRE(got == want);
}

}  // namespace

TEST_CASE("golden text: stepover in mm and in", "[cli]") {
  check_golden({"stepover_mm", {"stepover", "--tool", "ball", "--diameter", "6", "--stepover", "0.5"}});
  check_golden({"stepover_in",
                {"stepover", "--tool", "ball", "--diameter", "0.25", "--target-scallop", "0.4thou",
                 "--feed-per-tooth", "0.004", "--units", "in"}});
}

TEST_CASE("golden text: allowance in mm and in", "[cli]") {
  check_golden({"allowance_mm",
                {"allowance", "--tool", "ball", "--diameter", "6", "--stepover", "0.5",
                 "--tolerance", "0.02", "--area", "120x80"}});
  check_golden({"allowance_in",
                {"allowance", "--tool", "ball", "--diameter", "0.25", "--stepover", "0.02",
                 "--tolerance", "0.001", "--area", "4.7x3", "--units", "in"}});
}

TEST_CASE("golden text: plan in mm and in", "[cli]") {
  check_golden({"plan_mm",
                {"plan", "--tools", "ball:6,flat:10", "--tilt", "0.05", "--size", "80x50", "--feed",
                 "1500", "--machine-rate", "90", "--bench-rate", "45", "--stepovers", "0.2,0.5,1",
                 "--target-ra", "0.8um"}});
  check_golden({"plan_in",
                {"plan", "--tools", "ball:0.25,flat:0.375", "--tilt", "0.05", "--size", "3x2",
                 "--feed", "60", "--machine-rate", "90", "--bench-rate", "45", "--stepovers",
                 "0.008,0.02,0.04", "--target-ra", "32uin", "--units", "in"}});
}

TEST_CASE("golden text: simulate and texture in mm and in", "[cli]") {
  const std::string job = test::source_path("examples/pump_cover_ball.toml");
  check_golden({"simulate_mm", {"simulate", job, "--out", "OUT"}});
  check_golden({"simulate_in", {"simulate", job, "--out", "OUT", "--units", "in"}});
  check_golden({"texture_in",
                {"texture", "OUT/height.npy", "--units", "in"},
                {"simulate", job, "--out", "OUT"}});
}

TEST_CASE("simulate: the forecast line on a pipe (stderr not a terminal)", "[cli]") {
  // issue 14: a long run printed nothing on a pipe; --verbose always states the forecast.
  test::TempDir dir;
  const test::RunResult r =
      test::run_cuspmap({"simulate", test::source_path("examples/pump_cover_ball.toml"), "--out",
                         dir.path(), "--verbose"});
  REQUIRE(r.exit_code == 0);
  INFO(r.err);
  CHECK(r.err.find("simulate: 1 M cells, about ") != std::string::npos);
  CHECK(r.err.find(" (in memory)\n") != std::string::npos);
  CHECK(r.err.find('\r') == std::string::npos);  // no terminal bar on a pipe
}

}  // namespace cuspmap

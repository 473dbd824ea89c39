// Tests of the grade-table reader: the shipped default file equals the built-in table, a user
// table overrides values, and bad tables or sequences fail with one verbatim line.
#include "io/read_grit_table.h"

#include "core/input_error.h"
#include "test_support.h"

namespace cuspmap {
namespace {

std::string error_of(const std::string& toml) {
  try {
    parse_grit_table(toml, "t.toml");
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

}  // namespace

TEST_CASE("read_grit_table: tests/data/grits_default.toml is the built-in table", "[io]") {
  const GritTable file = read_grit_table(test::data_path("grits_default.toml"));
  const GritTable built = default_grit_table();
  REQUIRE(file.grits.size() == built.grits.size());
  for (std::size_t k = 0; k < built.grits.size(); ++k) {
    CAPTURE(built.grits[k].name);
    REQUIRE(file.grits[k].name == built.grits[k].name);
    REQUIRE(file.grits[k].particle_um == built.grits[k].particle_um);
    REQUIRE(file.grits[k].scratch_um == built.grits[k].scratch_um);
    REQUIRE(file.grits[k].ra_um == built.grits[k].ra_um);
    REQUIRE(file.grits[k].removal_mm3_per_min == built.grits[k].removal_mm3_per_min);
  }
  REQUIRE(file.sequence == built.sequence);
  REQUIRE(file.source == built.source);
}

TEST_CASE("read_grit_table: per-grade values override the fractions", "[io]") {
  const GritTable t = read_grit_table(test::data_path("grits_measured.toml"));
  REQUIRE(t.sequence == std::vector<std::string>{"P240", "P400", "P600"});
  REQUIRE(find_grit(t, "P400")->scratch_um == 3.0);
  REQUIRE(find_grit(t, "P400")->removal_mm3_per_min == 6.0);
  // Fractions apply to what a grade leaves out; grades come back sorted coarse to fine.
  const GritTable partial = parse_grit_table(
      "ra_per_particle = 0.02\ngrit = [{name = \"F\", particle_um = 10.0},"
      " {name = \"C\", particle_um = 40.0, ra_um = 0.3}]\n",
      "p.toml");
  REQUIRE(partial.grits[0].name == "C");
  REQUIRE(partial.grits[0].ra_um == 0.3);
  REQUIRE(partial.grits[1].ra_um == 0.02 * 10.0);
  REQUIRE(partial.grits[1].scratch_um == kScratchDepthPerParticle * 10.0);
  REQUIRE(partial.sequence == std::vector<std::string>{"C", "F"});
}

TEST_CASE("read_grit_table: bad tables fail with one line naming the value", "[io]") {
  REQUIRE(error_of("grit = [{name = \"P1\", particle_um = -3.0}]\n") ==
          "t.toml:1:37: grit[0].particle_um -3: must be a finite number > 0");
  REQUIRE(error_of("grit = [{name = \"P1\", particle_um = 3.0, speed = 2}]\n") ==
          "t.toml:1:42: unknown key 'grit[0].speed'; allowed keys are name, particle_um, "
          "scratch_um, ra_um, removal_mm3_per_min");
  REQUIRE(error_of("grit = [{name = \"P1\"}]\n") ==
          "t.toml:1:9: grit[0].particle_um is missing: expected a number > 0");
  REQUIRE(
      error_of("grit = [{name = \"A\", particle_um = 3.0}, {name = \"A\", particle_um = 2.0}]\n") ==
      "t.toml:1:42: grit[1].name 'A': appears twice");
  REQUIRE(error_of("sequence = [\"B\", \"A\"]\ngrit = [{name = \"A\", particle_um = 30.0},"
                   " {name = \"B\", particle_um = 20.0}]\n") ==
          "t.toml:1:12: sequence 'B,A': A is not finer than B; list grades coarse to fine");
  REQUIRE(error_of("scratch_per_particle = 0.1\n") ==
          "t.toml: 'grit' is missing: expected an array of grade tables");
  REQUIRE(error_of("grit = [\n").rfind("t.toml:", 0) == 0);
  REQUIRE_THROWS_AS(read_grit_table("/nonexistent/grits.toml"), InputError);
}

TEST_CASE("parse_grit_sequence: names must exist and go from coarse to fine", "[io]") {
  const GritTable t = default_grit_table();
  REQUIRE(parse_grit_sequence("P180, P320,P400", t, "--grits") ==
          std::vector<std::string>{"P180", "P320", "P400"});
  try {
    parse_grit_sequence("P180,P9", t, "--grits");
    FAIL("accepted an unknown grade");
  } catch (const InputError& e) {
    REQUIRE(std::string(e.what()).rfind("--grits 'P9': unknown grade; the table has P80, P100,",
                                        0) == 0);
  }
  try {
    parse_grit_sequence("P400,P240", t, "--grits");
    FAIL("accepted fine-to-coarse grades");
  } catch (const InputError& e) {
    REQUIRE(std::string(e.what()) ==
            "--grits 'P400,P240': P240 is not finer than P400; list grades coarse to fine");
  }
  REQUIRE_THROWS_AS(parse_grit_sequence(" , ", t, "--grits"), InputError);
}

}  // namespace cuspmap

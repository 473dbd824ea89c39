// Table tests: ISO 4288 cut-off rows, ISO 3274 lambda-s pairs and ISO 1302 grades, each row with
// its source in tests/data/*.toml.
#include <toml++/toml.h>

#include "core/iso1302_table.h"
#include "test_support.h"
#include "texture/iso1302_grade.h"
#include "texture/iso4288_cutoff.h"

using namespace cuspmap;

namespace {

double num(const toml::table& row, const char* key) { return row[key].value<double>().value(); }

}  // namespace

TEST_CASE("cutoff_for_ra: ISO 4288 Table 1 rows", "[texture]") {
  const toml::table doc = toml::parse_file(test::data_path("iso4288_cutoffs.toml"));
  const toml::array& rows = *doc["ra"].as_array();
  REQUIRE(rows.size() >= 5);
  for (const toml::node& node : rows) {
    const toml::table& row = *node.as_table();
    CAPTURE(num(row, "ra_um"), row["source"].value<std::string>().value());
    const CutoffRow c = cutoff_for_ra(num(row, "ra_um"));
    REQUIRE(c.in_range);
    REQUIRE_NEAR(c.cutoff_mm, num(row, "cutoff_mm"), 1e-12);
    REQUIRE(ra_in_cutoff_range(num(row, "ra_um"), num(row, "cutoff_mm")));
  }
}

TEST_CASE("cutoff_for_rsm: ISO 4288 Table 3 rows", "[texture]") {
  const toml::table doc = toml::parse_file(test::data_path("iso4288_cutoffs.toml"));
  for (const toml::node& node : *doc["rsm"].as_array()) {
    const toml::table& row = *node.as_table();
    CAPTURE(num(row, "rsm_mm"), row["source"].value<std::string>().value());
    const CutoffRow c = cutoff_for_rsm(num(row, "rsm_mm"));
    REQUIRE(c.in_range);
    REQUIRE_NEAR(c.cutoff_mm, num(row, "cutoff_mm"), 1e-12);
    REQUIRE(rsm_in_cutoff_range(num(row, "rsm_mm"), num(row, "cutoff_mm")));
  }
}

TEST_CASE("cutoff_for_ra: values outside the table take the end rows, flagged", "[texture]") {
  // ISO 4288:1996 Table 1 spans 0.006 < Ra <= 80 um (from memory).
  REQUIRE_FALSE(cutoff_for_ra(0.001).in_range);
  REQUIRE_NEAR(cutoff_for_ra(0.001).cutoff_mm, 0.08, 1e-12);
  REQUIRE_FALSE(cutoff_for_ra(100.0).in_range);
  REQUIRE_NEAR(cutoff_for_ra(100.0).cutoff_mm, 8.0, 1e-12);
  REQUIRE_FALSE(cutoff_for_rsm(5.0).in_range);
  REQUIRE_FALSE(ra_in_cutoff_range(1.0, 0.25));
}

TEST_CASE("lambda_s_um_for_cutoff: ISO 3274 pairs", "[texture]") {
  const toml::table doc = toml::parse_file(test::data_path("iso4288_cutoffs.toml"));
  for (const toml::node& node : *doc["lambda_s"].as_array()) {
    const toml::table& row = *node.as_table();
    CAPTURE(num(row, "cutoff_mm"), row["source"].value<std::string>().value());
    REQUIRE_NEAR(lambda_s_um_for_cutoff(num(row, "cutoff_mm")), num(row, "lambda_s_um"), 1e-12);
  }
}

TEST_CASE("iso1302_grade: grade numbers and measured values", "[texture]") {
  const toml::table doc = toml::parse_file(test::data_path("iso1302_grades.toml"));
  const toml::array& grades = *doc["grade"].as_array();
  REQUIRE(grades.size() == 12);
  for (const toml::node& node : grades) {
    const toml::table& row = *node.as_table();
    const int n = static_cast<int>(row["n"].value<int64_t>().value());
    CAPTURE(n, row["source"].value<std::string>().value());
    REQUIRE_NEAR(iso1302_grade_ra_um(n), num(row, "ra_um"), 1e-12);
    const auto parsed = iso1302_row(std::string("N").append(std::to_string(n)));
    REQUIRE(parsed.has_value());
    REQUIRE(parsed->ra_uin == num(row, "ra_uin"));
    const std::string expected = std::string("N").append(std::to_string(n));
    REQUIRE(iso1302_grade(num(row, "ra_um")) == expected);
  }
  for (const toml::node& node : *doc["measured"].as_array()) {
    const toml::table& row = *node.as_table();
    CAPTURE(num(row, "ra_um"), row["source"].value<std::string>().value());
    REQUIRE(iso1302_grade(num(row, "ra_um")) == row["grade"].value<std::string>().value());
  }
}

// ISO 1302 grade numbers: table values and the "smallest grade whose Ra >= the given Ra" rule.
#include "cusp/iso1302_grade.h"

#include "test_support.h"

TEST_CASE("iso1302_grade: the N1-N12 table", "[cusp]") {
  // ISO 1302:1992 roughness grade numbers (Ra in um).
  const double table[] = {0.025, 0.05, 0.1, 0.2, 0.4, 0.8, 1.6, 3.2, 6.3, 12.5, 25.0, 50.0};
  for (int k = 0; k < 12; ++k) {
    const auto g = cuspmap::iso1302_grade(table[k]);
    CAPTURE(k);
    REQUIRE(g.has_value());
    REQUIRE(g->number == k + 1);
    REQUIRE(g->ra_um == table[k]);
  }
}

TEST_CASE("iso1302_grade: smallest grade at or above the Ra", "[cusp]") {
  REQUIRE(cuspmap::iso1302_grade(0.0)->label() == "N1");
  // ISO 1302:1992 prints 32 uin beside N6: 32 uin = 0.8128 um is N6 (issue_13: was N7).
  REQUIRE(cuspmap::iso1302_grade(0.81)->label() == "N6");
  REQUIRE(cuspmap::iso1302_grade(32.0 / 39.37007874015748)->label() == "N6");
  REQUIRE(cuspmap::iso1302_grade(32.0 / 39.37007874015748)->ra_uin == 32.0);
  REQUIRE(cuspmap::iso1302_grade(0.82)->label() == "N7");
  REQUIRE(cuspmap::iso1302_grade(0.8000000001)->label() == "N6");  // rounding, not a real excess
  REQUIRE(cuspmap::iso1302_grade(2.677)->label() == "N8");
  REQUIRE(cuspmap::iso1302_grade(3.3)->label() == "N9");
  REQUIRE(cuspmap::iso1302_grade(12.6)->label() == "N10");  // 500 uin = 12.7 um
  REQUIRE(cuspmap::iso1302_grade(12.8)->label() == "N11");
  REQUIRE(cuspmap::iso1302_grade(50.1)->label() == "N12");  // 2000 uin = 50.8 um
  REQUIRE_FALSE(cuspmap::iso1302_grade(50.9).has_value());
  REQUIRE_FALSE(cuspmap::iso1302_grade(-1.0).has_value());
}

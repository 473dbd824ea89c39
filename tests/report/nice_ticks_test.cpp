// Tests for io/nice_ticks: 1-2-5 steps (Heckbert, Graphics Gems I, 1990), ticks, labels.
#include "report/nice_ticks.h"

#include "test_support.h"

using namespace cuspmap;

TEST_CASE("nice_step: smallest 1-2-5 step giving at most the wanted intervals", "[report]") {
  // span / max = raw; step is the next 1-2-5 value >= raw (Heckbert 1990).
  REQUIRE_NEAR(nice_step(10.0, 10), 1.0, 1e-12);  // raw 1
  REQUIRE_NEAR(nice_step(10.0, 6), 2.0, 1e-12);   // raw 1.67
  REQUIRE_NEAR(nice_step(10.0, 4), 5.0, 1e-12);   // raw 2.5
  REQUIRE_NEAR(nice_step(0.37, 6), 0.1, 1e-12);   // raw 0.0617
  REQUIRE_NEAR(nice_step(7.0, 1), 10.0, 1e-12);   // raw 7
  REQUIRE_NEAR(nice_step(0.0, 5), 1.0, 1e-12);    // degenerate
}

TEST_CASE("nice_ticks: multiples of the step inside the range", "[report]") {
  const std::vector<double> t = nice_ticks(-0.33, 1.27, 8);  // raw 0.2 -> step 0.2
  REQUIRE(t.size() == 8u);
  REQUIRE_NEAR(t.front(), -0.2, 1e-12);
  REQUIRE_NEAR(t.back(), 1.2, 1e-12);
  const std::vector<double> exact = nice_ticks(0.0, 1.0, 5);  // ends that are ticks stay
  REQUIRE(exact.size() == 6u);
  REQUIRE(nice_ticks(2.0, 2.0, 5) == std::vector<double>{2.0});
}

TEST_CASE("nice_length_at_most: the largest 1-2-5 length not above the limit", "[report]") {
  REQUIRE_NEAR(nice_length_at_most(3.7), 2.0, 1e-12);
  REQUIRE_NEAR(nice_length_at_most(5.0), 5.0, 1e-12);
  REQUIRE_NEAR(nice_length_at_most(0.0999), 0.05, 1e-12);
  REQUIRE_NEAR(nice_length_at_most(19.0), 10.0, 1e-12);
  REQUIRE(nice_length_at_most(-1.0) == 0.0);
}

TEST_CASE("format_fixed / format_significant: locale-free labels", "[report]") {
  REQUIRE(format_fixed(0.25, 2) == "0.25");
  REQUIRE(format_fixed(-0.0001, 2) == "0.00");
  REQUIRE(format_fixed(1200.0, 0) == "1200");
  REQUIRE(format_fixed(-3.14159, 3) == "-3.142");
  REQUIRE(decimals_for_step(0.05) == 2);
  REQUIRE(decimals_for_step(0.1) == 1);
  REQUIRE(decimals_for_step(2.0) == 0);
  REQUIRE(format_significant(0.25312, 3) == "0.253");
  REQUIRE(format_significant(12.54, 3) == "12.5");
  REQUIRE(format_significant(1234.0, 3) == "1234");
  REQUIRE(format_significant(0.0, 3) == "0");
}

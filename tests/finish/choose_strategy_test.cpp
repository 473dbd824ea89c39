// Tests of the strategy choice: spec first, then machine time, then sanding depth.
#include "finish/choose_strategy.h"

#include "test_support.h"

using namespace cuspmap;

TEST_CASE("choose_strategy: quickest option that meets the target Ra wins", "[finish]") {
  // Invented option values (demo numbers): the rule itself is what is tested.
  const std::vector<StrategyScore> options = {
      {"fine ball", 0.25, 1.0, 60.0}, {"coarse ball", 1.2, 4.5, 20.0}, {"flat", 0.1, 0.6, 30.0}};
  const StrategyChoice c = choose_strategy(options, 0.8);
  REQUIRE(c.best == 2u);
  CHECK(c.meets == std::vector<bool>{true, false, true});
  CHECK(c.closest == 2u);
  CHECK(c.reason.rfind("flat: meets Ra 0.8 um", 0) == 0);
}

TEST_CASE("choose_strategy: equal machine time prefers the shallower marks", "[finish]") {
  const std::vector<StrategyScore> options = {{"a", 0.5, 2.0, 30.0}, {"b", 0.5, 1.0, 30.0}};
  CHECK(choose_strategy(options, 0.8).best == 1u);
}

TEST_CASE("choose_strategy: no option meets the target names the closest", "[finish]") {
  const std::vector<StrategyScore> options = {{"a", 1.5, 6.0, 10.0}, {"b", 0.9, 3.5, 30.0}};
  const StrategyChoice c = choose_strategy(options, 0.8);
  CHECK_FALSE(c.best.has_value());
  CHECK(c.closest == 1u);
  CHECK(c.reason ==
        "No option meets Ra 0.8 um; the closest is b (Ra 0.9 um): use a finer stepover or plan "
        "to sand 3.5 um (Sz).");
}

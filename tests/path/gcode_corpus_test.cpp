// Corpus test: programs written in the styles of common posts and senders (tests/data/gcode/
// corpus/, described in tests/data/gcode_corpus.toml) are read as a controller runs them; each
// gives its hand-computed move count, feed length and end point, and the warnings expected
// (with the control's D-word table where the program compensates the cutter radius).
// Reference: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000).
#include <toml++/toml.h>

#include <string>

#include "path/gcode_reader.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap {

TEST_CASE("read_gcode_file: corpus of programs in the styles of common posts", "[path]") {
  const toml::table table = toml::parse_file(test::data_path("gcode_corpus.toml"));
  const toml::array* programs = table["program"].as_array();
  REQUIRE(programs != nullptr);
  REQUIRE(programs->size() >= 5);
  for (const toml::node& node : *programs) {
    const toml::table& p = *node.as_table();
    const std::string file = p["file"].value_or(std::string{});
    const double tol = p["tolerance"].value_or(0.0);
    CAPTURE(file, p["source"].value_or(std::string{}));
    GcodeReadOptions options;  // the control's D-word table, where the program uses one
    if (const toml::table* d = p["d_radius"].as_table()) {
      for (const auto& [key, radius] : *d) {
        options.d_radius_mm[std::stoi(std::string(key.str()))] = radius.value_or(-1.0);
      }
    }
    const BuiltPath b = read_gcode_file(test::data_path("gcode/corpus/" + file), CutSpec{},
                                        test::test_patch(), test::test_ball(), options);
    CHECK(b.path.moves.size() == p["moves"].value_or(std::size_t{0}));
    REQUIRE_NEAR(path_length_mm(b.path, false), p["feed_length_mm"].value_or(-1.0), tol);
    const toml::array& end = *p["end_mm"].as_array();
    REQUIRE(!b.path.moves.empty());
    for (int a = 0; a < 3; ++a) {
      REQUIRE_NEAR(b.path.moves.back().end_mm[a], end[static_cast<std::size_t>(a)].value_or(-1e9), tol);
    }
    for (const toml::node& w : *p["warnings"].as_array()) {
      const std::string want = w.value_or(std::string{});
      bool found = false;
      for (const PathWarning& got : b.warnings) found = found || got.message.find(want) != std::string::npos;
      CAPTURE(want);
      CHECK(found);
    }
  }
}

}  // namespace cuspmap

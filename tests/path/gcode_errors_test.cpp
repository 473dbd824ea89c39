// Malformed and unsupported G-code: every case of tests/data/gcode_errors.toml gives its one-line
// InputError verbatim (file:line, the word, why); plus binary bytes, a 100 MB single line and
// files that cannot be opened, read from real files.
#include <toml++/toml.h>

#include <fstream>
#include <string>

#include "core/input_error.h"
#include "path/gcode_reader.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap {
namespace {

std::string text_error(const std::string& text) {
  return test::input_error_of(
      [&] { read_gcode_text(text, "part.nc", CutSpec{}, test::test_patch(), test::test_ball()); });
}

std::string file_error(const std::string& path) {
  return test::input_error_of(
      [&] { read_gcode_file(path, CutSpec{}, test::test_patch(), test::test_ball()); });
}

}  // namespace

TEST_CASE("read_gcode_text: malformed programs give the tabled one-line errors", "[path]") {
  const toml::table table = toml::parse_file(test::data_path("gcode_errors.toml"));
  const toml::array* cases = table["case"].as_array();
  REQUIRE(cases != nullptr);
  REQUIRE(cases->size() >= 30);
  for (const toml::node& node : *cases) {
    const toml::table& c = *node.as_table();
    const std::string name = c["name"].value_or(std::string{});
    const std::string program = c["program"].value_or(std::string{});
    const std::string message = c["message"].value_or(std::string{});
    CAPTURE(name, program);
    CHECK(text_error(program) == message);
  }
}

TEST_CASE("read_gcode_file: binary bytes, long lines and missing files are refused", "[path]") {
  test::TempDir dir;
  const std::string png = dir.file("picture.nc");
  test::write_text(png, std::string("\x89PNG\r\n\x1a\n\0\0", 10));
  CHECK(file_error(png) == png + ":1: byte 0x89 at column 1: not G-code text");
  // A byte that is not text after valid words, on line 2.
  const std::string nul = dir.file("nul.nc");
  test::write_text(nul, std::string("G21\nG90 \0", 9));
  CHECK(file_error(nul) == nul + ":2: byte 0x00 at column 5: not G-code text");
  // 100 MB on one line: refused at the 4096-character limit with line 3, read in 64 KiB chunks.
  const std::string big = dir.file("big.nc");
  {
    std::ofstream out(big, std::ios::binary);
    out << "G21\nG90\n";
    const std::string block(1 << 20, 'X');
    for (int i = 0; i < 100; ++i) out << block;
  }
  CHECK(file_error(big) == big + ":3: line longer than 4096 characters: not a G-code program line");
  CHECK(file_error(dir.file("absent.nc")) ==
        dir.file("absent.nc") + ": cannot open the G-code file (No such file or directory)");
  const std::string empty = dir.file("empty.nc");
  test::write_text(empty, "");
  CHECK(file_error(empty) == empty + ":1: empty file: no G-code program in it");
}

TEST_CASE("read_gcode_file: fixtures of tests/data/gcode", "[path]") {
  // issue_16: canned cycles and parameters are read now. G83 peck drill from Z5, R1 to Z-8
  // (RS274NGC v3 §3.5.16.3, modelled as one plunge): rapid to R, feed 9 mm, rapid back to Z5
  // (G98), then the G0 Z20 of the next line.
  const BuiltPath peck = read_gcode_file(test::data_path("gcode/peck_drill.nc"), CutSpec{},
                                         test::test_patch(), test::test_ball());
  REQUIRE(peck.path.moves.size() == 4);
  CHECK(peck.path.moves[1].end_mm == Eigen::Vector3d(10, 10, -8));
  REQUIRE_NEAR(path_length_mm(peck.path, false), 9.0, 1e-12);
  // #100 = 12.5, then G1 X#100 from (0, 0, 5): one 12.5 mm move (RS274NGC v3 §3.3.3).
  const BuiltPath macro = read_gcode_file(test::data_path("gcode/macro_pocket.nc"), CutSpec{},
                                          test::test_patch(), test::test_ball());
  REQUIRE(macro.path.moves.size() == 1);
  REQUIRE_NEAR(path_length_mm(macro.path, false), 12.5, 1e-12);
  // A valid inch program: 0.5 in = 12.7 mm stepover lines and one arc.
  const BuiltPath b = read_gcode_file(test::data_path("gcode/cover_plate_inch.nc"), CutSpec{},
                                      test::test_patch(), test::test_ball());
  REQUIRE(b.path.moves.size() == 5);
  CHECK(b.spindle == SpindleDirection::Cw);
  REQUIRE_NEAR(b.path.moves[1].end_mm.x(), 25.4, 1e-12);
  REQUIRE_NEAR(b.path.moves[2].end_mm.y(), 12.7, 1e-12);
  CHECK(b.path.moves[3].kind == MoveKind::Arc);
  REQUIRE_NEAR(b.path.moves[3].centre_mm.y(), 6.35, 1e-12);
}

}  // namespace cuspmap

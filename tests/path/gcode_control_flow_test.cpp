// Tests of O-word control flow and M98/M99 subprograms: the moves a program makes when run as a
// control runs it, against paths computed by hand. O-words and M98/M99 are common controls'
// extensions of RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000); each expectation
// is derived by following the lines by hand ("derived").
#include <string>

#include "core/input_error.h"
#include "path/gcode_reader.h"
#include "path/gcode_test_support.h"

namespace cuspmap {
namespace {

BuiltPath read(const std::string& text, const GcodeReadOptions& options = {}) {
  return test::read_part(text, options);
}

std::string error_of(const std::string& text) { return test::part_error(text); }

const std::string kStart = "G21 G90 M3 S10000\nG0 X0 Y0 Z1\nG1 Z0 F100\n";  // one plunge move

}  // namespace

TEST_CASE("read_gcode_text: O-word sub, call with arguments, return value", "[path]") {
  const BuiltPath b = read(kStart +
                           "o<step> sub\n"
                           "  G91 G1 X#1 Y#2\n"
                           "  G90\n"
                           "  o<step> return [#1 + #2]\n"
                           "o<step> endsub\n"
                           "o<step> call [10] [0]\n"
                           "o<step> call [0] [5]\n"
                           "G1 Z#<_value>\n"
                           "M30\n");
  // Derived: plunge, X+10, Y+5, then Z = 0 + 5 (the last call's return value).
  REQUIRE(b.path.moves.size() == 4);
  CHECK(b.path.moves[1].end_mm == Eigen::Vector3d(10, 0, 0));
  CHECK(b.path.moves[2].end_mm == Eigen::Vector3d(10, 5, 0));
  CHECK(b.path.moves[3].end_mm == Eigen::Vector3d(10, 5, 5));
  CHECK(b.path.moves[1].source_line == 5);
  REQUIRE_NEAR(path_length_mm(b.path, false), 1 + 10 + 5 + 5, 1e-12);
}

TEST_CASE("read_gcode_text: while, do-while and repeat loops", "[path]") {
  const BuiltPath b = read(kStart +
                           "#1 = 1\n"
                           "O101 while [#1 LE 3]\n"
                           "  G1 X[#1 * 2]\n"
                           "  #1 = [#1 + 1]\n"
                           "O101 endwhile\n"
                           "O102 do\n"
                           "  G91 G1 Y1\n  G90\n"
                           "  #1 = [#1 - 1]\n"
                           "O102 while [#1 GT 2]\n"
                           "O103 repeat [3]\n"
                           "  G91 G1 X-1\n  G90\n"
                           "O103 endrepeat\n");
  // Derived: X2, X4, X6 (while runs for #1 = 1, 2, 3); do runs for #1 = 4 -> 3 and 3 -> 2
  // (Y1, Y2); repeat: X5, X4, X3.
  REQUIRE(b.path.moves.size() == 1 + 3 + 2 + 3);
  CHECK(b.path.moves[3].end_mm == Eigen::Vector3d(6, 0, 0));
  CHECK(b.path.moves[5].end_mm == Eigen::Vector3d(6, 2, 0));
  CHECK(b.path.moves[8].end_mm == Eigen::Vector3d(3, 2, 0));
}

TEST_CASE("read_gcode_text: if, elseif, else, break and continue", "[path]") {
  const BuiltPath b = read(kStart +
                           "#<n> = 2\n"
                           "o1 if [#<n> EQ 1]\n  G1 X1\n"
                           "o1 elseif [#<n> EQ 2]\n  G1 X2\n"
                           "o1 else\n  G1 X3\n"
                           "o1 endif\n"
                           "o2 if [#<n> GT 5]\n  G1 Y9\no2 else\n  G1 Y4\no2 endif\n"
                           "#2 = 0\n"
                           "o3 while [1]\n"
                           "  #2 = [#2 + 1]\n"
                           "  o4 if [#2 EQ 2]\n    o3 continue\n  o4 endif\n"
                           "  o5 if [#2 GT 3]\n    o3 break\n  o5 endif\n"
                           "  G1 Z[#2]\n"
                           "o3 endwhile\n");
  // Derived: X2 (elseif), Y4 (else), then Z1 and Z3 (#2 = 2 skipped by continue, 4 breaks).
  REQUIRE(b.path.moves.size() == 1 + 4);
  CHECK(b.path.moves[1].end_mm == Eigen::Vector3d(2, 0, 0));
  CHECK(b.path.moves[2].end_mm == Eigen::Vector3d(2, 4, 0));
  CHECK(b.path.moves[3].end_mm == Eigen::Vector3d(2, 4, 1));
  CHECK(b.path.moves[4].end_mm == Eigen::Vector3d(2, 4, 3));
}

TEST_CASE("read_gcode_text: M98/M99 subprograms after M30, with L repeats", "[path]") {
  const BuiltPath b = read(kStart +
                           "M98 P200 L2\n"
                           "G1 Y5\n"
                           "M30\n"
                           "O0200 (STEP)\n"
                           "G91 G1 X5\n"
                           "G90\n"
                           "M99\n");
  // Derived: X5, X10 (two passes of O200), then Y5; the subprogram after M30 is not counted as
  // lines left unrun.
  REQUIRE(b.path.moves.size() == 4);
  CHECK(b.path.moves[2].end_mm == Eigen::Vector3d(10, 0, 0));
  CHECK(b.path.moves[3].end_mm == Eigen::Vector3d(10, 5, 0));
  for (const PathWarning& w : b.warnings) CHECK(w.message.find("not run") == std::string::npos);
}

TEST_CASE("read_gcode_text: control-flow refusals name the O-word and its line", "[path]") {
  CHECK(error_of(kStart + "o9 call\n") ==
        "part.nc:4: 'O9 call': no 'O9 sub' in the file: the subroutine must be defined in the "
        "same program");
  CHECK(error_of(kStart + "o9 while [1]\nG1 X1\n") ==
        "part.nc:4: 'O9 while': no matching 'endwhile' with the same label after it");
  CHECK(error_of(kStart + "o9 endsub\n") ==
        "part.nc:4: 'O9 endsub': 'endsub' outside a called subroutine");
  CHECK(error_of(kStart + "o9 if\n") == "part.nc:4: 'O9 if': needs one condition in [ ]: O9 if [...]");
  CHECK(error_of(kStart + "o<a> sub\no<a> call\no<a> endsub\no<a> call\n") ==
        "part.nc:5: 'O<a> call': calls nested more than 100 deep: a subroutine that never "
        "returns?");
  CHECK(error_of(kStart + "o9 loop\n") ==
        "part.nc:4: 'O9 loop': unknown O-word keyword: use sub, endsub, call, return, if, elseif, "
        "else, endif, while, endwhile, do, repeat, endrepeat, break or continue");
}

}  // namespace cuspmap

// Tests of RS-274 real values: numbers, parameters and [..] expressions with their operators and
// functions, against values computed by hand from the definitions of RS274NGC v3 (Kramer, Proctor
// & Messina, NIST IR 6556, 2000) §3.3.2.2-3.3.2.5 and §3.3.3.
#include "path/gcode_expression.h"

#include <string>

#include "core/input_error.h"
#include "path/gcode_reader.h"
#include "path/path_test_geometry.h"
#include "test_support.h"

namespace cuspmap {
namespace {

double eval(const std::string& text, const GcodeParameters& p) {
  GcodeValueContext ctx;
  ctx.parameters = &p;
  ctx.file = "part.nc";
  ctx.line = 1;
  std::size_t i = 0;
  std::string written;
  const double v = read_gcode_real(text, i, ctx, written);
  REQUIRE(i == text.size());
  return v;
}

double eval(const std::string& text) { return eval(text, GcodeParameters{}); }

std::string error_of(const std::string& text) {
  return test::input_error_of([&] { eval(text); });
}

}  // namespace

TEST_CASE("read_gcode_real: binary operations and their precedence", "[path]") {
  // RS274NGC v3 §3.3.2.4: power first, then * / MOD, then + -; left to right within a group.
  CHECK(eval("[1 + 2 * 3]") == 7.0);
  CHECK(eval("[2 ** 3 * 2]") == 16.0);
  CHECK(eval("[10 - 4 - 3]") == 3.0);
  CHECK(eval("[12 / 4 / 3]") == 1.0);
  CHECK(eval("[7 MOD 3]") == 1.0);
  CHECK(eval("[[1 + 2] * 3]") == 9.0);
  CHECK(eval("-[2 + 3]") == -5.0);
  // Comparisons give 1 or 0 and bind looser than + -; AND/OR/XOR loosest (common controls'
  // extension of v3, "derived" from their definitions).
  CHECK(eval("[2 GT 1]") == 1.0);
  CHECK(eval("[1 + 1 EQ 2]") == 1.0);
  CHECK(eval("[1 EQ 1 AND 2 LT 1]") == 0.0);
  CHECK(eval("[0 OR 3 GE 3]") == 1.0);
  CHECK(eval("[1 XOR 1]") == 0.0);
}

TEST_CASE("read_gcode_real: unary functions, angles in degrees", "[path]") {
  // RS274NGC v3 §3.3.2.5: arguments and results of the trigonometric functions are in degrees;
  // ATAN takes [y]/[x]; FIX rounds down, FUP up.
  REQUIRE_NEAR(eval("SIN[30]"), 0.5, 1e-15);
  REQUIRE_NEAR(eval("COS[60]"), 0.5, 1e-15);
  REQUIRE_NEAR(eval("TAN[45]"), 1.0, 1e-15);
  REQUIRE_NEAR(eval("ATAN[1]/[1]"), 45.0, 1e-13);
  REQUIRE_NEAR(eval("ATAN[1]/[-1]"), 135.0, 1e-13);
  REQUIRE_NEAR(eval("ACOS[0]"), 90.0, 1e-13);
  REQUIRE_NEAR(eval("ASIN[1]"), 90.0, 1e-13);
  CHECK(eval("SQRT[16]") == 4.0);
  CHECK(eval("ABS[-2.5]") == 2.5);
  CHECK(eval("FIX[-1.5]") == -2.0);
  CHECK(eval("FUP[1.2]") == 2.0);
  CHECK(eval("ROUND[2.4]") == 2.0);
  CHECK(eval("EXP[0]") == 1.0);
  CHECK(eval("LN[1]") == 0.0);
  CHECK(eval("[SQRT[9] * 2]") == 6.0);
}

TEST_CASE("read_gcode_real: numbered and named parameters", "[path]") {
  GcodeParameters p;
  p.set_numbered(1, 2.5);
  p.set_numbered(2, 1.0);
  p.set_named("depth", -0.3);
  p.set_named("_safe", 5.0);
  CHECK(eval("#1", p) == 2.5);
  CHECK(eval("##2", p) == 2.5);  // #2 = 1, so ##2 is #1 (§3.3.2.2 "parameter of a parameter")
  CHECK(eval("#[1 + 1]", p) == 1.0);
  CHECK(eval("[#1 * 2 + #<depth>]", p) == 4.7);
  CHECK(eval("#<_safe>", p) == 5.0);
  CHECK(eval("#< Depth >", p) == -0.3);  // names: spaces dropped, case folded
  CHECK(eval("EXISTS[#<depth>]", p) == 1.0);
  CHECK(eval("EXISTS[#<width>]", p) == 0.0);
  CHECK(eval("#77", p) == 0.0);  // never set: 0 (§3.2.1 initial values)
  // A call's locals hide the caller's, and #1..#30 are restored when it returns.
  p.push_call({7.0});
  CHECK(eval("#1", p) == 7.0);
  CHECK(eval("#2", p) == 0.0);
  CHECK(eval("EXISTS[#<depth>]", p) == 0.0);
  CHECK(eval("#<_safe>", p) == 5.0);
  p.pop_call();
  CHECK(eval("#1", p) == 2.5);
  CHECK(eval("#<depth>", p) == -0.3);
}

TEST_CASE("read_gcode_real: malformed values are refused with the word", "[path]") {
  CHECK(error_of("[1 + 2") == "part.nc:1: '[1+2': an expression needs its closing ']'");
  CHECK(error_of("[SQRT[-1]]") == "part.nc:1: '[SQRT[-1]]': SQRT of a negative value");
  CHECK(error_of("[ASIN[2]]") == "part.nc:1: '[ASIN[2]]': ASIN of a value outside -1..1");
  CHECK(error_of("[1 PLUS 2]") ==
        "part.nc:1: '[1PLUS2]': unknown operation 'PLUS': the binary operations are ** * / MOD "
        "+ - EQ NE GT GE LT LE AND OR XOR");
}

TEST_CASE("read_gcode_text: parameter settings take effect after the line", "[path]") {
  // RS274NGC v3 §3.3.3 example: "#3=15 G1 X#3 #3=6" moves to X15 — all values on a line are
  // read before any setting on it takes effect.
  const BuiltPath b = read_gcode_text(
      "G21 G90 G0 X0 Y0 Z0\n#3 = 15\nG1 X#3 #3=6 F100\nG1 Y#3\n#<r> = [#3 / 2]\nG1 X[#<r> + 1]\n",
      "part.nc", CutSpec{}, test::test_patch(), test::test_ball());
  REQUIRE(b.path.moves.size() == 3);
  CHECK(b.path.moves[0].end_mm.x() == 15.0);
  CHECK(b.path.moves[1].end_mm.y() == 6.0);
  CHECK(b.path.moves[2].end_mm.x() == 4.0);
}

}  // namespace cuspmap

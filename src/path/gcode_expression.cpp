// Real values and [..] expressions of RS-274 words (see gcode_expression.h), by recursive descent
// over the line: precedence ** > * / MOD > + - > comparisons > AND OR XOR, left to right.
// Cost O(characters). Method: RS274NGC v3 (Kramer, Proctor & Messina 2000) §3.3.2.2-3.3.2.5.
#include "path/gcode_expression.h"

#include <algorithm>
#include <charconv>
#include <cmath>
#include <numbers>

#include "path/gcode_chars.h"
#include "path/gcode_lexer.h"

namespace cuspmap {
namespace {

// §3.3.2.5 compares to an integer within 0.0001 (FIX/FUP/ROUND and parameter numbers); logic
// operations treat a value as true when it is not zero.
constexpr double kIntegerTolerance = 1e-4;
constexpr double kDegPerRad = 180.0 / std::numbers::pi;

class ExprReader {
 public:
  ExprReader(std::string_view s, std::size_t& i, const GcodeValueContext& ctx)
      : s_(s), i_(i), ctx_(ctx),
        start_(ctx.word_start != std::string_view::npos ? ctx.word_start : i) {}

  double real() {
    skip_gcode_spaces(s_, i_);
    if (i_ < s_.size() && (s_[i_] == '+' || s_[i_] == '-')) {
      const bool neg = s_[i_++] == '-';
      const double v = real();
      return neg ? -v : v;
    }
    if (i_ >= s_.size()) fail("a value is missing");
    const char c = s_[i_];
    if (c == '[') return bracket();
    if (c == '#') return parameter();
    if (gcode_is_digit(c) || c == '.') return number();
    if (gcode_is_letter(c)) return function();
    fail("a number, #parameter, [expression] or function is expected here");
  }

  GcodeParameterRef reference() {
    ++i_;  // the '#'
    skip_gcode_spaces(s_, i_);
    GcodeParameterRef ref;
    if (i_ < s_.size() && s_[i_] == '<') {
      ++i_;
      while (i_ < s_.size() && s_[i_] != '>') {
        const char c = s_[i_++];
        if (c == ' ' || c == '\t') continue;
        ref.name.push_back((c >= 'A' && c <= 'Z') ? static_cast<char>(c - 'A' + 'a') : c);
      }
      if (i_ >= s_.size()) fail("a named parameter needs its closing '>'");
      ++i_;
      if (ref.name.empty()) fail("a named parameter needs a name between '<' and '>'");
      return ref;
    }
    const double v = real();
    const double r = std::round(v);
    if (ctx_.parameters &&
        (std::abs(v - r) > kIntegerTolerance || r < 0 || r >= kGcodeParameterCount)) {
      fail("parameter numbers are whole numbers from 0 to 5399 (RS274NGC v3 section 3.2.1)");
    }
    ref.number = ctx_.parameters ? static_cast<int>(r) : 0;
    return ref;
  }

  [[noreturn]] void fail(std::string_view why) const {
    // The word runs from its letter to where its brackets close (or the line ends).
    std::string word;
    int depth = 0;
    for (std::size_t k = start_; k < s_.size(); ++k) {
      if (k >= std::max(i_, start_ + 1) && depth <= 0) break;
      depth += s_[k] == '[' ? 1 : s_[k] == ']' ? -1 : 0;
      if (s_[k] != ' ' && s_[k] != '\t') word.push_back(s_[k]);
    }
    throw_gcode_error(ctx_.file, ctx_.line, word, why);
  }

 private:
  bool evaluating() const { return ctx_.parameters != nullptr; }

  double number() {
    std::string digits;
    while (i_ < s_.size() && (gcode_is_digit(s_[i_]) || s_[i_] == '.' || s_[i_] == ' ' || s_[i_] == '\t')) {
      if (s_[i_] != ' ' && s_[i_] != '\t') digits.push_back(s_[i_]);
      ++i_;
    }
    double v = 0.0;
    const auto [p, ec] = std::from_chars(digits.data(), digits.data() + digits.size(), v);
    if (ec != std::errc() || p != digits.data() + digits.size() || digits == ".") {
      fail("malformed number");
    }
    return v;
  }

  double parameter() {
    const GcodeParameterRef ref = reference();
    if (!evaluating()) return 0.0;
    if (ref.number >= 0) return ctx_.parameters->numbered(ref.number);
    const std::optional<double> v = ctx_.parameters->named(ref.name);
    if (!v) fail("parameter #<" + ref.name + "> is read before it is set");
    return *v;
  }

  double bracket() {
    ++i_;  // '['
    const double v = expression(0);
    skip_gcode_spaces(s_, i_);
    if (i_ >= s_.size() || s_[i_] != ']') fail("an expression needs its closing ']'");
    ++i_;
    return v;
  }

  // Operator at the cursor, without consuming it: precedence (1 loosest .. 5 tightest), or 0.
  int peek_operator(std::string& name) {
    skip_gcode_spaces(s_, i_);
    name.clear();
    if (i_ >= s_.size()) return 0;
    const char c = s_[i_];
    if (c == '*') {
      const bool power = i_ + 1 < s_.size() && s_[i_ + 1] == '*';
      name.assign(power ? 2 : 1, '*');
      return power ? 5 : 4;
    }
    if (c == '/' || c == '+' || c == '-') {
      name.assign(1, c);
      return c == '/' ? 4 : 3;
    }
    if (!gcode_is_letter(c)) return 0;
    std::size_t j = i_;
    while (j < s_.size() && gcode_is_letter(s_[j])) name.push_back(gcode_upper(s_[j++]));
    if (name == "MOD") return 4;
    if (name == "EQ" || name == "NE" || name == "GT" || name == "GE" || name == "LT" ||
        name == "LE") {
      return 2;
    }
    if (name == "AND" || name == "OR" || name == "XOR") return 1;
    i_ = j;
    fail("unknown operation '" + name + "': the binary operations are ** * / MOD + - EQ NE GT "
         "GE LT LE AND OR XOR");
  }

  // Precedence climbing; ** is taken left to right like the other groups (§3.3.2.4).
  double expression(int min_prec) {
    double lhs = real();
    std::string op;
    for (;;) {
      const int prec = peek_operator(op);
      if (prec == 0 || prec <= min_prec) return lhs;
      i_ += op.size();
      const double rhs = expression(prec);
      lhs = apply(op, lhs, rhs);
    }
  }

  double apply(const std::string& op, double a, double b) {
    if (op == "**") {
      const double v = std::pow(a, b);
      if (evaluating() && !std::isfinite(v)) fail("power out of range (a negative base needs a whole exponent)");
      return v;
    }
    if (op == "*") return a * b;
    if (op == "/" || op == "MOD") {
      if (b == 0.0) {
        if (evaluating()) fail("division by zero");
        return 0.0;
      }
      if (op == "/") return a / b;
      const double m = std::fmod(a, b);  // result takes the divisor's sign, as a modulus
      return (m != 0.0 && ((m < 0) != (b < 0))) ? m + b : m;
    }
    if (op == "+") return a + b;
    if (op == "-") return a - b;
    if (op == "EQ") return a == b;
    if (op == "NE") return a != b;
    if (op == "GT") return a > b;
    if (op == "GE") return a >= b;
    if (op == "LT") return a < b;
    if (op == "LE") return a <= b;
    if (op == "AND") return (a != 0.0) && (b != 0.0);
    if (op == "OR") return (a != 0.0) || (b != 0.0);
    return (a != 0.0) != (b != 0.0);  // XOR
  }

  double function() {
    std::string name;
    while (i_ < s_.size() && gcode_is_letter(s_[i_])) name.push_back(gcode_upper(s_[i_++]));
    skip_gcode_spaces(s_, i_);
    if (name == "EXISTS") {
      if (i_ + 1 >= s_.size() || s_[i_] != '[') fail("EXISTS takes [#<name>]");
      ++i_;
      skip_gcode_spaces(s_, i_);
      if (i_ >= s_.size() || s_[i_] != '#') fail("EXISTS takes [#<name>]");
      const GcodeParameterRef ref = reference();
      skip_gcode_spaces(s_, i_);
      if (i_ >= s_.size() || s_[i_] != ']') fail("an expression needs its closing ']'");
      ++i_;
      if (!evaluating()) return 0.0;
      return ref.number >= 0 || ctx_.parameters->named(ref.name).has_value() ? 1.0 : 0.0;
    }
    static constexpr std::string_view kNames[] = {"ABS", "ACOS", "ASIN", "ATAN", "COS", "EXP",
                                                  "FIX", "FUP", "LN", "ROUND", "SIN", "SQRT",
                                                  "TAN"};
    bool known = false;
    for (std::string_view n : kNames) known = known || n == name;
    if (!known) {
      fail("unknown function '" + name + "': RS274NGC v3 section 3.3.2.5 lists ABS ACOS ASIN "
           "ATAN COS EXP FIX FUP LN ROUND SIN SQRT TAN");
    }
    if (i_ >= s_.size() || s_[i_] != '[') fail(name + " needs its argument in [ ]");
    const double x = bracket();
    if (name == "ATAN") {
      skip_gcode_spaces(s_, i_);
      if (i_ >= s_.size() || s_[i_] != '/') fail("ATAN is written ATAN[y]/[x]");
      ++i_;
      skip_gcode_spaces(s_, i_);
      if (i_ >= s_.size() || s_[i_] != '[') fail("ATAN is written ATAN[y]/[x]");
      return std::atan2(x, bracket()) * kDegPerRad;
    }
    const bool check = evaluating();
    if (name == "ABS") return std::abs(x);
    if (name == "ACOS" || name == "ASIN") {
      if (check && std::abs(x) > 1.0) fail(name + " of a value outside -1..1");
      return (name == "ACOS" ? std::acos(std::clamp(x, -1.0, 1.0))
                             : std::asin(std::clamp(x, -1.0, 1.0))) * kDegPerRad;
    }
    if (name == "COS") return std::cos(x / kDegPerRad);
    if (name == "SIN") return std::sin(x / kDegPerRad);
    if (name == "TAN") return std::tan(x / kDegPerRad);
    if (name == "EXP") {
      const double v = std::exp(x);
      if (check && !std::isfinite(v)) fail("EXP out of range");
      return v;
    }
    if (name == "FIX") return std::floor(x);
    if (name == "FUP") return std::ceil(x);
    if (name == "ROUND") return std::round(x);
    if (name == "LN") {
      if (check && !(x > 0.0)) fail("LN of a value <= 0");
      return x > 0.0 ? std::log(x) : 0.0;
    }
    if (check && x < 0.0) fail("SQRT of a negative value");
    return x > 0.0 ? std::sqrt(x) : 0.0;
  }

  std::string_view s_;
  std::size_t& i_;
  const GcodeValueContext& ctx_;
  std::size_t start_;
};

}  // namespace

void skip_gcode_spaces(std::string_view s, std::size_t& i) {
  while (i < s.size() && (s[i] == ' ' || s[i] == '\t')) ++i;
}

double read_gcode_real(std::string_view s, std::size_t& i, const GcodeValueContext& ctx,
                       std::string& text) {
  const std::size_t start = i;
  ExprReader reader(s, i, ctx);
  const double v = reader.real();
  for (std::size_t k = start; k < i; ++k) {
    if (s[k] != ' ' && s[k] != '\t') text.push_back(s[k]);
  }
  if (ctx.parameters && !std::isfinite(v)) reader.fail("the value is not a finite number");
  return v;
}

GcodeParameterRef read_gcode_parameter_ref(std::string_view s, std::size_t& i,
                                           const GcodeValueContext& ctx, std::string& text) {
  const std::size_t start = i;
  ExprReader reader(s, i, ctx);
  GcodeParameterRef ref = reader.reference();
  for (std::size_t k = start; k < i; ++k) {
    if (s[k] != ' ' && s[k] != '\t') text.push_back(s[k]);
  }
  return ref;
}

}  // namespace cuspmap

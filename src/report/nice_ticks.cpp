// 1-2-5 tick steps, ticks in a range, scale-bar lengths and fixed-point labels.
// Inputs: ranges in any one unit; outputs: values in that unit, strings.
// Method: Heckbert 1990 nice numbers; std::to_chars for locale-free formatting.
#include "report/nice_ticks.h"

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>

namespace cuspmap {
namespace {

// Ticks this close to an end (relative to the step) still count as inside: covers the rounding
// of lo/step and hi/step, which is a few ulps, with a wide margin.
constexpr double kTickSlack = 1e-9;
constexpr std::array<double, 3> kMantissas = {1.0, 2.0, 5.0};

}  // namespace

double nice_step(double span, int max_intervals) {
  if (!(span > 0.0) || !std::isfinite(span)) return 1.0;
  const double raw = span / std::max(max_intervals, 1);
  const double magnitude = std::pow(10.0, std::floor(std::log10(raw)));
  for (double m : kMantissas) {
    if (m * magnitude >= raw * (1.0 - kTickSlack)) return m * magnitude;
  }
  return 10.0 * magnitude;
}

std::vector<double> nice_ticks(double lo, double hi, int max_intervals) {
  if (!std::isfinite(lo) || !std::isfinite(hi) || hi < lo) return {};
  if (hi == lo) return {lo};
  const double step = nice_step(hi - lo, max_intervals);
  const long first = static_cast<long>(std::ceil(lo / step - kTickSlack));
  const long last = static_cast<long>(std::floor(hi / step + kTickSlack));
  std::vector<double> ticks;
  for (long k = first; k <= last; ++k) ticks.push_back(static_cast<double>(k) * step);
  return ticks;
}

double nice_length_at_most(double max_length) {
  if (!(max_length > 0.0) || !std::isfinite(max_length)) return 0.0;
  const double magnitude = std::pow(10.0, std::floor(std::log10(max_length)));
  double best = magnitude;
  for (double m : kMantissas) {
    if (m * magnitude <= max_length * (1.0 + kTickSlack)) best = m * magnitude;
  }
  return best;
}

int decimals_for_step(double step) {
  if (!(step > 0.0) || !std::isfinite(step) || step >= 1.0 - kTickSlack) return 0;
  return static_cast<int>(std::ceil(-std::log10(step) - kTickSlack));
}

std::string format_fixed(double value, int decimals) {
  if (std::isnan(value)) return "nan";
  char buf[64];
  const double v = value == 0.0 ? 0.0 : value;  // drop the sign of -0
  const auto [ptr, ec] = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::fixed,
                                       std::clamp(decimals, 0, 12));
  std::string s = ec == std::errc() ? std::string(buf, ptr) : std::string("?");
  // "-0.00" for tiny negatives rounds to zero: print it without the sign.
  if (s.front() == '-' && s.find_first_not_of("-0.") == std::string::npos) s.erase(0, 1);
  return s;
}

std::string format_significant(double value, int digits) {
  if (std::isnan(value)) return "nan";
  if (value == 0.0 || !std::isfinite(value)) return format_fixed(value, 0);
  const int magnitude = static_cast<int>(std::floor(std::log10(std::abs(value))));
  return format_fixed(value, std::max(0, std::max(digits, 1) - 1 - magnitude));
}

}  // namespace cuspmap

// Human text for heights, stocks, lengths, cut-offs, areas, volumes and durations: three
// significant figures, resolution floors, mm/um or in/uin/thou (see display_quantity.h).
// Method: ISO 80000-1 Annex B rounding; exact inch factors; ASME B46.1 inch cut-offs.
#include "core/display_quantity.h"

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>

namespace cuspmap {
namespace {

// Resolution floors: below these a value is numerical noise (a plane fit leaves Ra 2e-15 um on
// a flat floor), not a mark anyone could measure, so it reads 0.
constexpr double kHeightFloorUm = 1e-4;      // 0.1 nm: below atomic steps
constexpr double kLengthFloorMm = 1e-7;      // 0.1 nm
constexpr double kAreaFloorMm2 = 1e-9;       // (30 nm)^2
constexpr double kVolumeFloorMm3 = 1e-12;    // 1 um^2 x 1 um
constexpr double kTimeFloorS = 1e-3;         // below a millisecond no time is worth stating
constexpr double kThouPerUm = 1.0 / 25.4;    // 1 thou = 0.001 in = 25.4 um exactly

// ISO 4288 cut-offs (mm) and the inch values ASME B46.1 pairs with them.
constexpr std::array<std::array<double, 2>, 5> kInchCutoffs{{
    {0.08, 0.003}, {0.25, 0.01}, {0.8, 0.03}, {2.5, 0.1}, {8.0, 0.3}}};

// `value` rounded to `digits` significant figures in fixed notation (locale-free).
std::string significant(double value, int digits) {
  const int magnitude = static_cast<int>(std::floor(std::log10(std::abs(value))));
  const int decimals = std::clamp(digits - 1 - magnitude, 0, 15);
  char buf[64];
  const auto [ptr, ec] =
      std::to_chars(buf, buf + sizeof buf, value, std::chars_format::fixed, decimals);
  std::string s = ec == std::errc() ? std::string(buf, ptr) : std::string("?");
  // A value that rounds to zero at these decimals prints without a sign.
  if (s.front() == '-' && s.find_first_not_of("-0.") == std::string::npos) s.erase(0, 1);
  return s;
}

std::string strip_zeros(std::string s) {
  if (s.find('.') == std::string::npos) return s;
  while (!s.empty() && s.back() == '0') s.pop_back();
  if (!s.empty() && s.back() == '.') s.pop_back();
  return s;
}

}  // namespace

std::string display_number(double value, double floor, int digits) {
  if (std::isnan(value)) return "nan";
  if (std::isinf(value)) return value > 0 ? "inf" : "-inf";
  if (std::abs(value) < floor || value == 0.0) return "0";
  return strip_zeros(significant(value, digits));
}

const char* roughness_symbol(LengthUnit unit) { return unit == LengthUnit::Inch ? "uin" : "um"; }

const char* length_symbol(LengthUnit unit) { return unit == LengthUnit::Inch ? "in" : "mm"; }

std::string display_roughness_number(double um, LengthUnit unit) {
  const double k = unit == LengthUnit::Inch ? kUinPerUm : 1.0;
  return display_number(um * k, kHeightFloorUm * k);
}

std::string display_length_number(double mm, LengthUnit unit) {
  const double k = unit == LengthUnit::Inch ? 1.0 / kMmPerInch : 1.0;
  return display_number(mm * k, kLengthFloorMm * k);
}

std::string display_roughness(double um, LengthUnit unit) {
  return display_roughness_number(um, unit) + " " + roughness_symbol(unit);
}

std::string display_stock(double um, LengthUnit unit) {
  if (unit == LengthUnit::Inch) {
    return display_number(um * kThouPerUm, kHeightFloorUm * kThouPerUm) + " thou";
  }
  return display_number(um, kHeightFloorUm) + " um";
}

std::string display_length(double mm, LengthUnit unit) {
  return display_length_number(mm, unit) + " " + length_symbol(unit);
}

std::string display_cutoff(double mm, LengthUnit unit) {
  const std::string metric = display_number(mm, kLengthFloorMm) + " mm";
  if (unit != LengthUnit::Inch) return metric;
  for (const auto& [iso_mm, inch] : kInchCutoffs) {
    if (std::abs(mm - iso_mm) <= 1e-9 * iso_mm) {
      return metric + " (" + display_number(inch, 0.0) + " in)";
    }
  }
  return metric + " (" + display_length(mm, unit) + ")";
}

std::string display_area(double mm2, LengthUnit unit) {
  if (unit == LengthUnit::Inch) {
    const double k = 1.0 / (kMmPerInch * kMmPerInch);
    return display_number(mm2 * k, kAreaFloorMm2 * k) + " in^2";
  }
  return display_number(mm2, kAreaFloorMm2) + " mm^2";
}

std::string display_volume(double mm3, LengthUnit unit) {
  if (unit == LengthUnit::Inch) {
    const double k = 1.0 / (kMmPerInch * kMmPerInch * kMmPerInch);
    return display_number(mm3 * k, kVolumeFloorMm3 * k) + " in^3";
  }
  return display_number(mm3, kVolumeFloorMm3) + " mm^3";
}

TimeUnit time_unit_for(double max_seconds) {
  if (!(max_seconds >= 120.0)) return TimeUnit::Second;
  if (max_seconds < 7200.0) return TimeUnit::Minute;
  return TimeUnit::Hour;
}

TimeUnit time_unit_for(const std::vector<double>& seconds) {
  double most = 0.0;
  for (double s : seconds) {
    if (std::isfinite(s)) most = std::max(most, s);
  }
  return time_unit_for(most);
}

const char* time_unit_symbol(TimeUnit unit) {
  return unit == TimeUnit::Hour ? "h" : unit == TimeUnit::Minute ? "min" : "s";
}

std::string display_time_number(double seconds, TimeUnit unit) {
  const double per = unit == TimeUnit::Hour ? 3600.0 : unit == TimeUnit::Minute ? 60.0 : 1.0;
  return display_number(seconds / per, kTimeFloorS / per);
}

std::string display_time(double seconds, TimeUnit unit) {
  return display_time_number(seconds, unit) + " " + time_unit_symbol(unit);
}

std::string display_time(double seconds) { return display_time(seconds, time_unit_for(seconds)); }

}  // namespace cuspmap

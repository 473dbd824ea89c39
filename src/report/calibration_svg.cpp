// Calibration chart: measured vs predicted Ra before and after the shop correction (SVG text).
// Method: SVG 1.1 (W3C, 2011); 1-2-5 ticks (Heckbert 1990, report/nice_ticks).
#include "report/calibration_svg.h"

#include <algorithm>
#include <cmath>

#include "report/html_report.h"
#include "report/nice_ticks.h"

namespace cuspmap {
namespace {

// Plot margins, px: room for tick labels on the left/bottom and the key on top.
constexpr double kLeftPx = 70.0, kRightPx = 24.0, kTopPx = 70.0, kBottomPx = 56.0;

std::string f1(double v) { return format_fixed(v, 1); }

}  // namespace

std::string encode_calibration_svg(const std::vector<CalibrationPoint>& points,
                                   const ShopCalibration& cal, const CalibrationSvgOptions& o) {
  const double w = o.width_px, h = o.height_px;
  const double k = o.unit == LengthUnit::Inch ? kUinPerUm : 1.0;  // um -> display unit
  const char* unit = o.unit == LengthUnit::Inch ? "uin" : "um";
  double hi = 0.0;
  for (const CalibrationPoint& p : points) {
    hi = std::max({hi, p.predicted_um, p.measured_um,
                   apply_shop_calibration(cal, p.predicted_um).value_um});
  }
  hi = hi > 0.0 ? hi * k * 1.08 : 1.0;
  const std::vector<double> ticks = nice_ticks(0.0, hi, 6);
  hi = std::max(hi, ticks.empty() ? hi : ticks.back());
  const double x0 = kLeftPx, x1 = w - kRightPx, y0 = kTopPx, y1 = h - kBottomPx;
  auto X = [&](double v) { return x0 + v * k / hi * (x1 - x0); };
  auto Y = [&](double v) { return y1 - v * k / hi * (y1 - y0); };
  const int dec = ticks.size() > 1 ? decimals_for_step(ticks[1] - ticks[0]) : 2;

  std::string s = "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n"
                  "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"" +
                  std::to_string(o.width_px) + "\" height=\"" + std::to_string(o.height_px) +
                  "\" viewBox=\"0 0 " + std::to_string(o.width_px) + " " +
                  std::to_string(o.height_px) +
                  "\" font-family=\"sans-serif\" font-size=\"12\">\n"
                  "<rect width=\"100%\" height=\"100%\" fill=\"white\"/>\n";
  s += "<text x=\"" + f1(x0) + "\" y=\"24\" font-size=\"16\">" + html_escape(o.title) + "</text>\n";
  // Key, one line, inside the picture.
  s += "<circle cx=\"" + f1(x0 + 6) + "\" cy=\"46\" r=\"4\" fill=\"none\" stroke=\"#c2491d\"/>"
       "<text x=\"" + f1(x0 + 16) + "\" y=\"50\">kinematic (before)</text>\n";
  s += "<circle cx=\"" + f1(x0 + 156) + "\" cy=\"46\" r=\"4\" fill=\"#1f5fa8\"/><text x=\"" +
       f1(x0 + 166) + "\" y=\"50\">calibrated (after)</text>\n";
  s += "<line x1=\"" + f1(x0 + 300) + "\" y1=\"46\" x2=\"" + f1(x0 + 324) +
       "\" y2=\"46\" stroke=\"#777\" stroke-dasharray=\"4 3\"/><text x=\"" + f1(x0 + 330) +
       "\" y=\"50\">1:1</text>\n";
  // Axes and ticks.
  s += "<g stroke=\"#ccc\">";
  for (double t : ticks) {
    const double xt = x0 + t / hi * (x1 - x0), yt = y1 - t / hi * (y1 - y0);
    s += "<line x1=\"" + f1(xt) + "\" y1=\"" + f1(y0) + "\" x2=\"" + f1(xt) + "\" y2=\"" + f1(y1) +
         "\"/><line x1=\"" + f1(x0) + "\" y1=\"" + f1(yt) + "\" x2=\"" + f1(x1) + "\" y2=\"" +
         f1(yt) + "\"/>";
  }
  s += "</g>\n<g fill=\"#333\">";
  for (double t : ticks) {
    const double xt = x0 + t / hi * (x1 - x0), yt = y1 - t / hi * (y1 - y0);
    s += "<text x=\"" + f1(xt) + "\" y=\"" + f1(y1 + 16) + "\" text-anchor=\"middle\">" +
         format_fixed(t, dec) + "</text><text x=\"" + f1(x0 - 6) + "\" y=\"" + f1(yt + 4) +
         "\" text-anchor=\"end\">" + format_fixed(t, dec) + "</text>";
  }
  s += "</g>\n";
  s += "<text x=\"" + f1((x0 + x1) / 2) + "\" y=\"" + f1(h - 14) +
       "\" text-anchor=\"middle\">predicted Ra, " + unit + "</text>\n";
  s += "<text transform=\"translate(18 " + f1((y0 + y1) / 2) +
       ") rotate(-90)\" text-anchor=\"middle\">measured Ra, " + unit + "</text>\n";
  s += "<rect x=\"" + f1(x0) + "\" y=\"" + f1(y0) + "\" width=\"" + f1(x1 - x0) + "\" height=\"" +
       f1(y1 - y0) + "\" fill=\"none\" stroke=\"#333\"/>\n";
  // 1:1 line and the fitted line measured = floor + scale x predicted, clipped to the plot.
  const double top_um = hi / k;
  s += "<line x1=\"" + f1(X(0)) + "\" y1=\"" + f1(Y(0)) + "\" x2=\"" + f1(X(top_um)) +
       "\" y2=\"" + f1(Y(top_um)) + "\" stroke=\"#777\" stroke-dasharray=\"4 3\"/>\n";
  const double pa = std::clamp(-cal.floor_um / cal.scale, 0.0, top_um);
  const double pb = std::clamp((top_um - cal.floor_um) / cal.scale, 0.0, top_um);
  s += "<line x1=\"" + f1(X(pa)) + "\" y1=\"" + f1(Y(cal.floor_um + cal.scale * pa)) +
       "\" x2=\"" + f1(X(pb)) + "\" y2=\"" + f1(Y(cal.floor_um + cal.scale * pb)) +
       "\" stroke=\"#c2491d\"/>\n";
  for (const CalibrationPoint& p : points) {
    const double c = apply_shop_calibration(cal, p.predicted_um).value_um;
    s += "<circle cx=\"" + f1(X(p.predicted_um)) + "\" cy=\"" + f1(Y(p.measured_um)) +
         "\" r=\"4\" fill=\"none\" stroke=\"#c2491d\"/><circle cx=\"" + f1(X(c)) + "\" cy=\"" +
         f1(Y(p.measured_um)) + "\" r=\"4\" fill=\"#1f5fa8\"/>\n";
  }
  return s + "</svg>\n";
}

}  // namespace cuspmap

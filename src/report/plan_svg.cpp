// SVG chart of a stepover plan: total, machine and bench cost against stepover (log axis) per
// tool, spec misses hollow, the best option ringed. Pure text encoder. O(options).
// Method: SVG 1.1 (W3C, 2011); 1-2-5 tick series on both axes; direct series labels pushed
// apart in y (greedy one-dimensional label placement), legend text wrapped to the panel.
#include "report/plan_svg.h"

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <limits>
#include <string_view>
#include <vector>

#include "core/display_quantity.h"
#include "core/units.h"
#include "report/html_report.h"

namespace cuspmap {
namespace {

// Layout of the chart, px.
constexpr double kLeftPx = 72.0, kRightPx = 230.0, kTopPx = 48.0, kBottomPx = 56.0;
// Tool colours: a qualitative palette chosen for contrast on white (no outside scheme).
constexpr double kCharEm = kPlanSvgCharEm;
constexpr double kFontPx = 12.0;     // the document's font size
constexpr double kLinePitchPx = 16.0;  // legend and label line pitch at kFontPx
// Vertical offset between the lines of successive tools, px: lines of equal cost (two tools'
// bench costs when neither needs sanding) lie side by side instead of one hiding the other.
constexpr double kSeriesOffsetPx = 3.0;
constexpr std::array<const char*, 6> kColours = {"#1f5fa8", "#c2491d", "#2e8b3a",
                                                 "#7b3fa0", "#8a6d1d", "#2a8a8a"};

std::string num(double v, int decimals = 1) {
  char buf[64];
  const auto r = std::to_chars(buf, buf + sizeof buf, v, std::chars_format::fixed, decimals);
  return std::string(buf, r.ptr);
}

// Step of a 1-2-5 series giving about `target` intervals over `span`.
double nice_step(double span, double target) {
  const double raw = span / target;
  const double mag = std::pow(10.0, std::floor(std::log10(raw)));
  for (const double m : {1.0, 2.0, 5.0, 10.0}) {
    if (m * mag >= raw) return m * mag;
  }
  return 10.0 * mag;
}

// Splits text at spaces into lines no wider than max_px (a single longer word is cut with "...").
std::vector<std::string> wrap_text(const std::string& text, double max_px, double font_px) {
  const auto max_chars =
      static_cast<std::size_t>(std::max(4.0, std::floor(max_px / (kCharEm * font_px))));
  std::vector<std::string> lines;
  std::string line;
  std::size_t start = 0;
  while (start <= text.size()) {
    std::size_t end = text.find(' ', start);
    if (end == std::string::npos) end = text.size();
    std::string word = text.substr(start, end - start);
    if (word.size() > max_chars) word = word.substr(0, max_chars - 3) + "...";
    if (!line.empty() && line.size() + 1 + word.size() > max_chars) {
      lines.push_back(line);
      line.clear();
    }
    line += (line.empty() ? "" : " ") + word;
    start = end + 1;
  }
  if (!line.empty()) lines.push_back(line);
  return lines;
}

// Pushes label centres apart to at least `gap` while keeping them inside [lo, hi]: sorted, then
// a forward pass (down from lo), then a backward pass (up from hi).
std::vector<double> spread_labels(std::vector<double> y, double gap, double lo, double hi) {
  std::vector<std::size_t> order(y.size());
  for (std::size_t k = 0; k < order.size(); ++k) order[k] = k;
  std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return y[a] < y[b]; });
  double next = lo;
  for (const std::size_t k : order) {
    y[k] = std::max(y[k], next);
    next = y[k] + gap;
  }
  double limit = hi;
  for (auto it = order.rbegin(); it != order.rend(); ++it) {
    y[*it] = std::min(y[*it], limit);
    limit = y[*it] - gap;
  }
  return y;
}

struct Axes {
  double x0, x1, y0, y1;           // plot rectangle, px
  double log_lo, log_hi, cost_hi;  // data ranges
  double x(double stepover_mm) const {
    return x0 + (std::log10(stepover_mm) - log_lo) / (log_hi - log_lo) * (x1 - x0);
  }
  double y(double cost) const { return y1 - std::min(cost, cost_hi * 1.02) / cost_hi * (y1 - y0); }
};

}  // namespace

std::string encode_plan_svg(const PlanResult& plan, const PlanSvgOptions& o) {
  const double w = o.width_px, h = o.height_px;
  std::string svg =
      "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<svg xmlns=\"http://www.w3.org/2000/svg\" "
      "width=\"" +
      std::to_string(o.width_px) + "\" height=\"" + std::to_string(o.height_px) +
      "\" viewBox=\"0 0 " + std::to_string(o.width_px) + " " + std::to_string(o.height_px) +
      "\" font-family=\"sans-serif\" font-size=\"12\">\n"
      "<rect width=\"100%\" height=\"100%\" fill=\"white\"/>\n"
      "<text x=\"" +
      num(kLeftPx) + "\" y=\"26\" font-size=\"16\">" + html_escape(o.title) + "</text>\n";
  if (plan.options.empty()) {
    return svg + "<text x=\"" + num(kLeftPx) + "\" y=\"" + num(h / 2) +
           "\">no options to show</text>\n</svg>\n";
  }
  // One colour per tool label, in order of first appearance.
  std::vector<std::string> tools;
  for (const PlanOption& p : plan.options) {
    if (std::find(tools.begin(), tools.end(), p.tool) == tools.end()) tools.push_back(p.tool);
  }
  double s_lo = std::numeric_limits<double>::infinity(), s_hi = 0.0, max_total = 0.0;
  // The chart's top: clip_factor x the largest per-tool minimum, so every tool's valley shows.
  double valley_top = 0.0;
  for (const std::string& tool : tools) {
    double tool_min = std::numeric_limits<double>::infinity();
    for (const PlanOption& p : plan.options) {
      if (p.tool == tool) tool_min = std::min(tool_min, p.cost);
    }
    valley_top = std::max(valley_top, tool_min);
  }
  for (const PlanOption& p : plan.options) {
    s_lo = std::min(s_lo, p.stepover_mm);
    s_hi = std::max(s_hi, p.stepover_mm);
    max_total = std::max(max_total, p.cost);
  }
  if (s_hi <= s_lo * 1.0001) {
    s_lo /= 1.5;
    s_hi *= 1.5;
  }
  double cost_hi = valley_top > 0.0 ? std::min(max_total, o.clip_factor * valley_top) : max_total;
  if (!(cost_hi > 0.0)) cost_hi = 1.0;
  const double pad = 0.04 * (std::log10(s_hi) - std::log10(s_lo));
  const Axes ax{kLeftPx,
                w - kRightPx,
                kTopPx,
                h - kBottomPx,
                std::log10(s_lo) - pad,
                std::log10(s_hi) + pad,
                nice_step(cost_hi, 5.0) * std::ceil(cost_hi / nice_step(cost_hi, 5.0))};
  const double unit = o.inch ? kMmPerInch : 1.0;  // mm per axis unit

  // Grid, ticks and axis labels.
  svg += "<g stroke=\"#dddddd\" stroke-width=\"1\">\n";
  std::string labels;
  const double cstep = nice_step(ax.cost_hi, 5.0);
  for (double c = 0.0; c <= ax.cost_hi * 1.0001; c += cstep) {
    svg += "<line x1=\"" + num(ax.x0) + "\" x2=\"" + num(ax.x1) + "\" y1=\"" + num(ax.y(c)) +
           "\" y2=\"" + num(ax.y(c)) + "\"/>\n";
    labels += "<text x=\"" + num(ax.x0 - 6) + "\" y=\"" + num(ax.y(c) + 4) +
              "\" text-anchor=\"end\">" + format_number(c) + "</text>\n";
  }
  const double log_unit = std::log10(unit);
  for (int dec = static_cast<int>(std::floor(ax.log_lo - log_unit)) - 1;
       dec <= static_cast<int>(std::ceil(ax.log_hi - log_unit)); ++dec) {
    for (const double m : {1.0, 2.0, 5.0}) {
      const double v = m * std::pow(10.0, dec) * unit;  // tick value in axis units -> mm
      const double lv = std::log10(v);
      if (lv < ax.log_lo || lv > ax.log_hi) continue;
      svg += "<line x1=\"" + num(ax.x(v)) + "\" x2=\"" + num(ax.x(v)) + "\" y1=\"" + num(ax.y0) +
             "\" y2=\"" + num(ax.y1) + "\"/>\n";
      labels += "<text x=\"" + num(ax.x(v)) + "\" y=\"" + num(ax.y1 + 16) +
                "\" text-anchor=\"middle\">" + format_number(v / unit) + "</text>\n";
    }
  }
  svg += "</g>\n" + labels;
  svg += "<rect x=\"" + num(ax.x0) + "\" y=\"" + num(ax.y0) + "\" width=\"" + num(ax.x1 - ax.x0) +
         "\" height=\"" + num(ax.y1 - ax.y0) + "\" fill=\"none\" stroke=\"#444444\"/>\n";
  svg += "<text x=\"" + num(0.5 * (ax.x0 + ax.x1)) + "\" y=\"" + num(h - 14) +
         "\" text-anchor=\"middle\">stepover (" + (o.inch ? "in" : "mm") + ", log scale)</text>\n";
  svg +=
      "<text transform=\"translate(18 " + num(0.5 * (ax.y0 + ax.y1)) +
      ") rotate(-90)\" text-anchor=\"middle\">cost (machine + bench, at the given rates)</text>\n";
  svg += "<clipPath id=\"plot\"><rect x=\"" + num(ax.x0) + "\" y=\"" + num(ax.y0 - 4) +
         "\" width=\"" + num(ax.x1 - ax.x0) + "\" height=\"" + num(ax.y1 - ax.y0 + 8) +
         "\"/></clipPath>\n<g clip-path=\"url(#plot)\" fill=\"none\">\n";

  // Where each tool's total line ends (its label's anchor), px.
  std::vector<double> end_y(tools.size(), 0.0);
  for (std::size_t t = 0; t < tools.size(); ++t) {
    const std::string colour = kColours[t % kColours.size()];
    const double dy = (static_cast<double>(t) - 0.5 * static_cast<double>(tools.size() - 1)) *
                      kSeriesOffsetPx;
    std::string total, machine, bench, dots;
    for (const PlanOption& p : plan.options) {
      if (p.tool != tools[t]) continue;
      const std::string x = num(ax.x(p.stepover_mm));
      total += x + "," + num(ax.y(p.cost) + dy) + " ";
      machine += x + "," + num(ax.y(p.machine_cost) + dy) + " ";
      bench += x + "," + num(ax.y(p.bench_cost) + dy) + " ";
      dots += "<circle cx=\"" + x + "\" cy=\"" + num(ax.y(p.cost) + dy) + "\" r=\"3.5\" stroke=\"" +
              colour + "\" fill=\"" + (p.meets_spec ? colour : std::string("white")) + "\"/>\n";
      end_y[t] = ax.y(p.cost) + dy;
    }
    svg += "<polyline points=\"" + machine + "\" stroke=\"" + colour +
           "\" stroke-width=\"1.3\" stroke-dasharray=\"7 4\"/>\n";
    svg += "<polyline points=\"" + bench + "\" stroke=\"" + colour +
           "\" stroke-width=\"1.3\" stroke-dasharray=\"2 3\"/>\n";
    svg += "<polyline points=\"" + total + "\" stroke=\"" + colour + "\" stroke-width=\"2.2\"/>\n";
    svg += dots;
  }
  if (plan.best) {
    const PlanOption& b = plan.options[*plan.best];
    const auto t = static_cast<double>(std::find(tools.begin(), tools.end(), b.tool) - tools.begin());
    const double dy = (t - 0.5 * static_cast<double>(tools.size() - 1)) * kSeriesOffsetPx;
    svg += "<circle cx=\"" + num(ax.x(b.stepover_mm)) + "\" cy=\"" + num(ax.y(b.cost) + dy) +
           "\" r=\"9\" stroke=\"black\" stroke-width=\"2\"/>\n";
  }
  svg += "</g>\n";

  // Legend first (it takes the top of the panel right of the plot), then the series labels below
  // it, each joined to the end of its tool's total line by a thin leader.
  std::string legend;
  double ly = kTopPx + 6;
  const double lx = w - kRightPx + 16;
  const double legend_w = w - lx - 8;
  std::vector<std::vector<std::string>> label_lines;
  for (const std::string& tool : tools) {
    label_lines.push_back(wrap_text(tool, legend_w - 20, kFontPx));
  }
  const auto text_lines = [&](const std::string& text, double x, const std::string& attrs) {
    for (const std::string& line : wrap_text(text, legend_w - (x - lx), kFontPx)) {
      legend += "<text x=\"" + num(x) + "\" y=\"" + num(ly) + "\"" + attrs + ">" +
                html_escape(line) + "</text>\n";
      ly += kLinePitchPx;
    }
  };
  const std::array<std::pair<const char*, const char*>, 3> kStyles = {
      {{"", "total"}, {"7 4", "machine"}, {"2 3", "bench (sanding)"}}};
  for (const auto& [dash, name] : kStyles) {
    legend += "<line x1=\"" + num(lx) + "\" x2=\"" + num(lx + 24) + "\" y1=\"" + num(ly - 4) +
              "\" y2=\"" + num(ly - 4) + "\" stroke=\"#444444\" stroke-width=\"1.6\"" +
              (*dash ? std::string(" stroke-dasharray=\"") + dash + "\"" : std::string()) + "/>";
    text_lines(name, lx + 30, "");
  }
  text_lines("filled: meets the spec", lx, "");
  text_lines("hollow: misses it", lx, "");
  if (tools.size() > 1) {
    text_lines("tools' lines drawn " + format_number(kSeriesOffsetPx) +
                   " px apart so none hides another",
               lx, "");
  }
  ly += 8;
  if (plan.best) {
    const PlanOption& b = plan.options[*plan.best];
    text_lines("ringed: best", lx, " font-weight=\"bold\"");
    text_lines(b.tool + " at " + display_length(b.stepover_mm, o.inch ? LengthUnit::Inch : LengthUnit::Millimetre), lx,
               "");
    text_lines("cost " + num(b.cost, 2), lx, "");
  } else {
    text_lines("no option meets the spec", lx, " font-weight=\"bold\"");
  }
  if (max_total > ax.cost_hi) {
    ly += 8;
    text_lines("costs above " + format_number(ax.cost_hi) + " run off the top", lx, "");
  }
  // The series labels: a coloured swatch and the tool's name, in the panel below the legend,
  // each level with its line's end where there is room (pushed apart, kept in the picture).
  std::vector<double> want(tools.size()), height(tools.size());
  for (std::size_t t = 0; t < tools.size(); ++t) {
    height[t] = kLinePitchPx * static_cast<double>(label_lines[t].size());
    want[t] = end_y[t] - 8;  // the swatch's middle level with the line's end
  }
  // Labels are placed as blocks of their own height: spread their tops with the tallest block as
  // the gap (simple and never overlapping).
  double gap = 0.0;
  for (const double hgt : height) gap = std::max(gap, hgt + 2.0);
  const double lo = ly + 8, hi = h - kBottomPx - gap + 12;
  std::vector<double> top = spread_labels(want, gap, lo, std::max(lo, hi));
  for (std::size_t t = 0; t < tools.size(); ++t) {
    const std::string colour = kColours[t % kColours.size()];
    svg += "<rect x=\"" + num(lx) + "\" y=\"" + num(top[t] + 3) + "\" width=\"14\" height=\"10\" fill=\"" +
           colour + "\"/>\n";
    svg += "<line x1=\"" + num(ax.x1) + "\" x2=\"" + num(lx - 2) + "\" y1=\"" + num(end_y[t]) +
           "\" y2=\"" + num(top[t] + 8) + "\" stroke=\"" + colour + "\" stroke-width=\"0.8\"/>\n";
    double y = top[t] + 12;
    for (const std::string& line : label_lines[t]) {
      svg += "<text x=\"" + num(lx + 20) + "\" y=\"" + num(y) + "\" fill=\"" + colour + "\">" +
             html_escape(line) + "</text>\n";
      y += kLinePitchPx;
    }
  }
  svg += legend;
  return svg + "</svg>\n";
}

}  // namespace cuspmap

// Forecast and progress text for long runs (see progress_text.h). Pure: cli/ prints.
#include "report/progress_text.h"

#include <algorithm>
#include <cmath>

#include "core/display_quantity.h"

namespace cuspmap {
namespace {

// Runs shorter than this never show a bar on a terminal (a quick run stays clean).
constexpr double kGraceSeconds = 1.0;
constexpr int kBarWidth = 30;

std::string cells_text(std::int64_t cells) {
  const double c = static_cast<double>(cells);
  if (c >= 1e9) return display_number(c / 1e9, 0.0) + " G cells";
  if (c >= 1e6) return display_number(c / 1e6, 0.0) + " M cells";
  if (c >= 1e3) return display_number(c / 1e3, 0.0) + " k cells";
  return std::to_string(cells) + " cells";
}

std::string bytes_text(std::int64_t bytes) {
  const double b = static_cast<double>(bytes);
  if (b >= 1e9) return display_number(b / 1e9, 0.0) + " GB";
  return display_number(b / 1e6, 0.0) + " MB";
}

}  // namespace

std::string forecast_line(const RunEstimate& e) {
  return "simulate: " + cells_text(e.cells) + ", about " + display_time(e.seconds) + ", about " +
         bytes_text(e.bytes) + " (" + (e.streamed ? "streamed in bands" : "in memory") +
         (e.tooth_marks ? ", tooth by tooth" : "") + ")";
}

ProgressText::ProgressText(std::string label, bool terminal)
    : label_(std::move(label)), terminal_(terminal) {}

std::string ProgressText::update(double fraction, double elapsed_s) {
  const int percent = static_cast<int>(std::clamp(fraction, 0.0, 1.0) * 100.0);
  if (terminal_) {
    if (elapsed_s < kGraceSeconds || percent == last_percent_) return "";
    last_percent_ = percent;
    drawn_ = true;
    const int filled = percent * kBarWidth / 100;
    std::string bar(static_cast<size_t>(filled), '#');
    bar.append(static_cast<size_t>(kBarWidth - filled), '.');
    std::string label = label_;
    if (label.size() < 10) label.resize(10, ' ');
    const std::string pct = std::to_string(percent);
    return "\r" + label + " [" + bar + "] " + std::string(3 - std::min<size_t>(3, pct.size()), ' ') +
           pct + "%";
  }
  if (elapsed_s - last_line_s_ < kProgressLineIntervalS) return "";
  last_line_s_ = elapsed_s;
  return label_ + " " + std::to_string(percent) + "% after " +
         display_time(std::floor(elapsed_s)) + "\n";
}

std::string ProgressText::finish() {
  if (!terminal_ || !drawn_) return "";
  last_percent_ = -1;
  std::string text = update(1.0, kGraceSeconds);
  return text + "\n";
}

}  // namespace cuspmap

// Terminal progress bar on stderr (isatty), after a one-second grace period.
#include "cli/progress_bar.h"

#include <unistd.h>

#include <algorithm>
#include <cstdio>

namespace cuspmap {
namespace {

// Runs shorter than this never show a bar (the issue asks for "longer than about a second").
constexpr double kGraceSeconds = 1.0;
constexpr int kBarWidth = 30;

}  // namespace

ProgressBar::ProgressBar(std::string label)
    : label_(std::move(label)), enabled_(isatty(STDERR_FILENO) == 1) {}

ProgressBar::~ProgressBar() {
  if (drawn_) {
    update(1.0);
    std::fputc('\n', stderr);
  }
}

void ProgressBar::update(double fraction) {
  if (!enabled_ || timer_.seconds() < kGraceSeconds) return;
  const int percent = static_cast<int>(std::clamp(fraction, 0.0, 1.0) * 100.0);
  if (percent == last_percent_) return;
  last_percent_ = percent;
  drawn_ = true;
  const int filled = percent * kBarWidth / 100;
  std::string bar(static_cast<size_t>(filled), '#');
  bar.append(static_cast<size_t>(kBarWidth - filled), '.');
  std::fprintf(stderr, "\r%-10s [%s] %3d%%", label_.c_str(), bar.c_str(), percent);
  std::fflush(stderr);
}

std::function<void(double)> ProgressBar::callback() {
  return [this](double f) { update(f); };
}

}  // namespace cuspmap

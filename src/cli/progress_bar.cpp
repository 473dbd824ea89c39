// Progress on stderr: a bar on a terminal, plain lines at most every 10 s elsewhere
// (report/progress_text.h decides the text; this prints it).
#include "cli/progress_bar.h"

#include <unistd.h>

#include <cstdio>

namespace cuspmap {

ProgressBar::ProgressBar(std::string label)
    : text_(std::move(label), isatty(STDERR_FILENO) == 1) {}

ProgressBar::~ProgressBar() { print(text_.finish()); }

void ProgressBar::print(const std::string& text) {
  if (text.empty()) return;
  std::fputs(text.c_str(), stderr);
  std::fflush(stderr);
}

void ProgressBar::update(double fraction) { print(text_.update(fraction, timer_.seconds())); }

std::function<void(double)> ProgressBar::callback() {
  return [this](double f) { update(f); };
}

}  // namespace cuspmap

// Progress on stderr for long runs: a bar redrawn in place when stderr is a terminal (after about
// a second), otherwise a plain line at most every 10 s (report/progress_text.h).
#pragma once

#include <functional>
#include <string>

#include "core/stage_timer.h"
#include "report/progress_text.h"

namespace cuspmap {

/// Prints ProgressText's bar or lines on stderr.
class ProgressBar {
 public:
  /// @param[in] label  short text before the bar ("sweep")
  explicit ProgressBar(std::string label);
  ~ProgressBar();
  ProgressBar(const ProgressBar&) = delete;
  ProgressBar& operator=(const ProgressBar&) = delete;

  /// Updates with the done fraction in [0, 1]; cheap when nothing needs drawing.
  void update(double fraction);
  /// A callback bound to update(), for SimSpec::progress.
  std::function<void(double)> callback();

 private:
  static void print(const std::string& text);
  ProgressText text_;
  StageTimer timer_;
};

}  // namespace cuspmap

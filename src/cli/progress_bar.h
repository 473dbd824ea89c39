// A progress bar on stderr for long runs: shown only when stderr is a terminal and the run has
// lasted longer than about a second, so pipes, CI logs and quick runs stay clean.
#pragma once

#include <functional>
#include <string>

#include "core/stage_timer.h"

namespace cuspmap {

/// Draws "label [#####.....]  42%" on stderr, redrawn in place.
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
  std::string label_;
  StageTimer timer_;
  bool enabled_ = false;
  bool drawn_ = false;
  int last_percent_ = -1;
};

}  // namespace cuspmap

// What a long run prints about itself on stderr: the forecast line before it starts, and
// progress while it runs (a bar redrawn in place on a terminal; plain lines at most one every
// kProgressLineIntervalS otherwise, so logs and pipes show a run is alive without flooding).
// Inputs: done fraction, elapsed s, RunEstimate; outputs: text (cli/ prints it). O(1) per call.
#pragma once

#include <string>

#include "job/run_estimate.h"

namespace cuspmap {

/// Shortest gap between two progress lines when stderr is not a terminal, s (the issue's "at
/// most one every 10 s": a log a person scrolls, not a stream).
inline constexpr double kProgressLineIntervalS = 10.0;

/// Runs forecast shorter than this print no forecast line (unless --verbose): "a few seconds".
inline constexpr double kAnnounceRunS = 3.0;

/// The forecast line: "simulate: 144 M cells, about 18 s, about 2.3 GB (in memory)".
std::string forecast_line(const RunEstimate& estimate);

/// Decides what to print for progress updates.
class ProgressText {
 public:
  /// @param[in] label     short text before the figures ("sweep")
  /// @param[in] terminal  stderr is a terminal: redraw a bar in place (after a 1 s grace period)
  ProgressText(std::string label, bool terminal);

  /// Text to print now for `fraction` in [0, 1] done after `elapsed_s`; empty = nothing.
  /// Terminal: "\r<label> [####....]  42%" when the percentage changes. Elsewhere:
  /// "<label> 42% after 10 s\n" once kProgressLineIntervalS has passed since the last line
  /// (the first after kProgressLineIntervalS from the start).
  std::string update(double fraction, double elapsed_s);

  /// Text to print when the run ends: the bar at 100 % and a newline when a bar was drawn,
  /// else "" (a run that printed lines needs no closing line: its summary follows).
  std::string finish();

 private:
  std::string label_;
  bool terminal_ = false;
  bool drawn_ = false;
  int last_percent_ = -1;
  double last_line_s_ = 0.0;
};

}  // namespace cuspmap

// Tests of report/progress_text: the forecast line and the non-terminal progress lines (at most
// one every kProgressLineIntervalS), driven by a fake clock.
#include "report/progress_text.h"

#include "test_support.h"

namespace cuspmap {

TEST_CASE("ProgressText: off a terminal, one line at most every 10 s", "[report]") {
  ProgressText p("sweep", false);
  // issue 14: a long run on a pipe printed nothing for minutes. Updates arrive every 0.5 s.
  std::vector<std::string> lines;
  for (int k = 0; k <= 70; ++k) {
    const double t = 0.5 * k;
    const std::string text = p.update(t / 35.0, t);
    if (!text.empty()) lines.push_back(text);
  }
  REQUIRE(lines.size() == 3);  // at 10, 20 and 30 s of a 35 s run
  CHECK(lines[0] == "sweep 28% after 10 s\n");
  CHECK(lines[1] == "sweep 57% after 20 s\n");
  CHECK(lines[2] == "sweep 85% after 30 s\n");
  CHECK(p.finish().empty());
}

TEST_CASE("ProgressText: a quick run off a terminal prints nothing", "[report]") {
  ProgressText p("sweep", false);
  for (int k = 0; k <= 10; ++k) CHECK(p.update(k / 10.0, 0.9 * k).empty());
  CHECK(p.finish().empty());
}

TEST_CASE("ProgressText: on a terminal, a bar after the grace second, closed by finish",
          "[report]") {
  ProgressText p("sweep", true);
  CHECK(p.update(0.1, 0.5).empty());
  CHECK(p.update(0.42, 1.5) == "\rsweep      [############..................]  42%");
  CHECK(p.update(0.42, 1.6).empty());  // same percentage: no redraw
  CHECK(p.finish() == "\rsweep      [##############################] 100%\n");
}

TEST_CASE("forecast_line: cells, time and memory in one line", "[report]") {
  RunEstimate e;
  e.cells = 144'000'000;
  e.seconds = 18.2;
  e.bytes = 2'300'000'000;
  CHECK(forecast_line(e) == "simulate: 144 M cells, about 18.2 s, about 2.3 GB (in memory)");
  e.streamed = true;
  e.tooth_marks = true;
  e.seconds = 900.0;
  CHECK(forecast_line(e) ==
        "simulate: 144 M cells, about 15 min, about 2.3 GB (streamed in bands, tooth by tooth)");
}

}  // namespace cuspmap

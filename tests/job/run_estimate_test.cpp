// Tests of job/run_estimate: the forecast a long run states before it starts.
#include "job/run_estimate.h"

#include "test_support.h"

namespace cuspmap {

TEST_CASE("estimate_run: in-memory grids and streamed bands", "[job]") {
  // Derived from the rates and grid counts stated in job/run_estimate.cpp.
  const RunEstimate mem = estimate_run(1000, 1000, false, false, 0);
  CHECK(mem.cells == 1'000'000);
  CHECK(mem.bytes == 16 * 4 * 1'000'000);
  const RunEstimate big = estimate_run(100000, 75000, false, true, 64 << 20);
  CHECK(big.streamed);
  CHECK(big.bytes == 3 * (64 << 20));
  CHECK(big.seconds > mem.seconds);
  // The bracket pocket job of the rate's measurement: 1500 x 1000 cells of 0.02 mm, 223 mm of
  // path, 6 mm 3-flute at 9000 rpm and 600 mm/min: ~9e8 crossings, a few minutes (derived).
  const ToothWork work{223.2, 6.0, 0.02, 9000.0, 600.0, 3};
  const RunEstimate tooth = estimate_run(1500, 1000, true, false, 0, work);
  CHECK(tooth.seconds > 300.0);
  CHECK(tooth.seconds < 600.0);
  CHECK(estimate_run(1500, 1000, false, false, 0, work).seconds < 3.0);
}

}  // namespace cuspmap

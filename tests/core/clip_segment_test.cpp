// Tests of Liang-Barsky segment clipping against hand-drawn cases.
#include "core/clip_segment.h"

#include "test_support.h"

using namespace cuspmap;

TEST_CASE("clip_segment: inside, crossing, parallel outside and missing segments", "[core]") {
  // Box [0, 10] x [0, 10]:
  //   a: (-5, 5) -> (15, 5) crosses both vertical edges: visible t in [0.25, 0.75]
  //   b: (2, 2) -> (8, 8) lies inside: [0, 1]
  //   c: (-1, 12) -> (11, 12) runs parallel above the box: nothing
  //   d: (-5, 0) -> (0, -5) touches nothing inside: nothing
  double t0 = 0, t1 = 0;
  REQUIRE(clip_segment(-5, 5, 15, 5, 0, 10, 0, 10, t0, t1));
  CHECK(t0 == 0.25);
  CHECK(t1 == 0.75);
  REQUIRE(clip_segment(2, 2, 8, 8, 0, 10, 0, 10, t0, t1));
  CHECK(t0 == 0.0);
  CHECK(t1 == 1.0);
  CHECK_FALSE(clip_segment(-1, 12, 11, 12, 0, 10, 0, 10, t0, t1));
  CHECK_FALSE(clip_segment(-5, -1, -1, -5, 0, 10, 0, 10, t0, t1));
}

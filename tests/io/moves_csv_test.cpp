// Moves as CSV: header with units, one row per move, arcs with centre and direction.
// Method: RFC 4180 layout; lengths from path/move (line: Euclidean; arc: r x sweep, derived).
#include <sstream>

#include "io/moves_csv.h"
#include "test_support.h"

namespace cuspmap {

TEST_CASE("encode_moves_csv: header with units and one row per move", "[io]") {
  Toolpath path;
  Move line;
  line.start_mm = {0, 0, 2};
  line.end_mm = {0, 0, 0};
  line.feed_mm_per_min = 500;
  Move arc;
  arc.kind = MoveKind::Arc;
  arc.start_mm = {1, 0, 0};
  arc.end_mm = {0, 1, 0};
  arc.centre_mm = {0, 0};
  arc.ccw = true;
  arc.feed_mm_per_min = 1000;
  path.moves = {line, arc};
  std::istringstream in(encode_moves_csv(path));
  std::string header, row0, row1, extra;
  std::getline(in, header);
  std::getline(in, row0);
  std::getline(in, row1);
  CHECK_FALSE(std::getline(in, extra));
  CHECK(header ==
        "index,kind,rapid,start_x_mm,start_y_mm,start_z_mm,end_x_mm,end_y_mm,end_z_mm,"
        "centre_x_mm,centre_y_mm,length_mm,feed_mm_per_min,source_line");
  CHECK(row0 == "0,line,0,0,0,2,0,0,0,,,2,500,0");
  // Derived: a quarter circle of radius 1 is pi/2 long.
  CHECK(row1.rfind("1,arc_ccw,0,1,0,0,0,1,0,0,0,1.57079632679", 0) == 0);
}

}  // namespace cuspmap

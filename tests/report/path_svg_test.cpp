// Plan-view SVG of a toolpath: the floor outline, solid cutting moves, dashed moves above the
// floor, arcs as SVG arcs with the Y flip.
// Method: SVG 1.1 path data (W3C 2011): A rx ry rot large-arc sweep x y.
#include "report/path_svg.h"
#include "test_support.h"

namespace cuspmap {

TEST_CASE("encode_path_svg: outline, cutting and lifted moves, arcs", "[report]") {
  Patch patch;
  patch.size_x_mm = 10;
  patch.size_y_mm = 5;
  patch.cell_mm = 0.1;
  Toolpath path;
  Move plunge;
  plunge.start_mm = {1, 1, 2};
  plunge.end_mm = {1, 1, 0};
  Move cut;
  cut.start_mm = {1, 1, 0};
  cut.end_mm = {4, 1, 0};
  Move arc;
  arc.kind = MoveKind::Arc;
  arc.start_mm = {4, 1, 0};
  arc.end_mm = {6, 1, 0};
  arc.centre_mm = {5, 1};
  arc.ccw = true;
  path.moves = {plunge, cut, arc};
  const std::string svg = encode_path_svg(path, patch, {}, 0.0);
  CHECK(svg.find("<svg") != std::string::npos);
  CHECK(svg.find("width=\"10\" height=\"5\"") != std::string::npos);  // the floor outline
  CHECK(svg.find("stroke-dasharray") != std::string::npos);           // the plunge, above
  // Y flipped: the cut runs along y = -1; the ccw half circle is a screen-clockwise arc.
  CHECK(svg.find("M1 -1L4 -1A1 1 0 0 0 6 -1") != std::string::npos);
  CHECK(svg.find("blue") == std::string::npos);
  CHECK(svg.rfind("</svg>\n") == svg.size() - 7);
}

}  // namespace cuspmap

// CSV rows of a toolpath, one per move (RFC 4180, locale-independent numbers). O(moves).
// Method: RFC 4180 field layout; std::to_chars shortest round-trip numbers.
#include "io/moves_csv.h"

#include <charconv>

namespace cuspmap {
namespace {

std::string num(double v) {
  char buf[64];
  const auto r = std::to_chars(buf, buf + sizeof buf, v);
  return std::string(buf, r.ptr);
}

}  // namespace

std::string encode_moves_csv(const Toolpath& path) {
  std::string csv =
      "index,kind,rapid,start_x_mm,start_y_mm,start_z_mm,end_x_mm,end_y_mm,end_z_mm,centre_x_mm,"
      "centre_y_mm,length_mm,feed_mm_per_min,source_line\n";
  for (std::size_t k = 0; k < path.moves.size(); ++k) {
    const Move& m = path.moves[k];
    const bool arc = m.kind == MoveKind::Arc;
    csv += std::to_string(k);
    csv += arc ? (m.ccw ? ",arc_ccw," : ",arc_cw,") : ",line,";
    csv += m.rapid ? '1' : '0';
    for (const Eigen::Vector3d& p : {m.start_mm, m.end_mm}) {
      for (int i = 0; i < 3; ++i) (csv += ',') += num(p[i]);
    }
    csv += ',';
    if (arc) ((csv += num(m.centre_mm.x())) += ',') += num(m.centre_mm.y());
    else csv += ',';
    (csv += ',') += num(move_length_mm(m));
    (csv += ',') += num(m.feed_mm_per_min);
    ((csv += ',') += std::to_string(m.source_line)) += '\n';
  }
  return csv;
}

}  // namespace cuspmap

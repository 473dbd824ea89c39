// Piecewise line/circle form of the revolved profile q(r) = p(clamp(a, |r - e|, min(r + e, R))).
// Inputs: Cutter (mm, deg), runout (mm); output: pieces in mm. Cost O(1) (at most ~8 pieces).
// Method: DESIGN.md "Geometry" profiles; each piece of p seen through r -> r + e, r - e or e - r
// stays a line or a circle (the map has slope +-1), the clamped middle is constant p(a).
#include "tool/revolved_profile.h"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <limits>
#include <numbers>

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
// Breakpoints closer than this (mm) are one breakpoint: far below any cell or feed scale.
constexpr double kBreakpointMergeMm = 1e-12;
// Rounding allowance at the rim (mm): a few ulps of mm-sized radii, far below a nanometre.
constexpr double kReachSlackMm = 1e-12;

// The profile of the cutter itself (e = 0) in its own pieces.
struct OwnProfile {
  double flat_mm = 0.0;    // R - rc: radius where the corner starts
  double corner_mm = 0.0;  // rc
  double tan_dish = 0.0;   // slope of the dish cone (0 for a ball)
  double height(double s) const {
    if (s <= flat_mm) return (flat_mm - s) * tan_dish;
    const double u = s - flat_mm;
    return corner_mm - std::sqrt(std::max(0.0, corner_mm * corner_mm - u * u));
  }
};

}  // namespace

double ProfilePiece::height_mm(double r_mm) const {
  const double r = std::clamp(r_mm, r0_mm, r1_mm);
  if (kind == PieceKind::Line) return a + b * r;
  const double u = r - a;
  return c - std::sqrt(std::max(0.0, b * b - u * u));
}

double ProfilePiece::slope(double r_mm) const {
  if (kind == PieceKind::Line) return b;
  const double u = r_mm - a;
  const double root2 = b * b - u * u;
  if (root2 <= 0.0) return u >= 0.0 ? kInf : -kInf;
  return u / std::sqrt(root2);
}

int RevolvedProfile::piece_at(double r_mm) const {
  const int n = static_cast<int>(pieces.size());
  for (int k = 0; k < n - 1; ++k) {
    if (r_mm < pieces[k].r1_mm) return k;
  }
  return n - 1;
}

double RevolvedProfile::height_mm(double r_mm) const {
  // Radii computed as sqrt(w^2 + x^2) at x = sqrt(reach^2 - w^2) may round just past the reach;
  // kReachSlackMm keeps that rim point on the cutter.
  if (r_mm > reach_mm + kReachSlackMm) return kInf;
  return pieces[piece_at(r_mm)].height_mm(r_mm);
}

double RevolvedProfile::min_over_mm(double lo_mm, double hi_mm) const {
  if (lo_mm > reach_mm + kReachSlackMm) return kInf;
  const double hi = std::min(hi_mm, reach_mm);
  const double lo = std::max(lo_mm, 0.0);
  // q falls to argmin and rises after it, so the interval's lowest point is the clamped argmin.
  return height_mm(std::clamp(argmin_mm, lo, std::max(lo, hi)));
}

bool RevolvedProfile::is_centred_circle() const {
  return pieces.size() == 1 && pieces[0].kind == PieceKind::Circle && pieces[0].a == 0.0;
}

RevolvedProfile revolved_profile(const Cutter& cutter, double runout_mm) {
  assert(runout_mm >= 0.0 && runout_mm < cutter.radius_mm() && "runout must be in [0, R)");
  OwnProfile own;
  own.corner_mm = cutter.effective_corner_mm();
  own.flat_mm = cutter.flat_radius_mm();
  own.tan_dish = cutter.shape == CutterShape::Ball
                     ? 0.0
                     : std::tan(cutter.dish_deg * std::numbers::pi / 180.0);
  const double big_r = cutter.radius_mm();
  const double e = runout_mm;
  const double a = profile_argmin_mm(cutter);

  RevolvedProfile q;
  q.radius_mm = big_r;
  q.runout_mm = e;
  q.reach_mm = big_r + e;
  // q is lowest wherever |r - e| <= a <= r + e; the smallest such r >= 0 that is also >= a keeps
  // the undished case (a = 0) at r = e, where the body's tip passes.
  q.argmin_mm = e == 0.0 ? a : std::max(a, e - a);
  q.min_mm = own.height(a);

  // Breakpoints: where the clamp changes branch and where p changes piece, seen through r +- e.
  std::vector<double> cuts = {0.0, q.reach_mm};
  for (double b : {a - e, a + e, e - a, own.flat_mm - e, own.flat_mm + e, e - own.flat_mm}) {
    if (b > 0.0 && b < q.reach_mm) cuts.push_back(b);
  }
  std::sort(cuts.begin(), cuts.end());
  cuts.erase(std::unique(cuts.begin(), cuts.end(),
                         [](double x, double y) { return y - x < kBreakpointMergeMm; }),
             cuts.end());

  for (std::size_t k = 0; k + 1 < cuts.size(); ++k) {
    const double r0 = cuts[k], r1 = cuts[k + 1];
    const double rm = 0.5 * (r0 + r1);
    const double lo = std::abs(rm - e), hi = std::min(rm + e, big_r);
    ProfilePiece piece;
    piece.r0_mm = r0;
    piece.r1_mm = r1;
    double sign = 1.0, shift = 0.0;  // body radius s = sign * r + shift on this interval
    bool constant = false;
    if (hi < a) {
      shift = e;
    } else if (lo > a) {
      if (rm >= e) {
        shift = -e;
      } else {
        sign = -1.0;
        shift = e;
      }
    } else {
      constant = true;
    }
    const double s_mid = sign * rm + shift;
    if (constant) {
      piece.kind = PieceKind::Line;
      piece.a = own.height(a);
      piece.b = 0.0;
    } else if (s_mid <= own.flat_mm) {
      // Dish cone (rflat - s) tan(dish) with s = sign r + shift.
      piece.kind = PieceKind::Line;
      piece.a = (own.flat_mm - shift) * own.tan_dish;
      piece.b = -sign * own.tan_dish;
    } else {
      // Corner circle rc - sqrt(rc^2 - (s - rflat)^2); (s - rflat)^2 = (r - sign(rflat - shift))^2.
      piece.kind = PieceKind::Circle;
      piece.a = sign * (own.flat_mm - shift);
      piece.b = own.corner_mm;
      piece.c = own.corner_mm;
    }
    // Fold a piece into its predecessor when it continues the same line or circle.
    if (!q.pieces.empty()) {
      ProfilePiece& prev = q.pieces.back();
      if (prev.kind == piece.kind && prev.a == piece.a && prev.b == piece.b && prev.c == piece.c) {
        prev.r1_mm = r1;
        continue;
      }
    }
    q.pieces.push_back(piece);
  }
  q.max_mm = std::max(q.height_mm(0.0), q.height_mm(q.reach_mm));
  return q;
}

}  // namespace cuspmap

// Minimum of q(sqrt(w^2 + x^2)) - k x along a chord: piece by piece, closed form or Newton.
// Inputs: RevolvedProfile (mm), w (mm), k, x interval (mm); output: ChordMin (mm).
// Method: composition of a convex non-decreasing function with the convex r(x) is convex (Boyd &
// Vandenberghe, Convex Optimization, 2004, §3.2.4); concave pieces take their minimum at an end.
#include "tool/chord_min.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "tool/golden_section_min.h"

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
// Newton/bisection stop on the torus: 1e-10 mm in x moves f by far less than a nanometre.
constexpr double kNewtonTolMm = 1e-10;
constexpr int kNewtonMaxIter = 60;
// Golden-section iterations on the rare non-convex circle branch (the inside of a runout
// envelope, narrower than the runout): 0.618^40 of a width under 0.1 mm is below 1e-9 mm.
constexpr int kGoldenIter = 40;
// Step for the numeric local-minimum test (mm): well above rounding of f, well below any piece;
// a neighbour must be lower by more than rounding (1e-12 mm) to disqualify a candidate.
constexpr double kLocalMinProbeMm = 1e-7;
constexpr double kLocalMinSlackMm = 1e-12;

struct Chord {
  const RevolvedProfile& q;
  double w, w2, k;
  double f(double x) const { return q.height_mm(std::sqrt(w2 + x * x)) - k * x; }
};

// Minimiser of the convex b*sqrt(w^2 + x^2) - k x (b >= 0) over [xa, xb].
double convex_line_argmin(double b, double w, double k, double xa, double xb) {
  if (std::abs(k) >= b) return k > 0.0 ? xb : (k < 0.0 ? xa : std::clamp(0.0, xa, xb));
  const double x = k * std::abs(w) / std::sqrt(b * b - k * k);
  return std::clamp(x, xa, xb);
}

// Minimiser of the convex c - sqrt(b^2 - (r - a)^2) - k x, r = sqrt(w^2 + x^2) >= a, over
// [xa, xb]: bracketed Newton on f'(x) = g'(r) x / r - k, which increases with x.
double convex_circle_argmin(const ProfilePiece& p, double w, double k, double xa, double xb) {
  const double w2 = w * w;
  if (p.a == 0.0) {
    // Centred circle (ball): x / sqrt(b^2 - w^2 - x^2) = k has the closed form below.
    const double rho2 = p.b * p.b - w2;
    if (rho2 <= 0.0) return std::clamp(0.0, xa, xb);
    return std::clamp(k * std::sqrt(rho2) / std::sqrt(1.0 + k * k), xa, xb);
  }
  auto derivative = [&](double x, double& second) {
    const double r = std::sqrt(w2 + x * x);
    const double u = r - p.a;
    const double root2 = p.b * p.b - u * u;
    if (root2 <= 0.0 || r == 0.0) {
      second = kInf;
      return x >= 0.0 ? kInf : -kInf;
    }
    const double root = std::sqrt(root2);
    const double g1 = u / root;
    const double g2 = p.b * p.b / (root2 * root);
    second = g2 * (x / r) * (x / r) + g1 * w2 / (r * r * r);
    return g1 * x / r - k;
  };
  double second = 0.0;
  if (derivative(xa, second) >= 0.0) return xa;
  if (derivative(xb, second) <= 0.0) return xb;
  double lo = xa, hi = xb, x = 0.5 * (xa + xb);
  for (int it = 0; it < kNewtonMaxIter && hi - lo > kNewtonTolMm; ++it) {
    const double d = derivative(x, second);
    if (d == 0.0) return x;
    if (d > 0.0) {
      hi = x;
    } else {
      lo = x;
    }
    const double step = (std::isfinite(second) && second > 0.0) ? d / second : kInf;
    const double xn = x - step;
    if (std::abs(step) < kNewtonTolMm) return std::clamp(xn, lo, hi);
    x = (xn > lo && xn < hi) ? xn : 0.5 * (lo + hi);
  }
  return x;
}

void add_candidate(ChordMin& out, const Chord& c, double x) {
  for (int i = 0; i < out.count; ++i) {
    if (std::abs(out.candidates[i].x_mm - x) < kNewtonTolMm) return;
  }
  if (out.count >= kMaxChordCandidates) return;
  out.candidates[out.count++] = {x, c.f(x)};
}

}  // namespace

ChordMin chord_min(const RevolvedProfile& q, double w_mm, double k, double x_lo_mm, double x_hi_mm,
                   bool local_minima_only) {
  ChordMin out;
  out.value_mm = kInf;
  const double w2 = w_mm * w_mm;
  const double reach2 = q.reach_mm * q.reach_mm;
  if (w2 > reach2) return out;
  const double half = std::sqrt(reach2 - w2);
  const double xa = std::max(x_lo_mm, -half), xb = std::min(x_hi_mm, half);
  if (!(xa <= xb)) return out;
  const Chord c{q, w_mm, w2, k};

  if (q.pieces.size() == 1) {
    // Single-piece profiles (flat or dished flat end, ball, all without runout): no breakpoints.
    const ProfilePiece& p = q.pieces[0];
    if (p.kind == PieceKind::Line && p.b < 0.0) {
      // One concave cone: lowest at an end; an end is a local minimum when f rises from it
      // into the chord (f' = b x / r - k decreases along the chord).
      auto slope = [&](double x) {
        const double r = std::sqrt(w2 + x * x);
        return (r > 0.0 ? p.b * x / r : 0.0) - k;
      };
      const double fa = c.f(xa), fb = c.f(xb);
      out.value_mm = std::min(fa, fb);
      out.x_mm = fa <= fb ? xa : xb;
      if (!local_minima_only || slope(xa) >= 0.0) out.candidates[out.count++] = {xa, fa};
      if (xb > xa && (!local_minima_only || slope(xb) <= 0.0)) {
        out.candidates[out.count++] = {xb, fb};
      }
      if (out.count == 0) out.candidates[out.count++] = {out.x_mm, out.value_mm};
      return out;
    }
    if (p.kind == PieceKind::Line || p.a == 0.0) {
      // One convex piece (flat end, or a ball): one minimum.
      const double x = p.kind == PieceKind::Line ? convex_line_argmin(p.b, w_mm, k, xa, xb)
                                                 : convex_circle_argmin(p, w_mm, k, xa, xb);
      out.x_mm = x;
      out.value_mm = c.f(x);
      out.candidates[out.count++] = {x, out.value_mm};
      return out;
    }
  }

  // Chord breakpoints: x = 0 (r turns), piece ends and circle centres, mapped to +-x.
  std::array<double, 2 * kMaxChordCandidates + 4> cuts{};
  int n = 0;
  cuts[n++] = xa;
  cuts[n++] = xb;
  if (xa < 0.0 && xb > 0.0) cuts[n++] = 0.0;
  auto add_radius = [&](double r) {
    if (r * r <= w2 || r >= q.reach_mm) return;
    const double x = std::sqrt(r * r - w2);
    if (x > xa && x < xb && n < static_cast<int>(cuts.size())) cuts[n++] = x;
    if (-x > xa && -x < xb && n < static_cast<int>(cuts.size())) cuts[n++] = -x;
  };
  for (const ProfilePiece& p : q.pieces) {
    add_radius(p.r1_mm);
    if (p.kind == PieceKind::Circle && p.a > p.r0_mm && p.a < p.r1_mm) add_radius(p.a);
  }
  std::sort(cuts.begin(), cuts.begin() + n);

  for (int s = 0; s + 1 < n; ++s) {
    const double a = cuts[s], b = cuts[s + 1];
    const double xm = 0.5 * (a + b);
    const double rm = std::sqrt(w2 + xm * xm);
    const ProfilePiece& p = q.pieces[q.piece_at(rm)];
    if (p.kind == PieceKind::Line && p.b >= 0.0) {
      add_candidate(out, c, convex_line_argmin(p.b, w_mm, k, a, b));
    } else if (p.kind == PieceKind::Line) {
      add_candidate(out, c, a);  // concave: lowest at an end
      add_candidate(out, c, b);
    } else if (rm >= p.a) {
      add_candidate(out, c, convex_circle_argmin(p, w_mm, k, a, b));
    } else {
      add_candidate(out, c, a);
      add_candidate(out, c, b);
      double lowest = 0.0;
      add_candidate(out, c, golden_section_min([&c](double x) { return c.f(x); }, a, b,
                                               kGoldenIter, lowest));
    }
  }

  int kept = 0;
  for (int i = 0; i < out.count; ++i) {
    const ChordPoint cand = out.candidates[i];
    if (cand.value_mm < out.value_mm) {
      out.value_mm = cand.value_mm;
      out.x_mm = cand.x_mm;
    }
    if (local_minima_only) {
      const double left = cand.x_mm - kLocalMinProbeMm, right = cand.x_mm + kLocalMinProbeMm;
      const double lower = cand.value_mm - kLocalMinSlackMm;
      if ((left >= xa && c.f(left) < lower) || (right <= xb && c.f(right) < lower)) {
        continue;
      }
    }
    out.candidates[kept++] = cand;
  }
  out.count = kept;
  return out;
}

}  // namespace cuspmap

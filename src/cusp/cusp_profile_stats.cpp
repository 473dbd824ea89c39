// Ideal cusp-profile statistics: parabolic closed forms and exact line integrals over pieces.
// Inputs: heights in mm along the normal, positions in mm; outputs: Ra, Rq, Rz in um.
// Method: ISO 4287:1997 §4.2.1-4.2.2; composite Gauss-Legendre on geometrically graded panels
// (endpoint square-root singularities of arcs that reach a vertical tangent stay accurate).
#include "cusp/cusp_profile_stats.h"

#include <algorithm>
#include <array>
#include <cassert>
#include <cmath>
#include <limits>
#include <numbers>
#include <utility>

#include "core/units.h"

namespace cuspmap {
namespace {

// Nodes per panel: a 12-point rule is exact for degree-23 polynomials, so analytic cusp arcs
// reach double precision on panels a fraction of the arc long.
constexpr int kGaussPoints = 12;
// Panels halve towards both ends down to 2^-kGradingLevels of the interval: an arc ending at a
// vertical tangent behaves like sqrt(distance), and its error on the last panel scales as
// (2^-26)^1.5 ~ 2e-12 of the integral.
constexpr int kGradingLevels = 26;
// Bisection for the mean-line crossing stops at this fraction of the piece length (the height
// error it leaves is below double rounding of the heights themselves).
constexpr double kCrossingRelTol = 1e-15;

struct GaussRule {
  std::array<double, kGaussPoints> x{};  // nodes on [-1, 1]
  std::array<double, kGaussPoints> w{};  // weights
};

// Gauss-Legendre nodes and weights by Newton's method on P_n (Golub & Welsch give the same).
const GaussRule& gauss_rule() {
  static const GaussRule rule = [] {
    GaussRule r;
    constexpr int n = kGaussPoints;
    for (int i = 0; i < (n + 1) / 2; ++i) {
      double x = std::cos(std::numbers::pi * (i + 0.75) / (n + 0.5));
      double dp = 0.0;
      for (int iter = 0; iter < 100; ++iter) {
        double p0 = 1.0, p1 = x;
        for (int k = 2; k <= n; ++k) {
          const double p2 = ((2.0 * k - 1.0) * x * p1 - (k - 1.0) * p0) / k;
          p0 = p1;
          p1 = p2;
        }
        dp = n * (x * p1 - p0) / (x * x - 1.0);
        const double dx = p1 / dp;
        x -= dx;
        if (std::abs(dx) < 1e-16) break;
      }
      r.x[i] = -x;
      r.x[n - 1 - i] = x;
      r.w[i] = r.w[n - 1 - i] = 2.0 / ((1.0 - x * x) * dp * dp);
    }
    return r;
  }();
  return rule;
}

// Integral of f over [a, b] on panels graded geometrically towards both ends.
double integrate_graded(const std::function<double(double)>& f, double a, double b) {
  if (!(b > a)) return 0.0;
  const GaussRule& rule = gauss_rule();
  auto panel = [&](double lo, double hi) {
    const double half = 0.5 * (hi - lo), mid = 0.5 * (hi + lo);
    double sum = 0.0;
    for (int k = 0; k < kGaussPoints; ++k) sum += rule.w[k] * f(mid + half * rule.x[k]);
    return sum * half;
  };
  const double len = b - a;
  double total = 0.0;
  double lo = 0.0;
  for (int level = kGradingLevels; level >= 1; --level) {  // [0, 2^-26], ..., [1/4, 1/2]
    const double hi = std::ldexp(1.0, -level);
    total += panel(a + len * lo, a + len * hi);
    lo = hi;
  }
  for (int level = 2; level <= kGradingLevels + 1; ++level) {  // [1/2, 3/4], ..., [.., 1]
    const double hi = level <= kGradingLevels ? 1.0 - std::ldexp(1.0, -level) : 1.0;
    total += panel(a + len * lo, a + len * hi);
    lo = hi;
  }
  return total;
}

// u in [u0, u1] where the monotone n(u) equals m (n(u0) - m and n(u1) - m of opposite signs).
double mean_crossing(const CuspArcPiece& p, double m) {
  double lo = p.u0_mm, hi = p.u1_mm;
  const bool rising = p.n1_mm > p.n0_mm;
  const double tol = kCrossingRelTol * (p.u1_mm - p.u0_mm);
  for (int iter = 0; iter < 200 && hi - lo > tol; ++iter) {
    const double mid = 0.5 * (lo + hi);
    if ((p.height_mm(mid) < m) == rising) {
      lo = mid;
    } else {
      hi = mid;
    }
  }
  return 0.5 * (lo + hi);
}

// Line integral of F(n) dx over all pieces, with x = kx u + kn n. `antiderivative` is a G with
// G' = F (for the wall parts and the kn n-term); `split` > NaN splits graph pieces where n = split.
double line_integral(const std::vector<CuspArcPiece>& pieces, double kx, double kn,
                     const std::function<double(double)>& integrand,
                     const std::function<double(double)>& antiderivative, double split) {
  double total = 0.0;
  for (const CuspArcPiece& p : pieces) {
    total += kn * (antiderivative(p.n1_mm) - antiderivative(p.n0_mm));
    if (!(p.u1_mm > p.u0_mm)) continue;  // a wall: only the n-term above
    auto f = [&](double u) { return integrand(p.height_mm(u)); };
    const bool crosses = std::isfinite(split) && (p.n0_mm - split) * (p.n1_mm - split) < 0.0;
    if (crosses) {
      const double uc = mean_crossing(p, split);
      total += kx * (integrate_graded(f, p.u0_mm, uc) + integrate_graded(f, uc, p.u1_mm));
    } else {
      total += kx * integrate_graded(f, p.u0_mm, p.u1_mm);
    }
  }
  return total;
}

}  // namespace

ProfileStats parabolic_cusp_stats(double scallop_um, double arc_fraction) {
  assert(scallop_um >= 0.0 && arc_fraction > 0.0 && arc_fraction <= 1.0 && "parabola domain");
  // z = h t^2 on the arcs (t = x / w), 0 on the flats. With q the arc fraction the mean is
  // m = h q / 3; Rq^2 = h^2 (q/5 - q^2/9); Ra = h [(1 - q) mu + q (4/3 mu^1.5 + 1/3 - mu)],
  // mu = m / h (integrating |t^2 - mu| with the crossing at t = sqrt(mu)).
  const double h = scallop_um, q = arc_fraction;
  const double mu = q / 3.0;
  ProfileStats s;
  s.rz_um = h;
  s.rq_um = h * std::sqrt(std::max(0.0, q / 5.0 - q * q / 9.0));
  s.ra_um = h * ((1.0 - q) * mu + q * (4.0 / 3.0 * mu * std::sqrt(mu) + 1.0 / 3.0 - mu));
  return s;
}

ProfileStats arc_cusp_stats(double radius_mm, double half_chord_mm, double flat_width_mm) {
  assert(radius_mm > 0.0 && half_chord_mm >= 0.0 && half_chord_mm <= radius_mm &&
         flat_width_mm >= 0.0 && "arc profile domain");
  if (half_chord_mm == 0.0) return {};
  const double rho = radius_mm, half_flat = 0.5 * flat_width_mm;
  // Half a period (the profile is symmetric): the flat, then the arc up to the cusp.
  // rho - sqrt(rho^2 - x^2) written as x^2 / (rho + sqrt(...)) keeps small cusps exact.
  auto arc = [rho, half_flat](double u) {
    const double x = u - half_flat;
    return x * x / (rho + std::sqrt(std::max(0.0, rho * rho - x * x)));
  };
  std::vector<CuspArcPiece> pieces;
  if (half_flat > 0.0) {
    pieces.push_back({0.0, half_flat, 0.0, 0.0, [](double) { return 0.0; }});
  }
  pieces.push_back(
      {half_flat, half_flat + half_chord_mm, 0.0, arc(half_flat + half_chord_mm), arc});
  return periodic_profile_stats(pieces, 1.0, 0.0);
}

CuspArcPiece graph_piece(double u0_mm, double u1_mm, std::function<double(double)> height_mm) {
  CuspArcPiece p;
  p.u0_mm = u0_mm;
  p.u1_mm = u1_mm;
  p.n0_mm = height_mm(u0_mm);
  p.n1_mm = height_mm(u1_mm);
  p.height_mm = std::move(height_mm);
  return p;
}

ProfileStats periodic_profile_stats(const std::vector<CuspArcPiece>& pieces, double kx, double kn) {
  assert(!pieces.empty() && kx > 0.0 && "profile needs pieces and a forward map");
  const double period = kx * (pieces.back().u1_mm - pieces.front().u0_mm) +
                        kn * (pieces.back().n1_mm - pieces.front().n0_mm);
  assert(period > 0.0 && "profile period must be positive");
  const double nan = std::numeric_limits<double>::quiet_NaN();
  const double mean =
      line_integral(
          pieces, kx, kn, [](double n) { return n; }, [](double n) { return 0.5 * n * n; }, nan) /
      period;
  const double var =
      line_integral(
          pieces, kx, kn, [mean](double n) { return (n - mean) * (n - mean); },
          [mean](double n) { return (n - mean) * (n - mean) * (n - mean) / 3.0; }, nan) /
      period;
  const double ra = line_integral(
                        pieces, kx, kn, [mean](double n) { return std::abs(n - mean); },
                        [mean](double n) { return 0.5 * (n - mean) * std::abs(n - mean); }, mean) /
                    period;
  double lo = pieces.front().n0_mm, hi = lo;
  for (const CuspArcPiece& p : pieces) {
    lo = std::min({lo, p.n0_mm, p.n1_mm});
    hi = std::max({hi, p.n0_mm, p.n1_mm});
  }
  ProfileStats s;
  s.ra_um = ra * kUmPerMm;
  s.rq_um = std::sqrt(std::max(0.0, var)) * kUmPerMm;
  s.rz_um = (hi - lo) * kUmPerMm;
  return s;
}

}  // namespace cuspmap

// Arc envelope per cell: distance interval to the arc (level, untilted) or sampled-and-refined
// minima along the arc parameter (helix, tilt). Inputs: SweepSetup, PreparedMove (Arc), cell
// (mm); output: heights mm. Method: point-to-arc distance; golden-section refinement.
#include "sweep/envelope_arc.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

#include "tool/golden_section_min.h"

namespace cuspmap {
namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kTwoPi = 2.0 * std::numbers::pi;
// Samples per reachable stretch of the arc before refining: the height along the arc has at most
// a few minima per stretch (one for convex cutters, the two rim ends for a dished one).
constexpr int kArcSamples = 24;
// Golden-section steps: 0.618^40 of one sample spacing is far below a nanometre of travel.
constexpr int kGoldenIter = 40;

// True when the arc passes the direction `angle` (rad) about its centre.
bool arc_passes(const PreparedMove& m, double angle) {
  if (std::abs(m.sweep_rad) >= kTwoPi) return true;
  double delta = m.sweep_rad >= 0.0 ? angle - m.start_angle_rad : m.start_angle_rad - angle;
  delta = std::fmod(delta, kTwoPi);
  if (delta < 0.0) delta += kTwoPi;
  return delta <= std::abs(m.sweep_rad);
}

struct ArcHeight {
  const SweepSetup& s;
  const RevolvedProfile& q;
  const PreparedMove& m;
  Eigen::Vector2d p;
  double e_sin2 = 0.0;  // squared runout across the tooth (0 for the envelope)
  double operator()(double t) const {
    const Eigen::Vector2d v = p - m.point_at(t);
    const double rho =
        e_sin2 == 0.0 ? v.norm() : std::sqrt(std::max(0.0, v.squaredNorm() - e_sin2));
    return m.z_at(t) + q.height_mm(rho) - s.tilt.dot(v);
  }
};

void add_minimum(MoveMinima& out, double t, double value) {
  if (!(value < kInf)) return;
  out.value_mm = std::min(out.value_mm, value);
  if (out.count < kMaxMoveMinima) out.t[out.count++] = t;
}

// Local minima of f over [ta, tb]: sample, then refine each sampled dip.
void minimise_stretch(const ArcHeight& f, double ta, double tb, MoveMinima& out) {
  std::array<double, kArcSamples + 1> v{};
  const double h = (tb - ta) / kArcSamples;
  for (int i = 0; i <= kArcSamples; ++i) v[i] = f(ta + i * h);
  for (int i = 0; i <= kArcSamples; ++i) {
    const double left = i > 0 ? v[i - 1] : kInf, right = i < kArcSamples ? v[i + 1] : kInf;
    if (!(v[i] <= left && v[i] <= right) || !(v[i] < kInf)) continue;
    if (i == 0 || i == kArcSamples) {
      // An end sample: the minimum may sit at the end itself or just inside.
      double best = v[i];
      const double a = i == 0 ? ta : tb - h, b = i == 0 ? ta + h : tb;
      const double t = golden_section_min(f, a, b, kGoldenIter, best);
      if (best < v[i]) {
        add_minimum(out, t, best);
      } else {
        add_minimum(out, ta + i * h, v[i]);
      }
      continue;
    }
    double best = v[i];
    const double t = golden_section_min(f, ta + (i - 1) * h, ta + (i + 1) * h, kGoldenIter, best);
    add_minimum(out, best < v[i] ? t : ta + i * h, std::min(best, v[i]));
  }
}

// Level arc, untilted: h(t) = z + q(rho(d(t))) with d monotone between the closest and the
// farthest point and q(rho(d)) monotone on either side of d* (rho(d*) = argmin), so between
// consecutive points of {ends, closest, farthest, d = d*} h is monotone and the local minima
// are among them (closed forms, no sampling).
void level_minima(const ArcHeight& f, double argmin_mm, double e_sin_mm, MoveMinima& out) {
  const PreparedMove& m = f.m;
  const Eigen::Vector2d rel = f.p - m.centre_mm;
  const double rho = rel.norm(), ra = m.arc_radius_mm, psi = std::atan2(rel.y(), rel.x());
  std::array<double, 2 + 6 * 8> ts{};
  int n = 0;
  ts[n++] = 0.0;
  ts[n++] = 1.0;
  const double phi0 = m.start_angle_rad, sweep = m.sweep_rad;
  const double lo = std::min(phi0, phi0 + sweep), hi = std::max(phi0, phi0 + sweep);
  auto add_angles = [&](double centre) {
    for (double k = std::ceil((lo - centre) / kTwoPi); n < static_cast<int>(ts.size()); k += 1.0) {
      const double phi = centre + kTwoPi * k;
      if (phi > hi) break;
      ts[n++] = std::clamp((phi - phi0) / sweep, 0.0, 1.0);
    }
  };
  if (rho > 0.0) {
    add_angles(psi);                    // closest
    add_angles(psi + std::numbers::pi);  // farthest
    const double d_star2 = argmin_mm * argmin_mm + e_sin_mm * e_sin_mm;
    const double cd = (rho * rho + ra * ra - d_star2) / (2.0 * rho * ra);
    if (std::abs(cd) <= 1.0) {
      const double delta = std::acos(cd);
      add_angles(psi - delta);
      add_angles(psi + delta);
    }
  }
  std::sort(ts.begin(), ts.begin() + n);
  std::array<double, ts.size()> hs{};
  for (int i = 0; i < n; ++i) hs[i] = f(ts[i]);
  for (int i = 0; i < n; ++i) {
    if (i > 0 && ts[i] == ts[i - 1]) continue;
    if ((i > 0 && hs[i - 1] < hs[i]) || (i + 1 < n && hs[i + 1] < hs[i])) continue;
    add_minimum(out, ts[i], hs[i]);
  }
}

}  // namespace

MoveMinima arc_minima(const SweepSetup& setup, const RevolvedProfile& q, const PreparedMove& move,
                      const Eigen::Vector2d& p_mm, double e_sin_mm) {
  MoveMinima out;
  out.value_mm = kInf;
  const ArcHeight f{setup, q, move, p_mm, e_sin_mm * e_sin_mm};
  if (move.z0_mm == move.z1_mm && setup.tilt.x() == 0.0 && setup.tilt.y() == 0.0) {
    level_minima(f, q.argmin_mm, e_sin_mm, out);
    return out;
  }
  const Eigen::Vector2d rel = p_mm - move.centre_mm;
  // rho <= reach where the distance is within sqrt(reach^2 + e_sin^2).
  const double rho = rel.norm(), ra = move.arc_radius_mm,
               reach = std::sqrt(q.reach_mm * q.reach_mm + e_sin_mm * e_sin_mm);
  // |P - c(phi)|^2 = rho^2 + ra^2 - 2 rho ra cos(phi - psi) <= reach^2  <=>  cos >= kc.
  const double denom = 2.0 * rho * ra;
  const double kc =
      denom > 0.0 ? (rho * rho + ra * ra - reach * reach) / denom : (ra <= reach ? -2.0 : 2.0);
  if (kc > 1.0) return out;
  if (kc <= -1.0) {
    minimise_stretch(f, 0.0, 1.0, out);
    return out;
  }
  const double beta = std::acos(kc), psi = std::atan2(rel.y(), rel.x());
  const double phi0 = move.start_angle_rad, sweep = move.sweep_rad;
  const double lo = std::min(phi0, phi0 + sweep), hi = std::max(phi0, phi0 + sweep);
  // Every reachable window psi +- beta + 2 pi m that overlaps the arc's angles.
  const long m_first = static_cast<long>(std::floor((lo - psi - beta) / kTwoPi));
  const long m_last = static_cast<long>(std::ceil((hi - psi + beta) / kTwoPi));
  for (long m = m_first; m <= m_last; ++m) {
    const double c = psi + kTwoPi * static_cast<double>(m);
    double ta = (c - beta - phi0) / sweep, tb = (c + beta - phi0) / sweep;
    if (ta > tb) std::swap(ta, tb);
    ta = std::max(ta, 0.0);
    tb = std::min(tb, 1.0);
    if (ta < tb) minimise_stretch(f, ta, tb, out);
  }
  return out;
}

double envelope_arc_mm(const SweepSetup& setup, const PreparedMove& move,
                       const Eigen::Vector2d& p_mm) {
  const bool level_untilted =
      move.z0_mm == move.z1_mm && setup.tilt.x() == 0.0 && setup.tilt.y() == 0.0;
  if (!level_untilted) return arc_minima(setup, setup.envelope, move, p_mm).value_mm;
  const Eigen::Vector2d rel = p_mm - move.centre_mm;
  const double rho = rel.norm(), ra = move.arc_radius_mm;
  const double d_start = (p_mm - move.point_at(0.0)).norm();
  const double d_end = (p_mm - move.point_at(1.0)).norm();
  double d_min = std::min(d_start, d_end), d_max = std::max(d_start, d_end);
  if (rho == 0.0) {
    d_min = d_max = ra;
  } else {
    const double psi = std::atan2(rel.y(), rel.x());
    if (arc_passes(move, psi)) d_min = std::abs(rho - ra);
    if (arc_passes(move, psi + std::numbers::pi)) d_max = rho + ra;
  }
  return move.z0_mm + setup.envelope.min_over_mm(d_min, d_max);
}

}  // namespace cuspmap

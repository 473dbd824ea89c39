// Test oracle: the cross-feed profile built by brute force as the pointwise minimum of many
// neighbouring tool sections on a fine grid, independent of src/cusp and src/tool, and its
// Ra/Rq/Rz by exact integration of the piecewise-linear sampled profile.
// Method: direct envelope sampling (the definition of the swept floor), ISO 4287 Ra/Rq.
#pragma once

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <vector>

namespace cuspmap::test {

/// A sampled profile over one period: along-surface position and height along the normal (mm).
struct SampledProfile {
  std::vector<double> x_mm, n_mm;
};

/// Oracle statistics, um.
struct OracleStats {
  double scallop_um = 0.0, ra_um = 0.0, rq_um = 0.0;
};

/// Height of a revolving cutter's swept section above its tip at lateral offset y (mm):
/// flat centre of half-width R - rc, corner arcs of radius rc, no section beyond R.
inline double section_height_mm(double y, double big_r, double rc) {
  const double ay = std::abs(y);
  if (ay > big_r) return std::numeric_limits<double>::infinity();
  const double a = big_r - rc;
  if (ay <= a) return 0.0;
  const double u = ay - a;
  return rc - std::sqrt(std::max(0.0, rc * rc - u * u));
}

/// Passes stepover_mm apart (plan view) on a plane sloped alpha_deg across them; the profile
/// over one period, heights measured along the normal from the contacts (their minimum).
inline SampledProfile plane_profile(double big_r, double rc, double stepover_mm, double alpha_deg,
                                    int samples) {
  const double al = alpha_deg * std::numbers::pi / 180.0, t = std::tan(al);
  const int passes = static_cast<int>(2.0 * big_r / stepover_mm) + 4;
  std::vector<double> y(samples + 1), r(samples + 1);
  for (int i = 0; i <= samples; ++i) {
    y[i] = stepover_mm * i / samples;
    double e = std::numeric_limits<double>::infinity();
    for (int k = -passes; k <= passes; ++k) {
      e = std::min(e, section_height_mm(y[i] - k * stepover_mm, big_r, rc) + k * stepover_mm * t);
    }
    r[i] = e - y[i] * t;
  }
  const double base = *std::min_element(r.begin(), r.end());
  SampledProfile p;
  for (int i = 0; i <= samples; ++i) {
    const double v = r[i] - base;
    p.x_mm.push_back(y[i] / std::cos(al) + v * std::sin(al));
    p.n_mm.push_back(v * std::cos(al));
  }
  return p;
}

/// Ball of radius R on a cylinder of radius rho (convex: tool outside), contacts stepover_mm
/// apart along the surface: height along each ray from the axis, against arc length rho*theta.
inline SampledProfile cylinder_profile(double big_r, double rho, bool convex, double stepover_mm,
                                       int samples) {
  const double phi = stepover_mm / rho;
  const double centre = convex ? rho + big_r : rho - big_r;
  SampledProfile p;
  for (int i = 0; i <= samples; ++i) {
    const double th = phi * i / samples;
    // Along the ray at angle th: |t e - c_k|^2 = R^2, i.e. t^2 - 2 t (c_k . e) + |c_k|^2 - R^2 = 0.
    double best = convex ? std::numeric_limits<double>::infinity() : 0.0;
    for (int k = -3; k <= 4; ++k) {
      const double proj = centre * std::cos(th - k * phi);
      const double disc = proj * proj - (centre * centre - big_r * big_r);
      if (disc < 0.0 || proj <= 0.0) continue;  // the circle misses the ray, or lies behind it
      if (convex) {
        best = std::min(best, proj - std::sqrt(disc));
      } else {
        best = std::max(best, proj + std::sqrt(disc));
      }
    }
    p.x_mm.push_back(rho * th);
    p.n_mm.push_back(convex ? best - rho : rho - best);
  }
  return p;
}

/// Cusp height, Ra and Rq of a sampled period, integrating each linear segment exactly.
inline OracleStats oracle_stats(const SampledProfile& p) {
  const std::vector<double>& x = p.x_mm;
  const std::vector<double>& n = p.n_mm;
  const double period = x.back() - x.front();
  double mean = 0.0;
  for (size_t i = 0; i + 1 < x.size(); ++i) mean += 0.5 * (n[i] + n[i + 1]) * (x[i + 1] - x[i]);
  mean /= period;
  double ra = 0.0, rq = 0.0;
  for (size_t i = 0; i + 1 < x.size(); ++i) {
    const double a = n[i] - mean, b = n[i + 1] - mean, dx = x[i + 1] - x[i];
    rq += dx * (a * a + a * b + b * b) / 3.0;
    ra +=
        (a * b >= 0.0) ? dx * 0.5 * std::abs(a + b) : dx * 0.5 * (a * a + b * b) / std::abs(b - a);
  }
  OracleStats s;
  s.scallop_um = *std::max_element(n.begin(), n.end()) * 1000.0;
  s.ra_um = ra / period * 1000.0;
  s.rq_um = std::sqrt(rq / period) * 1000.0;
  return s;
}

}  // namespace cuspmap::test

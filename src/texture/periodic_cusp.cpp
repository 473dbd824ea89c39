// Peak-to-valley of a periodic mark pattern from traces across the lay, crests and valleys refined
// below the sample spacing by flank-parabola intersection. O(samples).
// Method: derived (see periodic_cusp.h).
#include "texture/periodic_cusp.h"

#include <algorithm>
#include <cmath>

namespace cuspmap {
namespace {

// Parabola through (x0, z[x0]), (x0 + 1, ..), (x0 + 2, ..), evaluated at x (sample units).
double parabola(const std::vector<double>& z, std::size_t x0, double x) {
  const double a = z[x0], b = z[x0 + 1], c = z[x0 + 2];
  const double t = x - static_cast<double>(x0);
  // Newton's forward differences.
  return a + t * (b - a) + 0.5 * t * (t - 1.0) * (c - 2.0 * b + a);
}

// Highest (sign +1) value of the left flank where it meets the right flank within [lo, lo + 1]:
// left flank = parabola from samples left0..left0+2, right flank = from right0..right0+2.
bool crossing(const std::vector<double>& z, std::size_t left0, std::size_t right0, double lo,
              double sign, double& value) {
  // d(x) = sign * (L(x) - R(x)) is a quadratic; find its root in [lo, lo + 1] by its values at
  // three points (Newton form again), then take the root inside the interval.
  auto d = [&](double x) { return sign * (parabola(z, left0, x) - parabola(z, right0, x)); };
  const double d0 = d(lo), d1 = d(lo + 0.5), d2 = d(lo + 1.0);
  // Quadratic in u = x - lo: d = A u^2 + B u + C.
  const double cq = d0;
  const double aq = 2.0 * (d2 - 2.0 * d1 + d0);
  const double bq = d2 - d0 - aq;
  double u = -1.0;
  auto take = [&](double r) {
    if (r >= 0.0 && r <= 1.0 && (u < 0.0 || sign * parabola(z, left0, lo + r) >
                                                sign * parabola(z, left0, lo + u))) {
      u = r;
    }
  };
  if (std::abs(aq) < 1e-12 * (std::abs(bq) + std::abs(cq)) || aq == 0.0) {
    if (bq != 0.0) take(-cq / bq);
  } else {
    const double disc = bq * bq - 4.0 * aq * cq;
    if (disc >= 0.0) {
      const double q = -0.5 * (bq + std::copysign(std::sqrt(disc), bq));
      if (q != 0.0) take(cq / q);
      take(q / aq);
    }
  }
  if (u < 0.0) return false;
  value = parabola(z, left0, lo + u);
  return std::isfinite(value);
}

// ISO 4287:1997 default height discrimination of profile peaks and valleys, 10 % of Pz (from
// memory).
constexpr double kHeightDiscrimination = 0.1;

}  // namespace

double refined_extremum_um(const std::vector<double>& z, std::size_t i, double sign) {
  double best = z[i];
  double v = 0.0;
  // Extremum in [i-1, i]: left flank i-3..i-1, right flank i..i+2.
  if (crossing(z, i - 3, i, static_cast<double>(i) - 1.0, sign, v) && sign * v > sign * best) {
    best = v;
  }
  // Extremum in [i, i+1]: left flank i-2..i, right flank i+1..i+3.
  if (crossing(z, i - 2, i + 1, static_cast<double>(i), sign, v) && sign * v > sign * best) {
    best = v;
  }
  return best;
}

PeriodicCusp periodic_cusp(const std::vector<ProfileTrace>& traces) {
  std::vector<double> heights;
  for (const ProfileTrace& t : traces) {
    const std::vector<double>& z = t.z_um;
    if (z.size() < 7) continue;
    // Extrema with three samples on each side for the flank parabolas; plateaus count once
    // (strict on the left, non-strict on the right).
    struct Extremum {
      double z_um;
      bool crest;
    };
    std::vector<Extremum> ext;
    for (std::size_t i = 3; i + 4 <= z.size(); ++i) {
      if (z[i] > z[i - 1] && z[i] >= z[i + 1]) ext.push_back({refined_extremum_um(z, i, 1.0), true});
      if (z[i] < z[i - 1] && z[i] <= z[i + 1]) ext.push_back({refined_extremum_um(z, i, -1.0), false});
    }
    // Height discrimination (ISO 4287:1997 default for profile elements, 10 % of the maximum height;
    // from memory):
    // a crest or valley counts only once the profile has turned by that much from it, so
    // float rounding on a level stretch is not a pattern. Hysteresis over the extrema in order;
    // between two crests the higher one wins, between two valleys the lower.
    const auto [lo, hi] = std::minmax_element(z.begin(), z.end());
    const double threshold = kHeightDiscrimination * (*hi - *lo);
    std::vector<Extremum> alt;
    for (const Extremum& e : ext) {
      if (alt.empty()) {
        alt.push_back(e);
      } else if (alt.back().crest == e.crest) {
        if (e.crest ? e.z_um > alt.back().z_um : e.z_um < alt.back().z_um) alt.back() = e;
      } else if (std::abs(e.z_um - alt.back().z_um) >= threshold) {
        alt.push_back(e);
      }
    }
    for (std::size_t k = 1; k + 1 < alt.size(); ++k) {
      if (!alt[k].crest) continue;
      heights.push_back(alt[k].z_um - std::min(alt[k - 1].z_um, alt[k + 1].z_um));
    }
  }
  PeriodicCusp out;
  out.crests = static_cast<int>(heights.size());
  if (heights.empty()) return out;
  const std::size_t mid = heights.size() / 2;
  std::nth_element(heights.begin(), heights.begin() + static_cast<std::ptrdiff_t>(mid), heights.end());
  out.cusp_um = heights[mid];
  if (heights.size() % 2 == 0) {
    const double lower = *std::max_element(heights.begin(), heights.begin() + static_cast<std::ptrdiff_t>(mid));
    out.cusp_um = 0.5 * (out.cusp_um + lower);
  }
  return out;
}

}  // namespace cuspmap

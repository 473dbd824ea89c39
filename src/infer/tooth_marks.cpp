// Feed-mark detection of the tooth window: heights with the plane removed, grouped by line
// along the lay (one cell across) and by phase within a revolution (one cell), line means
// removed; the mean square between the phase groups over the mean square within them is F
// with (groups - lines, samples - groups) degrees of freedom. Inputs: ToothWindow, lay, Z fz;
// output: ToothMarks. Cost O(cells log cells). Method: one-way analysis of variance (Fisher
// 1925); F's standard error sqrt(2 / d1 + 2 / d2) for large d (normal approximation).
#include "infer/tooth_marks.h"

#include <algorithm>
#include <cmath>
#include <numbers>
#include <unordered_map>
#include <vector>

namespace cuspmap {
namespace {

// Float rounding of heights of up to ~100 um (2^-24 relative; derived): the least noise.
constexpr double kHeightRoundingUm = 1e-5;

}  // namespace

ToothMarks tooth_marks(const ToothWindow& w, double lay_deg, double revolution_mm) {
  ToothMarks t;
  const Heightfield& m = w.measured;
  const int n = static_cast<int>(w.index.size());
  if (n == 0 || !(revolution_mm > 0.0)) return t;
  const double a = lay_deg * std::numbers::pi / 180.0;
  const double ux = std::cos(a), uy = std::sin(a);
  const Eigen::VectorXd z = w.values - w.q * (w.q.transpose() * w.values);
  const int bins = std::max(1, static_cast<int>(std::lround(revolution_mm / m.cell_mm)));
  // Group key: line across the lay (one cell wide) and phase bin along it.
  struct Sum {
    double s = 0.0;
    int k = 0;
  };
  std::unordered_map<long, Sum> line, group;
  std::vector<long> line_of(static_cast<size_t>(n)), group_of(static_cast<size_t>(n));
  for (int k = 0; k < n; ++k) {
    const int cell = w.index[static_cast<size_t>(k)];
    const double x = m.x_mm(cell % m.nx), y = m.y_mm(cell / m.nx);
    const double along = x * ux + y * uy, across = -x * uy + y * ux;
    const long l = std::lround(across / m.cell_mm);
    double ph = std::fmod(along / revolution_mm, 1.0);
    if (ph < 0.0) ph += 1.0;
    const long b = std::min(bins - 1, static_cast<int>(ph * bins));
    line_of[static_cast<size_t>(k)] = l;
    group_of[static_cast<size_t>(k)] = l * bins + b;
    line[l].s += z[k], ++line[l].k;
    group[l * bins + b].s += z[k], ++group[l * bins + b].k;
  }
  double between = 0.0, within = 0.0;
  for (int k = 0; k < n; ++k) {
    const Sum& g = group[group_of[static_cast<size_t>(k)]];
    const Sum& l = line[line_of[static_cast<size_t>(k)]];
    const double gm = g.s / g.k, lm = l.s / l.k;
    between += (gm - lm) * (gm - lm);
    within += (z[k] - gm) * (z[k] - gm);
  }
  const double d1 = static_cast<double>(group.size()) - static_cast<double>(line.size());
  const double d2 = static_cast<double>(n) - static_cast<double>(group.size());
  if (!(d1 > 0.0) || !(d2 > 0.0)) return t;
  // A noise-free floor's heights are exact to float rounding: its noise is that.
  const double ms_between = between / d1;
  const double ms_within = std::max(within / d2, kHeightRoundingUm * kHeightRoundingUm);
  t.noise_rms_um = std::sqrt(within / d2);
  // The between sum's expectation is d1 noise variances plus n marks variances (expected mean
  // squares of the one-way model): the excess is the marks'.
  t.marks_rms_um = std::sqrt(std::max(0.0, between - d1 * ms_within) / n);
  t.critical_ratio = 1.0 + kMarkSigmas * std::sqrt(2.0 / d1 + 2.0 / d2);
  t.variance_ratio = ms_between / ms_within;
  t.detection_rms_um = std::sqrt((t.critical_ratio - 1.0) * ms_within * d1 / n);
  t.seen = t.variance_ratio > t.critical_ratio;
  return t;
}

}  // namespace cuspmap

// Start search over tilt and pass offset from strip sweeps (one per tilt) shifted across the lay.
// Inputs: FitModel, window samples, plane basis; output: sorted FitStart list. Cost: see header.
// Method: translation invariance of straight passes along the lay (derived); linear
// interpolation of the strip profile; variable projection of the plane (Golub & Pereyra 1973).
#include "infer/fit_starts.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <Eigen/Dense>

namespace cuspmap {
namespace {

constexpr double kDegToRad = std::numbers::pi / 180.0;
// Strip cells per window sample: linear interpolation between strip cells then errs by at most
// (slope jump at a crest) x cell / 4, a few nm on the round-trip floors (derived).
constexpr int kStripCellsPerSample = 4;
// Offsets tried per stepover: 1/64 of a stepover puts the best offset within the solver's
// basin, whose width is a fraction of the pass width (derived from the round trips).
constexpr int kOffsetSteps = 64;

}  // namespace

std::vector<FitStart> fit_starts(const FitModel& model, const Eigen::VectorXd& base,
                                 const Eigen::MatrixXd& xy_mm, const Eigen::VectorXd& z_um,
                                 std::span<const double> alongs,
                                 std::span<const double> acrosses, int& sweeps) {
  const Patch& w = model.window;
  const double stepover = base[kStepoverMm];
  // Across-lay coordinate v of every sample from the point fit_passes centres the passes on.
  const double cx = w.origin_x_mm + 0.5 * w.size_x_mm, cy = w.origin_y_mm + 0.5 * w.size_y_mm;
  const double nx = -std::sin(model.lay_deg * kDegToRad), ny = std::cos(model.lay_deg * kDegToRad);
  const Eigen::Index stride = std::max<Eigen::Index>(1, xy_mm.rows() / kStartSamples);
  const Eigen::Index n = (xy_mm.rows() + stride - 1) / stride;
  Eigen::VectorXd v(n), z(n);
  Eigen::MatrixXd basis(n, 3);
  for (Eigen::Index k = 0; k < n; ++k) {
    const double x = xy_mm(k * stride, 0) - cx, y = xy_mm(k * stride, 1) - cy;
    v[k] = x * nx + y * ny;
    z[k] = z_um[k * stride];
    basis.row(k) << 1.0, x, y;
  }
  Eigen::HouseholderQR<Eigen::MatrixXd> qr(basis);
  const Eigen::MatrixXd q = qr.householderQ() * Eigen::MatrixXd::Identity(n, 3);
  const double v_max = v.cwiseAbs().maxCoeff() + stepover;
  // The strip: passes along +X (lay 0, tilt turned with them), one cell wide, across the passes
  // along Y; centred on 0 so that the offset means what it means in the window.
  FitModel strip = model;
  strip.lay_deg = 0.0;
  const double h = w.cell_mm / kStripCellsPerSample;
  strip.window.cell_mm = h;
  strip.window.size_x_mm = 0.5 * h;
  strip.window.origin_x_mm = -0.5 * h;
  const int cells = static_cast<int>(std::ceil(2.0 * v_max / h)) + 2;
  strip.window.size_y_mm = (cells - 0.5) * h;
  strip.window.origin_y_mm = -0.5 * (cells - 0.5) * h;
  const double y_centre = strip.window.origin_y_mm + 0.5 * strip.window.size_y_mm;

  std::vector<FitStart> out;
  Eigen::VectorXd sim(n), r(n);
  for (const double along : alongs) {
    for (const double across : acrosses) {
      Eigen::VectorXd p = base;
      p[kTiltAlongDeg] = along;
      p[kTiltAcrossDeg] = across;
      p[kOffsetMm] = 0.0;
      const Heightfield prof = simulate_fit_window(strip, p);
      ++sweeps;
      FitStart best;
      best.cost = std::numeric_limits<double>::infinity();
      for (int s = 0; s < kOffsetSteps; ++s) {
        const double off = (s + 0.5) * stepover / kOffsetSteps - 0.5 * stepover;
        for (Eigen::Index k = 0; k < n; ++k) {
          // Floor at v with passes shifted by off = the strip's floor at v - off.
          const double t = (v[k] - off + y_centre - prof.y_mm(0)) / h;
          const int j = std::clamp(static_cast<int>(std::floor(t)), 0, prof.ny - 2);
          const double f = t - j;
          const float a = prof.z_um(j, 0), b = prof.z_um(j + 1, 0);
          // A point no pass reached counts as its measured height (as in the solver).
          sim[k] = std::isfinite(a) && std::isfinite(b) ? (1.0 - f) * a + f * b : 0.0;
        }
        r = z - sim;
        r -= q * (q.transpose() * r);
        const double cost = r.squaredNorm();
        if (cost < best.cost) {
          best.cost = cost;
          best.params = p;
          best.params[kOffsetMm] = off;
        }
      }
      out.push_back(best);
    }
  }
  std::sort(out.begin(), out.end(),
            [](const FitStart& l, const FitStart& r2) { return l.cost < r2.cost; });
  return out;
}

}  // namespace cuspmap

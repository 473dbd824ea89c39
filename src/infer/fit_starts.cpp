// Start search over tilt and pass offset from strip sweeps (one per tilt) shifted across the lay.
// Inputs: FitModel, window samples, plane basis; output: sorted FitStart list. Cost: see header.
// Method: translation invariance of straight passes along the lay (derived); linear
// interpolation of the strip profile; variable projection of the plane (Golub & Pereyra 1973).
#include "infer/fit_starts.h"

#include <algorithm>
#include <cmath>
#include <limits>
#include <vector>
#include <Eigen/Dense>

#include "core/parallel_blocks.h"

namespace cuspmap {
namespace {

// Offsets tried per stepover: 1/64 of a stepover puts the best offset within the solver's
// basin, whose width is a fraction of the pass width (derived from the round trips).
constexpr int kOffsetSteps = 64;

}  // namespace

std::vector<FitStart> fit_starts(const FitModel& model, const Eigen::VectorXd& base,
                                 const Eigen::MatrixXd& xy_mm, const Eigen::VectorXd& z_um,
                                 std::span<const double> alongs,
                                 std::span<const double> acrosses, int& sweeps) {
  const double stepover = base[kStepoverMm];
  const Eigen::Index stride = std::max<Eigen::Index>(1, xy_mm.rows() / kStartSamples);
  const Eigen::Index n = (xy_mm.rows() + stride - 1) / stride;
  Eigen::VectorXd v(n), z(n);
  Eigen::MatrixXd basis(n, 3);
  for (Eigen::Index k = 0; k < n; ++k) {
    const double x = xy_mm(k * stride, 0), y = xy_mm(k * stride, 1);
    v[k] = across_lay_mm(model, x, y);
    z[k] = z_um[k * stride];
    basis.row(k) << 1.0, x, y;
  }
  Eigen::HouseholderQR<Eigen::MatrixXd> qr(basis);
  const Eigen::MatrixXd q = qr.householderQ() * Eigen::MatrixXd::Identity(n, 3);
  // Every tilt pair is independent: the alongs on parallel blocks, each filling its own row of
  // starts (the order, and so the result, is the same for any thread count).
  const size_t na = alongs.size(), nc = acrosses.size();
  std::vector<FitStart> out(na * nc);
  parallel_blocks(static_cast<int>(na), model.threads, [&](int ia) {
    Eigen::VectorXd sim(n), r(n);
    for (size_t ic = 0; ic < nc; ++ic) {
      Eigen::VectorXd p = base;
      p[kTiltAlongDeg] = alongs[static_cast<size_t>(ia)];
      p[kTiltAcrossDeg] = acrosses[ic];
      p[kOffsetMm] = 0.0;
      const FitProfile prof = simulate_fit_profile(model, p);
      FitStart& best = out[static_cast<size_t>(ia) * nc + ic];
      best.cost = std::numeric_limits<double>::infinity();
      for (int s = 0; s < kOffsetSteps; ++s) {
        const double off = (s + 0.5) * stepover / kOffsetSteps - 0.5 * stepover;
        for (Eigen::Index k = 0; k < n; ++k) {
          // Floor at v with passes shifted by off = the profile at v - off; a point no pass
          // reached counts as its measured height (as in the solver).
          const double h = prof.at(v[k] - off);
          sim[k] = std::isfinite(h) ? h : 0.0;
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
    }
  });
  sweeps += static_cast<int>(na * nc);
  std::sort(out.begin(), out.end(),
            [](const FitStart& l, const FitStart& r2) { return l.cost < r2.cost; });
  return out;
}

}  // namespace cuspmap

// The tooth stage's model of a simulated one-way raster along +X (tests/infer/diagnose_floors.h)
// with each pass's true start shift, from the job's own clock (sweep/prepare_moves).
#pragma once

#include <cmath>
#include <vector>

#include "infer/tooth_model.h"
#include "infer/tooth_window.h"
#include "job/job.h"
#include "path/build_toolpath.h"
#include "path/move.h"

namespace cuspmap::test {

/// The model (the job's cutter, passes placed about the window) and the true shifts, mm.
struct ToothTruth {
  ToothModel model;
  std::vector<double> shift_mm;  ///< per pass of model.pass_index
};

/// Every move with a length and a feed adds length / feed to the clock; a pass starting at time
/// t has tooth 0 at rpm/60 t turns, so the model's pass (tooth 0 at 0 when it starts `shift`
/// behind its usual start) matches it at shift = (model start - job start) + turns x Z fz
/// modulo Z fz (derived). Requires every model pass to be one of the job's.
inline ToothTruth tooth_truth(const Job& job, const ToothWindow& w) {
  ToothTruth t;
  ToothModel& m = t.model;
  const double s = job.path.stepover_mm;
  const double rev = job.cut.feed_mm_per_min / job.cut.rpm;
  m.cutter = job.cutter;
  m.stepover_mm = s;
  m.feed_per_tooth_mm = rev / job.cutter.teeth;
  m.window = w.patch;
  m.threads = 2;
  const double cy = w.patch.origin_y_mm + 0.5 * w.patch.size_y_mm;
  const double cx = w.patch.origin_x_mm + 0.5 * w.patch.size_x_mm;
  m.offset_mm = std::round(cy / s) * s - cy;
  place_passes(m, RasterDirection::OneWay, 0);
  const BuiltPath built = build_toolpath(job.path, job.cut, job.patch, job.cutter);
  const double reach = 0.5 * std::hypot(w.patch.size_x_mm, w.patch.size_y_mm) + 3.0;
  double clock_s = 0.0;
  std::vector<double> t0, ys, xs;
  for (const Move& mv : built.path.moves) {
    const double len = move_length_mm(mv);
    if (!(len > 0.0) || !(mv.feed_mm_per_min > 0.0)) continue;
    if (!mv.rapid) {
      t0.push_back(clock_s);
      ys.push_back(mv.start_mm.y());
      xs.push_back(mv.start_mm.x());
    }
    clock_s += len / mv.feed_mm_per_min * 60.0;
  }
  for (size_t p = 0; p < m.pass_index.size(); ++p) {
    const double y = cy + m.offset_mm + m.pass_index[p] * s;
    size_t q = 0;
    while (q < ys.size() && std::abs(ys[q] - y) > 1e-6) ++q;
    if (q == ys.size()) return {};
    double shift = cx - reach - xs[q] + job.cut.rpm / 60.0 * t0[q] * rev;
    t.shift_mm.push_back(shift - std::floor(shift / rev) * rev);
  }
  return t;
}

}  // namespace cuspmap::test

// Test oracle: a Z-map by brute-force stamping. Every move is sampled at a fixed spacing (XY
// travel, or Z travel for vertical moves) and the whole cutter is stamped at every sample; with
// runout the body is also stamped at evenly spaced spindle angles. Heights um, NaN = unreached.
// Cost O(samples x cells under the cutter): slow on purpose, independent of src/sweep/ (it uses
// only path/move.h and tool/cutter.h). Header-only so tests/CMakeLists.txt globs stay as they are.
// Method: discrete Z-map stamping (Choi & Jerard, Sculptured Surface Machining, 1998, Z-map
// simulation); its own error is the sampling sagitta, derived in each test that uses it.
#pragma once

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>

#include "core/heightfield.h"
#include "path/move.h"
#include "tool/cutter.h"
#include "tool/dense_scan_min.h"

namespace cuspmap::test {

/// Stamps the cutter along the path.
/// @param[in] cutter       cutter (ball/bull-nose/flat, dish, tilt, runout, axial offsets)
/// @param[in] path         moves, program coordinates
/// @param[in] patch        grid (cell centres at origin + (i + 0.5) cell), floor_z
/// @param[in] step_mm      sample spacing along each move (> 0)
/// @param[in] body_angles  spindle angles stamped per sample when the cutter has runout (>= 1)
/// @return heights um above floor_z, NaN where no stamp reached
inline Heightfield brute_force_stamp(const Cutter& cutter, const Toolpath& path, const Patch& patch,
                                     double step_mm, int body_angles = 1) {
  Heightfield hf = make_heightfield(patch, 0);
  const double big_r = cutter.radius_mm();
  const double e = cutter.runout_mm;
  const double reach = big_r + e;
  const double deg = std::numbers::pi / 180.0;
  const double tan_tilt = std::tan(cutter.tilt_deg * deg);
  const double nx_dir = std::cos(cutter.tilt_toward_deg * deg);
  const double ny_dir = std::sin(cutter.tilt_toward_deg * deg);
  double axial_min_mm = 0.0;
  for (std::size_t k = 0; k < cutter.axial_offsets_um.size() && k < std::size_t(cutter.teeth);
       ++k) {
    axial_min_mm = k == 0 ? cutter.axial_offsets_um[k] / 1000.0
                          : std::min(axial_min_mm, cutter.axial_offsets_um[k] / 1000.0);
  }
  const int angles = e > 0.0 ? std::max(1, body_angles) : 1;
  for (const Move& m : path.moves) {
    const double xy_len = m.kind == MoveKind::Line
                              ? (m.end_mm.head<2>() - m.start_mm.head<2>()).norm()
                              : std::abs(arc_sweep_rad(m)) * arc_radius_mm(m);
    const double span = xy_len > 0.0 ? xy_len : std::abs(m.end_mm.z() - m.start_mm.z());
    const int samples = std::max(1, static_cast<int>(std::ceil(span / step_mm))) + 1;
    for (int s = 0; s < samples; ++s) {
      const Eigen::Vector3d c = move_point_mm(m, static_cast<double>(s) / (samples - 1));
      const double z_um = (c.z() - patch.floor_z_mm) * 1000.0;
      const int i0 = std::max(
          0, static_cast<int>(std::floor((c.x() - reach - patch.origin_x_mm) / patch.cell_mm)));
      const int i1 = std::min(
          hf.nx - 1,
          static_cast<int>(std::ceil((c.x() + reach - patch.origin_x_mm) / patch.cell_mm)));
      const int j0 = std::max(
          0, static_cast<int>(std::floor((c.y() - reach - patch.origin_y_mm) / patch.cell_mm)));
      const int j1 = std::min(
          hf.ny - 1,
          static_cast<int>(std::ceil((c.y() + reach - patch.origin_y_mm) / patch.cell_mm)));
      for (int a = 0; a < angles; ++a) {
        const double phi = 2.0 * std::numbers::pi * a / angles;
        const double ox = c.x() + e * std::cos(phi), oy = c.y() + e * std::sin(phi);
        for (int j = j0; j <= j1; ++j) {
          for (int i = i0; i <= i1; ++i) {
            const double px = hf.x_mm(i), py = hf.y_mm(j);
            const double r = std::hypot(px - ox, py - oy);
            if (r > big_r) continue;
            // Tilt acts on the offset from the spindle axis (DESIGN.md first-order model).
            const double tilt_mm = tan_tilt * ((px - c.x()) * nx_dir + (py - c.y()) * ny_dir);
            const double h =
                z_um + (profile_height_mm(cutter, r) - tilt_mm + axial_min_mm) * 1000.0;
            float& cell = hf.z_um(j, i);
            if (std::isnan(cell) || h < cell) cell = static_cast<float>(h);
          }
        }
      }
    }
  }
  return hf;
}

/// Lowest height one move leaves at a single point, by dense sampling of the move parameter and a
/// golden-section refinement of the best sample: the continuous minimum of z(t) + p_tilt(P - c(t))
/// to ~1e-9 mm for the unimodal-per-bracket heights of the test cases (no runout).
/// @param[in] samples  samples over t in [0, 1] before refining (>= 3)
/// @return um above floor_z, +infinity when the point is never under the cutter
inline double dense_min_along_move_um(const Cutter& cutter, const Move& move, double floor_z_mm,
                                      const Eigen::Vector2d& p_mm, int samples) {
  const double deg = std::numbers::pi / 180.0;
  const double tan_tilt = std::tan(cutter.tilt_deg * deg);
  const Eigen::Vector2d n(std::cos(cutter.tilt_toward_deg * deg),
                          std::sin(cutter.tilt_toward_deg * deg));
  auto h = [&](double t) {
    const Eigen::Vector3d c = move_point_mm(move, t);
    const Eigen::Vector2d v = p_mm - c.head<2>();
    const double r = v.norm();
    if (r > cutter.radius_mm()) return std::numeric_limits<double>::infinity();
    return (c.z() - floor_z_mm + profile_height_mm(cutter, r) - tan_tilt * v.dot(n)) * 1000.0;
  };
  return dense_scan_min(h, 0.0, 1.0, samples - 1);
}

/// Lowest tooth-edge height over one point from a whole path, by time stepping: every tooth's
/// edge (a radial line from the runout-offset centre, DESIGN.md "Tooth-resolved") is followed
/// in steps of 1/steps_per_tooth of the tooth period; a change of side of the point with the
/// edge in front of the centre is a crossing, its time linearly interpolated.
/// @param[in] rpm, cw      spindle speed and direction (cw = M3, negative angular speed)
/// @param[in] steps_per_tooth  time steps per tooth period (>= 8)
/// @return um above floor_z, +infinity when no tooth passes the point
inline double time_stepped_teeth_um(const Cutter& cutter, const Toolpath& path, double floor_z_mm,
                                    const Eigen::Vector2d& p_mm, double rpm, bool cw,
                                    int steps_per_tooth) {
  const double two_pi = 2.0 * std::numbers::pi, deg = std::numbers::pi / 180.0;
  const double omega = (cw ? -1.0 : 1.0) * two_pi * rpm / 60.0;
  const int z = std::max(1, cutter.teeth);
  const double tan_tilt = std::tan(cutter.tilt_deg * deg);
  const Eigen::Vector2d n(std::cos(cutter.tilt_toward_deg * deg),
                          std::sin(cutter.tilt_toward_deg * deg));
  const double dt = two_pi / std::abs(omega) / z / steps_per_tooth;
  double best = std::numeric_limits<double>::infinity();
  double clock = 0.0;
  for (const Move& m : path.moves) {
    const double duration = move_length_mm(m) / m.feed_mm_per_min * 60.0;
    if (!(duration > 0.0)) continue;
    const int steps = static_cast<int>(std::ceil(duration / dt));
    // Side of the point w.r.t. tooth k's edge line, and its distance along the edge.
    auto state = [&](double t_local, int k, double& side, double& along, Eigen::Vector2d& v) {
      const Eigen::Vector3d c = move_point_mm(m, t_local / duration);
      const double theta = omega * (clock + t_local);
      const Eigen::Vector2d centre =
          c.head<2>() +
          cutter.runout_mm * Eigen::Vector2d(std::cos(theta + cutter.runout_phase_deg * deg),
                                             std::sin(theta + cutter.runout_phase_deg * deg));
      const double a = theta + two_pi * k / z;
      const Eigen::Vector2d u(std::cos(a), std::sin(a));
      const Eigen::Vector2d q = p_mm - centre;
      side = u.x() * q.y() - u.y() * q.x();
      along = u.dot(q);
      v = p_mm - c.head<2>();
    };
    for (int k = 0; k < z; ++k) {
      const double axial = k < static_cast<int>(cutter.axial_offsets_um.size())
                               ? cutter.axial_offsets_um[k] / 1000.0
                               : 0.0;
      double side0 = 0.0, along0 = 0.0;
      Eigen::Vector2d v0;
      state(0.0, k, side0, along0, v0);
      double t0 = 0.0;
      for (int i = 1; i <= steps; ++i) {
        const double t1 = std::min(duration, i * dt);
        double side1 = 0.0, along1 = 0.0;
        Eigen::Vector2d v1;
        state(t1, k, side1, along1, v1);
        if ((side0 < 0.0) != (side1 < 0.0) && along0 + along1 > 0.0) {
          const double f = side0 / (side0 - side1);
          const double tc = t0 + f * (t1 - t0);
          double sc = 0.0, r = 0.0;
          Eigen::Vector2d vc;
          state(tc, k, sc, r, vc);
          if (r >= 0.0 && r <= cutter.radius_mm()) {
            const double zc = move_point_mm(m, tc / duration).z();
            const double h =
                zc - floor_z_mm + profile_height_mm(cutter, r) + axial - tan_tilt * vc.dot(n);
            best = std::min(best, h * 1000.0);
          }
        }
        side0 = side1;
        along0 = along1;
        t0 = t1;
      }
    }
    clock += duration;
  }
  return best;
}

}  // namespace cuspmap::test

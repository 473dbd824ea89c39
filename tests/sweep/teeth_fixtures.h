// Cutters shared by the tooth-resolved sweep tests (invented test tools, not real products).
#pragma once

#include "tool/cutter.h"

namespace cuspmap::test {

/// A 1.6 mm bull-nose (rc 0.3 mm), 4 teeth at different axial offsets, tilted 0.3 deg toward
/// 120 deg: every term of the tooth model at once.
inline Cutter offset_tilted_bull() {
  Cutter bull;
  bull.shape = CutterShape::BullNose;
  bull.diameter_mm = 1.6;
  bull.corner_radius_mm = 0.3;
  bull.teeth = 4;
  bull.axial_offsets_um = {0.0, 1.5, -0.5, 0.8};
  bull.tilt_deg = 0.3;
  bull.tilt_toward_deg = 120.0;
  return bull;
}

}  // namespace cuspmap::test

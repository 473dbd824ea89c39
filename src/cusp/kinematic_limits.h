// What every cuspmap prediction models and leaves out: the kinematic best case (the geometry of
// the cutter and its path), the one-line statement said once per output, and the caution shown
// next to a predicted Ra finer than milling usually measures. Heights um.
// Method: statement of the model's scope; the 0.2 um threshold from handbook charts of roughness
// by process (milling rarely measures finer; recalled, not checked against a chart).
#pragma once

#include <string>

#include "core/units.h"

namespace cuspmap {

/// Said once in every human output and report that carries a prediction.
inline constexpr const char* kKinematicBestCase =
    "Every prediction here is a kinematic best case (the geometry of the cutter and its path): "
    "ploughing at low chip thickness, tool deflection, vibration and built-up edge add roughness "
    "on real machines, most at fine stepovers and feeds.";

/// A predicted Ra below this draws fine_ra_caution() (from memory of handbook charts of
/// roughness by process: milling rarely measures finer than about 0.2 um Ra).
inline constexpr double kFineRaCautionUm = 0.2;

/// The caution for a predicted Ra below kFineRaCautionUm, or "" when ra_um is at or above it.
/// @param[in] ra_um  predicted Ra, um (finite)
/// @param[in] unit   display unit of the text: um (mm) or uin (in), 3 significant figures
std::string fine_ra_caution(double ra_um, LengthUnit unit = LengthUnit::Millimetre);

}  // namespace cuspmap

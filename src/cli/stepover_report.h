// Presentation of `cuspmap stepover` results: human table (mm/um or in/uin), one JSON object
// (mm/um), warning/note/caution lines, the unreachable-target message and the --help footer.
// Inputs: StepoverReport; outputs: text and JSON. No computation beyond unit display.
// Method: DESIGN.md "Command line" (stepover JSON keys).
#pragma once

#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "core/units.h"
#include "cusp/cusp_setup.h"
#include "cusp/inverse_stepover.h"
#include "finish/areal_stepover.h"

namespace cuspmap {

/// Everything `stepover` found, ready to print.
struct StepoverReport {
  LengthUnit unit = LengthUnit::Millimetre;     ///< display unit of the human table
  bool turning = false;                         ///< --tool insert: turning feed marks
  double nose_radius_mm = 0.0;                  ///< insert nose radius (turning)
  CuspSetup setup;                              ///< cutter and surface (milling)
  bool inverse = false;                         ///< a --target-* was given
  FinishTarget target = FinishTarget::Scallop;  ///< which target (inverse)
  double target_um = 0.0;                       ///< target value (inverse), um
  double stepover_approx_mm = 0.0;          ///< stepover from the approximation (inverse); 0 = none
  CuspResult cusp;                          ///< cross-feed cusp (or turning marks)
  bool teeth_given = false;                 ///< --teeth was given
  std::optional<double> feed_per_tooth_mm;  ///< --feed-per-tooth, mm
  std::optional<CuspResult> feed_mark;      ///< feed-per-tooth marks (ball, bull-nose corner)
  std::optional<CuspResult> feed_mark_per_rev;  ///< marks once per revolution (runout), fz * teeth
  bool both_directions = false;                 ///< --both-directions: the target holds along the
                                                ///< feed too
  std::optional<double> feed_per_tooth_max_mm;  ///< largest fz whose feed mark meets the target
                                                ///< (both directions, inverse, ball/bull-nose)
  std::vector<std::string> notes;               ///< notes gathered while reading flags
  /// --target-sa with --feed-per-tooth: the stepover designed on windows swept tooth by tooth
  /// (the target is then Sa, the cusp is the cross-feed cusp at that stepover).
  std::optional<ArealStepover> areal;
  bool areal_target = false;                    ///< --target-sa was given (with or without fz)
  RasterDirection pass_direction = RasterDirection::OneWay;  ///< passes of the areal design
};

/// The one JSON object (mm, um), with warnings[], notes[] and cautions[].
nlohmann::json stepover_json(const StepoverReport& rep);

/// The human table in rep.unit, followed by note/warning/caution lines; ends with a newline.
std::string stepover_table(const StepoverReport& rep);

/// One-line error for a target no stepover reaches, naming the value and the largest reachable.
std::string unreachable_message(const CuspSetup& setup, const std::string& flag,
                                FinishTarget target, double target_um, const StepoverSolution& sol);

/// One-line error for a --stepover whose neighbouring passes no longer overlap (uncut strips
/// between them): names the stepover and the largest allowed (the diameter, or the reach of the
/// tool circles along a cylinder).
std::string no_overlap_message(const CuspSetup& setup, double stepover_mm);

/// Conventions and examples shown at the end of `cuspmap stepover --help`.
std::string stepover_help_footer();

}  // namespace cuspmap

// GritTable: the abrasive grades a sanding sequence may use, each with its mean particle size,
// the depth and Ra of the scratches it leaves and its hand removal rate; plus the built-in
// defaults (labelled). Sizes um, rates mm^3/min.
// Method: FEPA P-grade mean particle sizes (FEPA 43 series, values from memory, agreeing with
// public secondary charts); scratch depth and Ra as fixed fractions of the particle size.
#pragma once

#include <string>
#include <string_view>
#include <vector>

namespace cuspmap {

/// Scratch depth (peak to valley) a coated abrasive leaves, as a fraction of its mean particle
/// size. From memory, rough: hand-sanded metal shows Rz of about 1/14 of the grain size; a grain
/// cuts with a small fraction of its height. Override per grit in a table file.
inline constexpr double kScratchDepthPerParticle = 0.07;

/// Ra a coated abrasive leaves, as a fraction of its mean particle size. From memory, rough:
/// P400 on aluminium or steel by hand gives Ra of roughly 0.3-0.4 um (35 um grains).
inline constexpr double kRaPerParticle = 0.01;

/// Hand removal rate per um of mean particle size, mm^3/min. Default, no source (a labelled
/// placeholder of plausible size: P180 -> ~8 mm^3/min). Measure yours and use a table file.
inline constexpr double kRemovalMm3PerMinPerParticleUm = 0.1;

/// One abrasive grade.
struct Grit {
  std::string name;                  ///< grade as printed on the paper, e.g. "P240"
  double particle_um = 0.0;          ///< mean particle size, um, > 0
  double scratch_um = 0.0;           ///< depth of its scratches, peak to valley, um, > 0
  double ra_um = 0.0;                ///< Ra it leaves on its own, um, > 0
  double removal_mm3_per_min = 0.0;  ///< volume it removes per minute by hand, mm^3/min, > 0
};

/// The grades available and the sequence used when the user names none.
struct GritTable {
  std::vector<Grit> grits;            ///< coarse to fine (particle size decreasing)
  std::vector<std::string> sequence;  ///< default sequence, coarse to fine, names from `grits`
  std::string source;                 ///< where the values come from, one line (for the report)
};

/// The built-in table: P80 ... P1200 with FEPA P-grade mean particle sizes (from memory),
/// scratch depth and Ra from kScratchDepthPerParticle / kRaPerParticle, removal rates from
/// kRemovalMm3PerMinPerParticleUm (default, no source); sequence P180, P240, P320, P400
/// (common practice, no source). tests/data/grits_default.toml holds the same values.
GritTable default_grit_table();

/// The grade named `name` (exact match, case-sensitive), or nullptr.
const Grit* find_grit(const GritTable& table, std::string_view name);

}  // namespace cuspmap

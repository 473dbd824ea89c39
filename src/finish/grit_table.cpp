// Built-in abrasive table: FEPA P-grade mean particle sizes and derived scratch depth, Ra and
// hand removal rate per grade. Sizes um, rates mm^3/min.
// Method: FEPA 43 P-grade mean particle sizes, from memory (they agree with public secondary
// charts, e.g. sizes.com/tools/sandpaper.htm; not checked against the standard's own table).
#include "finish/grit_table.h"

#include <array>
#include <utility>

namespace cuspmap {

GritTable default_grit_table() {
  // FEPA P-grade mean particle sizes, um (from memory; see the file header).
  static constexpr std::array<std::pair<const char*, double>, 16> kFepaP = {{
      {"P80", 201.0},
      {"P100", 162.0},
      {"P120", 125.0},
      {"P150", 100.0},
      {"P180", 82.0},
      {"P220", 68.0},
      {"P240", 58.5},
      {"P280", 52.2},
      {"P320", 46.2},
      {"P360", 40.5},
      {"P400", 35.0},
      {"P500", 30.2},
      {"P600", 25.8},
      {"P800", 21.8},
      {"P1000", 18.3},
      {"P1200", 15.3},
  }};
  GritTable table;
  for (const auto& [name, particle_um] : kFepaP) {
    table.grits.push_back(Grit{name, particle_um, kScratchDepthPerParticle * particle_um,
                               kRaPerParticle * particle_um,
                               kRemovalMm3PerMinPerParticleUm * particle_um});
  }
  table.sequence = {"P180", "P240", "P320", "P400"};
  table.source =
      "approximate built-in values; replace with your own (--grit-table): P-grade mean particle "
      "sizes after FEPA 43-2; scratch depth 0.07 and Ra 0.01 x particle size, removal 0.1 "
      "mm^3/min per um of particle size (rough shop estimates)";
  return table;
}

const Grit* find_grit(const GritTable& table, std::string_view name) {
  for (const Grit& grit : table.grits) {
    if (grit.name == name) return &grit;
  }
  return nullptr;
}

}  // namespace cuspmap

// The comparison of several simulated jobs: rows of Ra, Rz, Sa, Sz, cusp, path length, cycle time
// and sanding figures, the best value per column, as JSON, CSV, a terminal table, a labelled
// montage of the shaded floors on one scale over their native-resolution details, and an HTML
// page. Heights um, lengths mm, times s.
#pragma once

#include <nlohmann/json.hpp>
#include <optional>
#include <string>
#include <vector>

#include "report/html_report.h"
#include "io/raster_image.h"
#include "report/simulation_pictures.h"
#include "job/common_profile_basis.h"
#include "job/job.h"
#include "job/run_job.h"

namespace cuspmap {

/// One compared job and what its simulation produced.
struct CompareRow {
  Job job;                        ///< the job (possibly a variation of another)
  JobRun run;                     ///< its simulation
  SimulationPictures pictures;    ///< its pictures on the shared scale
};

/// A column of the comparison: name, JSON key, and which end is best.
struct CompareColumn {
  const char* title;     ///< header text
  const char* key;       ///< JSON/CSV key (unit-suffixed)
  bool lower_is_better;  ///< all compared columns are "lower is better" except none today
  double (*value)(const CompareRow&);  ///< the number, in the key's unit
  bool profile = false;  ///< a profile parameter: ranked only on a common ProfileBasis
};

/// The compared columns, in display order.
const std::vector<CompareColumn>& compare_columns();

/// Index of the best row per column (lowest value; first on ties); empty for a profile column
/// when the basis is not common (its values cannot be ranked).
std::vector<std::optional<size_t>> best_rows(const std::vector<CompareRow>& rows,
                                             const ProfileBasis& basis);

/// How a row's profile was traced, one short phrase: "across 90 deg", "along X (no lay)",
/// "at 30 deg".
std::string profile_direction_text(const ProfileReport& p);

/// compare.json: {rows[{name, job, Ra_um, ..., cutoff_mm, direction, direction_deg}],
/// best{key: row index or null}, basis{cutoff_mm, cutoff_rule, ranked, reasons[], notes[]}}.
nlohmann::json compare_json(const std::vector<CompareRow>& rows, const ProfileBasis& basis);

/// compare.csv: header line then one line per row; numbers with 6 significant digits; the
/// cut-off and direction of each row's profile after the numbers.
std::string compare_csv(const std::vector<CompareRow>& rows);

/// Terminal table in the display unit with each row's cut-off and trace direction, best value
/// per ranked column marked with '*', and the basis (or why a column is not ranked) below.
std::string compare_table_text(const std::vector<CompareRow>& rows, const ProfileBasis& basis,
                               LengthUnit units);

/// Shaded floors side by side on one scale, each labelled (path, tool, stepover, feed), with
/// their detail windows outlined; below them the detail reliefs on one (finer) scale.
Image compare_montage(const std::vector<CompareRow>& rows, LengthUnit units);

/// The HTML page: inputs per job, the table with best values marked, the montage, cautions.
HtmlReport compare_html_report(const std::vector<CompareRow>& rows, const ProfileBasis& basis,
                               const std::string& montage_png, LengthUnit units);

}  // namespace cuspmap

// The HTML report: one self-contained printable page (pictures as base64 data: URIs) with
// inputs, results tables (best per column marked by class and symbol), pictures, profiles,
// filters, a reading guide and the safety cautions. Filled by simulate, compare and plan.
// Method: HTML5 (WHATWG) + CSS paged-media print rules; RFC 4648 base64.
#pragma once

#include <limits>
#include <string>
#include <string_view>
#include <vector>

namespace cuspmap {

/// One row of the inputs table.
struct HtmlKeyValue {
  std::string key;    ///< e.g. "tool"
  std::string value;  ///< e.g. "ball, 6 mm, 2 teeth"
};

/// Which value of a column is the best one.
enum class BestIs {
  None,     ///< column is not ranked (names, notes)
  Lowest,   ///< smallest value is best (Ra, cycle time, cost)
  Highest,  ///< largest value is best
};

/// One table cell: the text shown and, for ranked columns, the number it stands for.
struct HtmlCell {
  std::string text;                                         ///< shown (escaped)
  double value = std::numeric_limits<double>::quiet_NaN();  ///< NaN = not ranked
};

/// A results table.
struct HtmlTable {
  std::string caption;               ///< e.g. "Strategies compared"
  std::vector<std::string> columns;  ///< header texts
  std::vector<BestIs> best;          ///< per column; shorter than columns = None for the rest
  std::vector<std::vector<HtmlCell>> rows;  ///< each row has <= columns.size() cells
};

/// A picture: PNG bytes embedded in the page.
struct HtmlImage {
  std::string png;      ///< complete PNG file bytes (encode_png)
  std::string alt;      ///< short text for screen readers and when pictures are off
  std::string caption;  ///< shown under the picture: what it shows, scale, range, light
};

/// Everything a report page holds; empty parts are left out (the reading guide and the safety
/// cautions are always there).
struct HtmlReport {
  std::string title;                     ///< page and h1 title
  std::string subtitle;                  ///< e.g. "cuspmap 0.1.0 - simulate pump_cover.toml"
  std::vector<HtmlKeyValue> inputs;      ///< tool, path, patch, cut ...
  std::vector<HtmlTable> tables;         ///< results
  std::vector<HtmlImage> images;         ///< height, shaded, montage pictures
  std::vector<HtmlImage> profile_plots;  ///< profile pictures
  std::vector<std::string> filters;      ///< cut-off and filters used, one item each
  std::vector<std::string> notes;        ///< further remarks (ignored keys, warnings)
  std::vector<std::string> cautions;     ///< added after the standard safety cautions
};

/// Escapes text for HTML content and attribute values: & < > " ' become entities; other bytes
/// (UTF-8 included) pass unchanged.
std::string html_escape(std::string_view text);

/// The safety cautions every report carries (rotating tools, workholding, combustible and
/// harmful dust, model not measurement, local codes / machine maker / licensed practice).
std::vector<std::string> standard_cautions();

/// The caution in one line, printed once per run on the terminal; the full lists go to the
/// reports, the JSON and --help.
inline constexpr const char* kShortCaution =
    "Caution: rotating tools, workholding and combustible, harmful metal dust; prove the program "
    "and the sanding set-up as the makers instruct and follow local codes and licensed practice "
    "(full cautions: --help and the reports).";

/// `cautions` as a --help footer paragraph: "Cautions:" then one "  - " line each.
std::string cautions_help_text(const std::vector<std::string>& cautions);

/// Renders the page. Sections carry ids: inputs, results, pictures, profiles, filters, notes,
/// how-to-read, cautions. A best cell has class "best" and the mark "★" (also spelled out for
/// screen readers); the inline script sets body data-images-loaded="true" once every picture
/// has decoded (used by the browser test).
/// @return UTF-8 HTML text, deterministic for the same input
std::string render_html_report(const HtmlReport& report);

}  // namespace cuspmap

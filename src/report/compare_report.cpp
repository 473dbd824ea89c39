// Comparison outputs for several simulations: JSON, CSV, terminal table, montage, HTML page.
// Inputs: CompareRow (Job + JobRun + pictures); outputs: text/bytes, heights um, lengths mm.
#include "report/compare_report.h"

#include <algorithm>
#include <charconv>
#include <cstdio>

#include "core/display_quantity.h"
#include "cusp/kinematic_limits.h"
#include "report/montage.h"
#include "report/nice_ticks.h"
#include "io/texture_json.h"

namespace cuspmap {
namespace {

// Full precision for CSV: the shortest text that reads back to the same double.
std::string full_precision(double v) {
  char buf[64];
  const auto [ptr, ec] = std::to_chars(buf, buf + sizeof buf, v);
  return ec == std::errc() ? std::string(buf, ptr) : "nan";
}

// Display value of a column in the chosen units (heights um or uin, lengths mm or in).
double display_value(const CompareColumn& c, const CompareRow& row, LengthUnit units) {
  const double v = c.value(row);
  if (units != LengthUnit::Inch) return v;
  const std::string key = c.key;
  if (key.ends_with("_um")) return v * kUinPerUm;
  if (key.ends_with("_mm")) return v / kMmPerInch;
  return v;
}

// A column's value as text: 3 significant figures, resolution floors of display_quantity.h.
std::string column_text(const CompareColumn& c, const CompareRow& row, LengthUnit units) {
  const std::string key = c.key;
  const double v = c.value(row);
  if (key.ends_with("_um")) return display_roughness_number(v, units);
  if (key.ends_with("_mm")) return display_length_number(v, units);
  if (key.ends_with("_s")) return display_time_number(v, TimeUnit::Second);
  return display_number(v, 0.0);
}

std::string display_unit(const CompareColumn& c, LengthUnit units) {
  const std::string key = c.key;
  if (key.ends_with("_um")) return units == LengthUnit::Inch ? "uin" : "um";
  if (key.ends_with("_mm")) return units == LengthUnit::Inch ? "in" : "mm";
  if (key.ends_with("_s")) return "s";
  return "";
}

}  // namespace

const std::vector<CompareColumn>& compare_columns() {
  static const std::vector<CompareColumn> columns = {
      {"Ra", "Ra_um", true, [](const CompareRow& r) { return r.run.texture.profile.roughness.a_um; },
       true},
      {"Rz", "Rz_um", true, [](const CompareRow& r) { return r.run.texture.profile.roughness.z_um; },
       true},
      {"Sa", "Sa_um", true, [](const CompareRow& r) { return r.run.texture.areal.parameters.sa_um; }},
      {"Sz", "Sz_um", true, [](const CompareRow& r) { return r.run.texture.areal.parameters.sz_um; }},
      {"cusp", "cusp_um", true, [](const CompareRow& r) { return r.run.cusp_um; }},
      {"mean sanding depth Sv", "mean_removal_um", true,
       [](const CompareRow& r) { return r.run.texture.areal.parameters.sv_um; }},
      {"path", "path_length_mm", true, [](const CompareRow& r) { return r.run.path_length_mm; }},
      {"cycle", "cycle_time_s", true, [](const CompareRow& r) { return r.run.cycle_time_s; }},
  };
  return columns;
}

std::vector<std::optional<size_t>> best_rows(const std::vector<CompareRow>& rows,
                                             const ProfileBasis& basis) {
  std::vector<std::optional<size_t>> best;
  for (const CompareColumn& c : compare_columns()) {
    if (c.profile && !basis.rankable()) {
      best.emplace_back();
      continue;
    }
    size_t b = 0;
    for (size_t k = 1; k < rows.size(); ++k) {
      if (c.value(rows[k]) < c.value(rows[b])) b = k;
    }
    best.push_back(b);
  }
  return best;
}

std::string profile_direction_text(const ProfileReport& p) {
  if (p.direction == "angle") return "at " + format_number(p.direction_deg) + " deg";
  if (p.lay_source == "none") return "along X (no lay)";
  return p.direction + " " + format_number(p.direction_deg) + " deg";
}

nlohmann::json compare_json(const std::vector<CompareRow>& rows, const ProfileBasis& basis) {
  nlohmann::json out;
  out["rows"] = nlohmann::json::array();
  for (const CompareRow& row : rows) {
    nlohmann::json j = {{"name", row.job.name}, {"job", row.job.source}};
    for (const CompareColumn& c : compare_columns()) j[c.key] = c.value(row);
    j["Sv_um"] = row.run.texture.areal.parameters.sv_um;
    j["depth_to_clear_um"] = row.run.texture.areal.parameters.sz_um;
    j["cutoff_mm"] = row.run.texture.profile.cutoff_mm;
    j["direction"] = row.run.texture.profile.direction;
    j["direction_deg"] = row.run.texture.profile.direction_deg;
    j["lay_source"] = row.run.texture.profile.lay_source;
    j["s_filter_mm"] = row.run.texture.areal.s_filter_mm;
    j["l_filter_mm"] = row.run.texture.areal.l_filter_mm;
    j["iso1302_grade"] = row.run.texture.profile.iso1302_grade;
    j["cautions"] = nlohmann::json::array();
    if (const std::string fine = fine_ra_caution(row.run.texture.profile.roughness.a_um);
        !fine.empty()) {
      j["cautions"].push_back(fine);
    }
    j["tool"] = describe_tool(row.job.cutter, LengthUnit::Millimetre);
    j["path"] = describe_path(row.job.path, LengthUnit::Millimetre);
    j["tooth_marks"] = row.job.sim.tooth_marks;
    out["rows"].push_back(j);
  }
  const std::vector<std::optional<size_t>> best = best_rows(rows, basis);
  nlohmann::json b = nlohmann::json::object();
  for (size_t k = 0; k < best.size(); ++k) {
    b[compare_columns()[k].key] = best[k] ? nlohmann::json(*best[k]) : nlohmann::json();
  }
  out["best_index"] = b;  // per column: 0-based index into rows (table row - 1); null = not ranked
  out["model"] = kKinematicBestCase;
  out["basis"] = {{"cutoff_mm", basis.cutoff_mm},
                  {"cutoff_rule", basis.cutoff_rule},
                  {"ranked", basis.rankable()},
                  {"reasons", basis.reasons},
                  {"notes", basis.notes}};
  return out;
}

std::string compare_csv(const std::vector<CompareRow>& rows) {
  const auto quote = [](const std::string& s) {
    std::string q(1, '"');
    for (char c : s) {
      q.push_back(c);
      if (c == '"') q.push_back('"');  // RFC 4180: a quote inside a field is doubled
    }
    q.push_back('"');
    return q;
  };
  std::string csv = "name,job";
  for (const CompareColumn& c : compare_columns()) csv.append(",").append(c.key);
  csv.append(",cutoff_mm,direction,direction_deg");
  csv.push_back('\n');
  for (const CompareRow& row : rows) {
    csv.append(quote(row.job.name)).append(",").append(quote(row.job.source));
    for (const CompareColumn& c : compare_columns()) {
      csv.append(",").append(full_precision(c.value(row)));
    }
    const ProfileReport& p = row.run.texture.profile;
    csv.append(",").append(format_number(p.cutoff_mm));
    csv.append(",").append(quote(p.lay_source == "none" ? "along X (no lay)" : p.direction));
    csv.append(",").append(format_number(p.direction_deg));
    csv.push_back('\n');
  }
  return csv;
}

std::string compare_table_text(const std::vector<CompareRow>& rows, const ProfileBasis& basis,
                               LengthUnit units) {
  const std::vector<std::optional<size_t>> best = best_rows(rows, basis);
  const char* length_unit = units == LengthUnit::Inch ? "in" : "mm";
  std::string out;
  char buf[256];
  std::snprintf(buf, sizeof buf, "%-3s %-44s %11s %-17s", "#", "job",
                (std::string("cut-off ") + length_unit).c_str(), " direction");
  out += buf;
  for (const CompareColumn& c : compare_columns()) {
    std::snprintf(buf, sizeof buf, " %11s", (std::string(c.title) + " " + display_unit(c, units)).c_str());
    out += buf;
  }
  out += "\n";
  for (size_t r = 0; r < rows.size(); ++r) {
    std::string name = rows[r].job.name;
    if (name.size() > 44) name = name.substr(0, 41) + "...";
    const ProfileReport& p = rows[r].run.texture.profile;
    const double cutoff = units == LengthUnit::Inch ? p.cutoff_mm / kMmPerInch : p.cutoff_mm;
    std::snprintf(buf, sizeof buf, "%-3zu %-44s %11s  %-16s", r + 1, name.c_str(),
                  format_number(cutoff).c_str(), profile_direction_text(p).c_str());
    out += buf;
    for (size_t k = 0; k < compare_columns().size(); ++k) {
      const CompareColumn& c = compare_columns()[k];
      // "!" marks a predicted Ra finer than milling usually measures (cusp/kinematic_limits.h).
      const bool fine = std::string(c.key) == "Ra_um" && !fine_ra_caution(c.value(rows[r])).empty();
      const std::string v = column_text(c, rows[r], units) + (fine ? "!" : "") +
                            (best[k] && *best[k] == r ? "*" : " ");
      std::snprintf(buf, sizeof buf, " %11s", v.c_str());
      out += buf;
    }
    out += "\n";
  }
  out += "* best (lowest) value in its column\n";
  bool any_fine = false;
  for (const CompareRow& row : rows) {
    any_fine = any_fine || !fine_ra_caution(row.run.texture.profile.roughness.a_um).empty();
  }
  if (any_fine) {
    out += "! predicted Ra below 0.2 um, finer than milling usually measures: expect the real "
           "surface to be rougher\n";
  }
  out += std::string(kKinematicBestCase) + "\n";
  if (basis.rankable()) {
    out += "Ra and Rz of every row: cut-off " + display_length(basis.cutoff_mm, units) + " (" +
           basis.cutoff_rule + "), traced " + rows.front().run.texture.profile.direction +
           " each row's lay\n";
  } else {
    out += "Ra and Rz not ranked: the rows do not share one basis\n";
  }
  for (const std::string& why : basis.reasons) out += "  " + why + "\n";
  for (const std::string& note : basis.notes) out += "  " + note + "\n";
  return out;
}

Image compare_montage(const std::vector<CompareRow>& rows, LengthUnit units) {
  std::vector<MontageTile> tiles, details;
  for (size_t r = 0; r < rows.size(); ++r) {
    const CompareRow& row = rows[r];
    MontageTile t;
    t.image = row.pictures.shaded.image;
    t.mm_per_px = row.pictures.shaded.mm_per_px;
    t.label_lines = {std::to_string(r + 1) + ". " + describe_path(row.job.path, units),
                     describe_tool(row.job.cutter, units),
                     "feed " + display_length(row.job.cut.feed_mm_per_min, units) + "/min, " +
                         format_number(row.job.cut.rpm) + " rpm"};
    tiles.push_back(std::move(t));
    if (!row.pictures.has_detail) continue;
    const DetailWindow& w = row.pictures.detail;
    MontageTile d;
    d.image = row.pictures.detail_shaded.image;
    d.mm_per_px = row.pictures.detail_shaded.mm_per_px;
    d.label_lines = {std::to_string(r + 1) + ". detail, x " + display_length(w.x0_mm, units) + " to " +
                         display_length(w.x0_mm + w.size_x_mm, units),
                     "y " + display_length(w.y0_mm, units) + " to " +
                         display_length(w.y0_mm + w.size_y_mm, units),
                     "exaggerated x " + format_significant(row.pictures.detail_shaded.exaggeration, 3)};
    details.push_back(std::move(d));
  }
  MontageOptions opt;
  opt.units = units;
  opt.columns = std::min<int>(4, static_cast<int>(std::max<size_t>(1, rows.size())));
  opt.title = "Shaded floors on one scale (light from the upper left); orange: detail windows";
  const Image overview = render_montage(tiles, opt);
  if (details.empty()) return overview;
  opt.title = "Details at native resolution, on one scale: each where its floor's marks are deepest";
  const Image detail = render_montage(details, opt);
  // The two sheets one above the other, on one white page.
  Image page = make_image(std::max(overview.width, detail.width), overview.height + detail.height,
                          std::max(overview.channels, detail.channels), kWhite);
  blit(overview, page, 0, 0);
  blit(detail, page, 0, overview.height);
  return page;
}

HtmlReport compare_html_report(const std::vector<CompareRow>& rows, const ProfileBasis& basis,
                               const std::string& montage_png, LengthUnit units) {
  HtmlReport r;
  r.title = "Finishing strategies compared";
  r.subtitle = "cuspmap 0.1.0 - compare, " + std::to_string(rows.size()) + " jobs";
  HtmlTable t;
  t.caption = "Predicted surface and cost per job (best value per column marked)";
  t.columns = {"#", "job", std::string("cut-off (") + (units == LengthUnit::Inch ? "in" : "mm") +
                               ")",
               "direction"};
  t.best = {BestIs::None, BestIs::None, BestIs::None, BestIs::None};
  for (const CompareColumn& c : compare_columns()) {
    t.columns.push_back(std::string(c.title) + " (" + display_unit(c, units) + ")");
    t.best.push_back(c.profile && !basis.rankable() ? BestIs::None : BestIs::Lowest);
  }
  for (size_t k = 0; k < rows.size(); ++k) {
    const CompareRow& row = rows[k];
    r.inputs.push_back({std::to_string(k + 1) + ". " + row.job.name,
                        describe_tool(row.job.cutter, units) + "; " +
                            describe_path(row.job.path, units) + "; " +
                            (row.job.sim.tooth_marks ? "tooth by tooth" : "envelope")});
    const ProfileReport& p = row.run.texture.profile;
    std::vector<HtmlCell> cells = {
        {std::to_string(k + 1)},
        {row.job.name},
        {display_cutoff(p.cutoff_mm, units)},
        {profile_direction_text(p)}};
    for (const CompareColumn& c : compare_columns()) {
      const double v = display_value(c, row, units);
      cells.push_back({column_text(c, row, units), v});
    }
    t.rows.push_back(std::move(cells));
    r.filters.push_back(std::to_string(k + 1) + ": ISO 16610-21 Gaussian lambda-c " +
                        display_cutoff(row.run.texture.profile.cutoff_mm, units) + " (" +
                        row.run.texture.profile.cutoff_rule + "), traced " +
                        profile_direction_text(row.run.texture.profile) +
                        "; areal: least-squares plane removed" +
                        (row.run.texture.areal.s_filter_mm > 0
                             ? ", S-filter " + display_cutoff(row.run.texture.areal.s_filter_mm, units)
                             : std::string()) +
                        (row.run.texture.areal.l_filter_mm > 0
                             ? ", L-filter " + display_cutoff(row.run.texture.areal.l_filter_mm, units)
                             : std::string()));
  }
  if (basis.rankable()) {
    r.notes.push_back("Ra and Rz of every row on one basis: cut-off " +
                      display_cutoff(basis.cutoff_mm, units) + " (" + basis.cutoff_rule + ")");
  } else {
    r.notes.push_back("Ra and Rz are not ranked: the rows do not share one basis");
  }
  for (const std::string& why : basis.reasons) r.notes.push_back(why);
  for (const std::string& note : basis.notes) r.notes.push_back(note);
  for (size_t k = 0; k < rows.size(); ++k) {
    const std::string fine = fine_ra_caution(rows[k].run.texture.profile.roughness.a_um, units);
    if (!fine.empty()) r.notes.push_back(std::to_string(k + 1) + ": " + fine);
  }
  r.tables.push_back(std::move(t));
  r.images.push_back({montage_png, "shaded floors and details side by side",
                      "Top: shaded relief of each floor on one scale, light from the upper left, "
                      "vertical exaggeration chosen per floor so its marks show; the orange square "
                      "is the detail window. Bottom: each detail window at native resolution, on "
                      "one scale of its own (see the scale bars)."});
  for (const CompareRow& row : rows) {
    r.images.push_back({row.pictures.height_png, "height map of " + row.job.name + ", shared scale",
                        row.job.name + ": " + row.pictures.height_caption});
    if (!row.pictures.height_own_png.empty()) {
      r.images.push_back({row.pictures.height_own_png,
                          "height map of " + row.job.name + ", own range",
                          row.job.name + ": " + row.pictures.height_own_caption});
    }
    if (row.pictures.has_detail) {
      r.images.push_back({row.pictures.detail_png, "detail of " + row.job.name,
                          row.job.name + ": " + row.pictures.detail_caption});
    }
  }
  return r;
}

}  // namespace cuspmap

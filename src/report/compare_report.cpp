// Comparison outputs for several simulations: JSON, CSV, terminal table, montage, HTML page.
// Inputs: CompareRow (Job + JobRun + pictures); outputs: text/bytes, heights um, lengths mm.
#include "report/compare_report.h"

#include <algorithm>
#include <cstdio>

#include "report/montage.h"
#include "io/texture_json.h"

namespace cuspmap {
namespace {

std::string length_text(double mm, LengthUnit units) {
  if (units == LengthUnit::Inch) return format_number(mm / kMmPerInch) + " in";
  return format_number(mm) + " mm";
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
      {"Ra", "Ra_um", true, [](const CompareRow& r) { return r.run.texture.profile.roughness.a_um; }},
      {"Rz", "Rz_um", true, [](const CompareRow& r) { return r.run.texture.profile.roughness.z_um; }},
      {"Sa", "Sa_um", true, [](const CompareRow& r) { return r.run.texture.areal.parameters.sa_um; }},
      {"Sz", "Sz_um", true, [](const CompareRow& r) { return r.run.texture.areal.parameters.sz_um; }},
      {"cusp", "cusp_um", true, [](const CompareRow& r) { return r.run.cusp_um; }},
      {"sand (Sv)", "mean_removal_um", true,
       [](const CompareRow& r) { return r.run.texture.areal.parameters.sv_um; }},
      {"path", "path_length_mm", true, [](const CompareRow& r) { return r.run.path_length_mm; }},
      {"cycle", "cycle_time_s", true, [](const CompareRow& r) { return r.run.cycle_time_s; }},
  };
  return columns;
}

std::vector<size_t> best_rows(const std::vector<CompareRow>& rows) {
  std::vector<size_t> best;
  for (const CompareColumn& c : compare_columns()) {
    size_t b = 0;
    for (size_t k = 1; k < rows.size(); ++k) {
      if (c.value(rows[k]) < c.value(rows[b])) b = k;
    }
    best.push_back(b);
  }
  return best;
}

nlohmann::json compare_json(const std::vector<CompareRow>& rows) {
  nlohmann::json out;
  out["rows"] = nlohmann::json::array();
  for (const CompareRow& row : rows) {
    nlohmann::json j = {{"name", row.job.name}, {"job", row.job.source}};
    for (const CompareColumn& c : compare_columns()) j[c.key] = c.value(row);
    j["Sv_um"] = row.run.texture.areal.parameters.sv_um;
    j["depth_to_clear_um"] = row.run.texture.areal.parameters.sz_um;
    j["cutoff_mm"] = row.run.texture.profile.cutoff_mm;
    j["iso1302_grade"] = row.run.texture.profile.iso1302_grade;
    j["tool"] = describe_tool(row.job.cutter, LengthUnit::Millimetre);
    j["path"] = describe_path(row.job.path, LengthUnit::Millimetre);
    j["tooth_marks"] = row.job.sim.tooth_marks;
    out["rows"].push_back(j);
  }
  const std::vector<size_t> best = best_rows(rows);
  nlohmann::json b = nlohmann::json::object();
  for (size_t k = 0; k < best.size(); ++k) b[compare_columns()[k].key] = best[k];
  out["best"] = b;
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
  csv.push_back('\n');
  for (const CompareRow& row : rows) {
    csv.append(quote(row.job.name)).append(",").append(quote(row.job.source));
    for (const CompareColumn& c : compare_columns()) {
      csv.append(",").append(format_number(c.value(row)));
    }
    csv.push_back('\n');
  }
  return csv;
}

std::string compare_table_text(const std::vector<CompareRow>& rows, LengthUnit units) {
  const std::vector<size_t> best = best_rows(rows);
  std::string out;
  char buf[256];
  std::snprintf(buf, sizeof buf, "%-3s %-44s", "#", "job");
  out += buf;
  for (const CompareColumn& c : compare_columns()) {
    std::snprintf(buf, sizeof buf, " %11s", (std::string(c.title) + " " + display_unit(c, units)).c_str());
    out += buf;
  }
  out += "\n";
  for (size_t r = 0; r < rows.size(); ++r) {
    std::string name = rows[r].job.name;
    if (name.size() > 44) name = name.substr(0, 41) + "...";
    std::snprintf(buf, sizeof buf, "%-3zu %-44s", r + 1, name.c_str());
    out += buf;
    for (size_t k = 0; k < compare_columns().size(); ++k) {
      const std::string v = format_number(display_value(compare_columns()[k], rows[r], units)) +
                            (best[k] == r ? "*" : " ");
      std::snprintf(buf, sizeof buf, " %11s", v.c_str());
      out += buf;
    }
    out += "\n";
  }
  out += "* best (lowest) value in its column\n";
  return out;
}

Image compare_montage(const std::vector<CompareRow>& rows, LengthUnit units) {
  std::vector<MontageTile> tiles;
  for (size_t r = 0; r < rows.size(); ++r) {
    const CompareRow& row = rows[r];
    MontageTile t;
    t.image = row.pictures.shaded.image;
    t.mm_per_px = row.pictures.shaded.mm_per_px;
    t.label_lines = {std::to_string(r + 1) + ". " + describe_path(row.job.path, units),
                     describe_tool(row.job.cutter, units),
                     "feed " + length_text(row.job.cut.feed_mm_per_min, units) + "/min, " +
                         format_number(row.job.cut.rpm) + " rpm"};
    tiles.push_back(std::move(t));
  }
  MontageOptions opt;
  opt.units = units;
  opt.columns = std::min<int>(4, static_cast<int>(std::max<size_t>(1, rows.size())));
  opt.title = "Shaded floors on one scale (light from the upper left)";
  return render_montage(tiles, opt);
}

HtmlReport compare_html_report(const std::vector<CompareRow>& rows, const std::string& montage_png,
                               LengthUnit units) {
  HtmlReport r;
  r.title = "Finishing strategies compared";
  r.subtitle = "cuspmap 0.1.0 - compare, " + std::to_string(rows.size()) + " jobs";
  HtmlTable t;
  t.caption = "Predicted surface and cost per job (best value per column marked)";
  t.columns = {"#", "job"};
  t.best = {BestIs::None, BestIs::None};
  for (const CompareColumn& c : compare_columns()) {
    t.columns.push_back(std::string(c.title) + " (" + display_unit(c, units) + ")");
    t.best.push_back(BestIs::Lowest);
  }
  for (size_t k = 0; k < rows.size(); ++k) {
    const CompareRow& row = rows[k];
    r.inputs.push_back({std::to_string(k + 1) + ". " + row.job.name,
                        describe_tool(row.job.cutter, units) + "; " +
                            describe_path(row.job.path, units) + "; " +
                            (row.job.sim.tooth_marks ? "tooth by tooth" : "envelope")});
    std::vector<HtmlCell> cells = {{std::to_string(k + 1)}, {row.job.name}};
    for (const CompareColumn& c : compare_columns()) {
      const double v = display_value(c, row, units);
      cells.push_back({format_number(v), v});
    }
    t.rows.push_back(std::move(cells));
    r.filters.push_back(std::to_string(k + 1) + ": ISO 16610-21 Gaussian lambda-c " +
                        length_text(row.run.texture.profile.cutoff_mm, units) + " (" +
                        row.run.texture.profile.cutoff_rule + "), least-squares plane removed");
  }
  r.tables.push_back(std::move(t));
  r.images.push_back({montage_png, "shaded floors side by side",
                      "Shaded relief of each floor on one scale; light from the upper left; "
                      "vertical exaggeration chosen per floor so its marks show."});
  for (const CompareRow& row : rows) {
    r.images.push_back({row.pictures.height_png, "height map of " + row.job.name,
                        row.job.name + ": " + row.pictures.height_caption});
  }
  return r;
}

}  // namespace cuspmap

// `cuspmap calibrate MEASUREMENTS.csv`: predicts each past job's Ra (closed form from tool and
// stepover, or the simulated floor of its job file), fits measured = floor + scale x predicted,
// prints before/after, writes the shop profile (shop.toml) and a chart (calibration.svg).
// cli/ holds no computation: io/ reads, cusp/ and job/ predict, finish/ fits, report/ draws.
#include <cstdio>
#include <ctime>
#include <memory>
#include <string>
#include <vector>

#include "cli/command.h"
#include "cli/output_dir.h"
#include "core/stage_timer.h"
#include "cusp/cross_feed_cusp.h"
#include "finish/shop_calibration.h"
#include "io/measured_jobs_csv.h"
#include "io/shop_profile.h"
#include "job/job.h"
#include "job/run_job.h"
#include "report/calibration_svg.h"
#include "report/nice_ticks.h"

namespace cuspmap {
namespace {

struct CalibrateOptions {
  CommonOptions common;
  std::string file;  ///< measurements CSV
  std::string out;   ///< --out DIR for shop.toml and calibration.svg
};

// Today's date (UTC), YYYY-MM-DD, for the profile's `created` key.
std::string today_utc() {
  const std::time_t now = std::time(nullptr);
  std::tm tm{};
  gmtime_r(&now, &tm);
  char buf[16];
  std::strftime(buf, sizeof buf, "%Y-%m-%d", &tm);
  return buf;
}

// The kinematic Ra the model predicts for one measured job, um: the ideal cross-feed cusp
// profile for tool rows, the simulated floor's profile Ra (ISO 4288 cut-off) for job rows.
double predicted_ra_um(const MeasuredJob& row) {
  if (row.setup) return cross_feed_cusp(*row.setup, row.stepover_mm).stats.ra_um;
  const Job job = load_job(row.job_path);
  RunOptions run;
  run.stream = StreamMode::Auto;
  return run_job(job, run).texture.profile.roughness.a_um;
}

std::string rough(double um, LengthUnit u) {
  return format_significant(u == LengthUnit::Inch ? um * kUinPerUm : um, 3);
}

void print_table(const CalibrateOptions& o, const std::vector<MeasuredJob>& rows,
                 const std::vector<CalibrationPoint>& pts, const ShopCalibration& cal,
                 LengthUnit u) {
  const char* unit = u == LengthUnit::Inch ? "uin" : "um";
  std::printf("Shop calibration from %s: %d rows, Ra in %s\n\n", o.file.c_str(), cal.rows, unit);
  std::printf("  %3s  %-24s %10s %10s %12s %10s\n", "row", "name", "predicted", "measured",
              "calibrated", "residual");
  for (std::size_t k = 0; k < rows.size(); ++k) {
    const CalibratedValue c = apply_shop_calibration(cal, pts[k].predicted_um);
    std::printf("  %3zu  %-24.24s %10s %10s %12s %10s\n", k + 1, rows[k].name.c_str(),
                rough(pts[k].predicted_um, u).c_str(), rough(pts[k].measured_um, u).c_str(),
                rough(c.value_um, u).c_str(), rough(pts[k].measured_um - c.value_um, u).c_str());
  }
  std::printf("\nFit (%s): measured Ra = %s (+-%s) %s", calibration_model_name(cal.model),
              rough(cal.floor_um, u).c_str(), rough(cal.floor_sd_um, u).c_str(), unit);
  if (cal.model == CalibrationModel::FloorAndScale) {
    std::printf(" + %s (+-%s) x kinematic Ra\n", format_significant(cal.scale, 3).c_str(),
                format_significant(cal.scale_sd, 3).c_str());
  } else {
    std::printf(" + kinematic Ra (scale fixed at 1: %s)\n", cal.why.c_str());
  }
  std::printf("RMS of measured - model: before %s %s, after %s %s\n",
              rough(cal.rms_before_um, u).c_str(), unit, rough(cal.rms_after_um, u).c_str(), unit);
  std::printf("Predictions are kinematic (tool and path geometry); the fit adds what this shop's "
              "machines, tools and instrument add. Use it only for similar work.\n");
}

void run_calibrate(const CalibrateOptions& o) {
  const LengthUnit units = o.common.length_unit();
  StageTimer timer;
  const std::vector<MeasuredJob> rows = read_measured_jobs(o.file, units);
  std::vector<CalibrationPoint> pts;
  for (const MeasuredJob& r : rows) pts.push_back({predicted_ra_um(r), r.measured_ra_um});
  print_stage(o.common.verbose, "predict", timer.lap());
  const ShopCalibration cal = fit_shop_calibration(pts);
  ShopProfile profile{cal, o.file, today_utc()};
  if (!o.out.empty()) {
    OutputDir dir(o.out);
    dir.write("shop.toml", encode_shop_profile(profile));
    CalibrationSvgOptions svg;
    svg.unit = units;
    dir.write("calibration.svg", encode_calibration_svg(pts, cal, svg));
    print_stage(o.common.verbose, "write", timer.lap());
  }
  if (o.common.json) {
    nlohmann::json doc;
    doc["rows"] = nlohmann::json::array();
    for (std::size_t k = 0; k < rows.size(); ++k) {
      const CalibratedValue c = apply_shop_calibration(cal, pts[k].predicted_um);
      doc["rows"].push_back({{"row", k + 1},
                             {"name", rows[k].name},
                             {"line", rows[k].line},
                             {"predicted_Ra_um", pts[k].predicted_um},
                             {"measured_Ra_um", pts[k].measured_um},
                             {"calibrated_Ra_um", c.value_um},
                             {"calibrated_Ra_sd_um", c.sd_um}});
    }
    doc["model"] = calibration_model_name(cal.model);
    doc["floor_um"] = cal.floor_um;
    doc["floor_sd_um"] = cal.floor_sd_um;
    doc["scale"] = cal.scale;
    doc["scale_sd"] = cal.scale_sd;
    doc["cov_floor_scale_um"] = cal.cov_floor_scale_um;
    doc["rms_before_um"] = cal.rms_before_um;
    doc["rms_after_um"] = cal.rms_after_um;
    doc["why"] = cal.why;
    doc["files"] = o.out.empty() ? nlohmann::json::array()
                                 : nlohmann::json{"shop.toml", "calibration.svg"};
    print_json(doc);
    return;
  }
  print_table(o, rows, pts, cal, units);
  if (!o.out.empty()) {
    std::printf("\nWrote shop.toml and calibration.svg to %s (use: --shop %s/shop.toml)\n",
                o.out.c_str(), o.out.c_str());
  }
}

}  // namespace

void setup_calibrate(CLI::App& sub) {
  auto o = std::make_shared<CalibrateOptions>();
  sub.add_option("measurements", o->file,
                 "CSV of past jobs: measured_ra and either job (a job file) or tool, diameter, "
                 "stepover [, corner_radius]; docs/calibration.md")
      ->required();
  sub.add_option("--out", o->out, "Folder for shop.toml (the shop profile) and calibration.svg");
  add_common_flags(sub, o->common);
  sub.footer(
      "Model: measured Ra = floor + scale x kinematic Ra, least squares with standard errors; "
      "with fewer than 3 rows or predictions spanning less than 25 %, only the floor is fitted.\n"
      "Bare Ra values are um (uin with --units in); lengths take suffixes mm, um, in, thou.");
  sub.callback([o] { run_calibrate(*o); });
}

}  // namespace cuspmap

// Pictures of one simulation (height, shaded relief, profiles), its .npy, and its HTML page.
// Inputs: JobRun (um over mm cells); outputs: encoded PNG/.npy bytes and captions.
// Method: report/height_image, report/shaded_image (Lambert), report/detail_window (deepest
// marks), texture/ ISO 16610-21 mean line.
#include "report/simulation_pictures.h"

#include <algorithm>
#include <cmath>
#include <future>
#include <string>

#include "cusp/kinematic_limits.h"
#include "io/png.h"
#include "core/display_quantity.h"
#include "texture/evaluate_profiles.h"
#include "texture/extract_profiles.h"
#include "texture/gaussian_profile_filter.h"

namespace cuspmap {
namespace {

// The longest finite run of the centre trace, with its mean line.
std::optional<ProfilePlotData> centre_profile(const std::vector<ProfileTrace>& traces,
                                              double cutoff_mm, double lambda_s_um,
                                              const std::string& title) {
  if (traces.empty()) return std::nullopt;
  const ProfileTrace& trace = *std::max_element(
      traces.begin(), traces.end(),
      [](const ProfileTrace& a, const ProfileTrace& b) { return a.z_um.size() < b.z_um.size(); });
  if (trace.z_um.size() < 2) return std::nullopt;
  ProfilePlotData data;
  data.title = title;
  data.cutoff_mm = cutoff_mm;
  data.z_um = trace.z_um;
  for (size_t k = 0; k < trace.z_um.size(); ++k) {
    data.x_mm.push_back(trace.start_mm + static_cast<double>(k) * trace.spacing_mm);
  }
  data.mean_line_um = gaussian_profile_filter(trace.z_um, trace.spacing_mm, cutoff_mm);
  if (const auto eval = evaluate_profiles({trace}, cutoff_mm, lambda_s_um)) {
    data.ra_um = eval->roughness.a_um;
    data.rz_um = eval->roughness.z_um;
  }
  return data;
}

}  // namespace

namespace {

// The two centre traces' plots; `centre_runs(k, deg)` gives trace k (0 across, 1 along) at deg.
template <class CentreRuns>
std::vector<ProfilePlotData> centre_profiles(const ProfileReport& p, const CentreRuns& centre_runs) {
  const double along_deg = std::fmod(p.direction_deg + 90.0, 180.0);
  std::vector<ProfilePlotData> out;
  if (auto across = centre_profile(centre_runs(0, p.direction_deg), p.cutoff_mm, p.lambda_s_um,
                                   "Centre trace across, " + format_number(p.direction_deg) +
                                       " deg")) {
    out.push_back(std::move(*across));
  }
  if (auto along = centre_profile(centre_runs(1, along_deg), p.cutoff_mm, p.lambda_s_um,
                                  "Centre trace along, " + format_number(along_deg) + " deg")) {
    out.push_back(std::move(*along));
  }
  return out;
}

std::vector<ProfilePlotData> floor_profiles(const Heightfield& floor, const ProfileReport& p) {
  return centre_profiles(p, [&](int, double deg) { return extract_profiles(floor, deg, 1, 0.0); });
}

std::string profile_png_of(const std::vector<ProfilePlotData>& profiles, LengthUnit units) {
  if (profiles.empty()) return {};
  ProfilePlotOptions popt;
  popt.units = units;
  return encode_png(render_profile_plot(profiles, popt).image);
}

}  // namespace

std::vector<ProfilePlotData> simulation_profiles(const JobRun& run) {
  // A streamed floor was never held: its centre traces were copied from the bands as they passed
  // (the same samples extract_profiles reads from a whole floor); run.floor is only an overview.
  if (!run.streamed) return floor_profiles(run.floor, run.texture.profile);
  return centre_profiles(run.texture.profile,
                         [&](int k, double) { return run.centre_traces[k]; });
}

std::string render_profile_png(const Heightfield& floor, const ProfileReport& profile,
                               LengthUnit units) {
  return profile_png_of(floor_profiles(floor, profile), units);
}

HeightPictures render_height_pictures(const Heightfield& floor, LengthUnit units,
                                      const std::optional<HeightRange>& range,
                                      bool own_range_too) {
  HeightPictures out;
  HeightImageOptions hopt;
  hopt.range = range;
  hopt.units = units;
  const bool both = range && own_range_too;
  if (both) hopt.title = "Shared scale: the same gray is the same height on every floor";
  out.shared = render_height_image(floor, hopt);
  out.shared_caption = height_image_caption(out.shared, units);
  if (!both) return out;
  out.shared_caption = "Shared scale (all floors). " + out.shared_caption;
  hopt.range.reset();
  hopt.title = "Own range: this floor's lowest to highest point";
  out.own = render_height_image(floor, hopt);
  out.own_caption = "Own range (this floor only). " + height_image_caption(*out.own, units);
  return out;
}

SimulationPictures render_floor_pictures(const Heightfield& floor, bool streamed,
                                         LengthUnit units, const std::optional<HeightRange>& range,
                                         int cells_per_pixel, bool own_range_too) {
  SimulationPictures pics;
  // A streamed floor is only an overview (block means): a native-resolution detail of it
  // cannot be drawn, so its pictures have none.
  pics.has_detail = !streamed;
  if (pics.has_detail) pics.detail = choose_detail_window(floor);
  // The shaded relief and the detail view are independent of the height pictures: they are
  // drawn on their own threads meanwhile (each picture's bytes are the same either way).
  std::future<ShadedImage> shaded = std::async(std::launch::async, [&] {
    ShadedImageOptions sopt;
    sopt.cells_per_pixel = cells_per_pixel;
    ShadedImage img = render_shaded_image(floor, sopt);
    if (pics.has_detail) {
      img.image = outline_detail_window(img.image, 0, 0, img.image.height, img.cells_per_pixel,
                                        pics.detail);
    }
    return img;
  });
  std::future<DetailView> detail;
  if (pics.has_detail) {
    detail = std::async(std::launch::async, [&] {
      return render_detail_view(floor, pics.detail, units);
    });
  }
  const HeightPictures heights = render_height_pictures(floor, units, range, own_range_too);
  const auto outlined = [&](const HeightImage& h) {
    return pics.has_detail ? outline_detail_window(h.image, h.map_x_px, h.map_y_px,
                                                   h.map_height_px, h.cells_per_pixel, pics.detail)
                           : h.image;
  };
  const HeightImage& height = heights.shared;
  // Encoding runs beside the next picture's drawing.
  std::future<std::string> height_png =
      std::async(std::launch::async, [&] { return encode_png(outlined(height)); });
  if (heights.own) {
    pics.height_own_png = encode_png(outlined(*heights.own));
    pics.height_own_caption = heights.own_caption;
  }
  pics.height_caption = heights.shared_caption;

  pics.shaded = shaded.get();
  std::future<std::string> shaded_png =
      std::async(std::launch::async, [&] { return encode_png(pics.shaded.image); });
  pics.shaded_caption = shaded_image_caption(pics.shaded);
  if (pics.has_detail) {
    DetailView view = detail.get();
    std::future<std::string> detail_height =
        std::async(std::launch::async, [&] { return encode_png(view.height.image); });
    pics.detail_shaded_png = encode_png(view.shaded.image);
    pics.detail_png = detail_height.get();
    pics.detail_shaded = std::move(view.shaded);
    pics.detail_caption = std::move(view.caption);
  }
  pics.height_png = height_png.get();
  pics.shaded_png = shaded_png.get();

  pics.facts.height_lo_um = height.lo_um;
  pics.facts.height_hi_um = height.hi_um;
  pics.facts.um_per_level = height.um_per_level;
  pics.facts.cells_per_pixel = height.cells_per_pixel;
  pics.facts.light_azimuth_deg = pics.shaded.light_azimuth_deg;
  pics.facts.light_elevation_deg = pics.shaded.light_elevation_deg;
  pics.facts.exaggeration = pics.shaded.exaggeration;
  return pics;
}

void set_profile_picture(std::string png, SimulationPictures& pics) {
  pics.profile_png = std::move(png);
  pics.profile_caption =
      "The single centre trace across and along the lay; the smooth line is the ISO 16610-21 "
      "Gaussian mean line at the cut-off used; the Ra and Rz marked are that one trace's, while "
      "the table gives the mean of several parallel traces across the lay.";
}

void add_profile_picture(const JobRun& run, LengthUnit units, SimulationPictures& pics) {
  set_profile_picture(profile_png_of(simulation_profiles(run), units), pics);
}

SimulationPictures render_simulation_pictures(const JobRun& run, LengthUnit units,
                                              const std::optional<HeightRange>& range,
                                              int cells_per_pixel, bool own_range_too) {
  SimulationPictures pics =
      render_floor_pictures(run.floor, run.streamed, units, range, cells_per_pixel, own_range_too);
  add_profile_picture(run, units, pics);
  return pics;
}

HtmlReport simulation_html_report(const Job& job, const JobRun& run,
                                  const SimulationPictures& pictures, LengthUnit units) {
  HtmlReport r;
  r.title = "Floor simulation: " + job.name;
  r.subtitle = "cuspmap 0.1.0 - simulate " + job.source;
  r.inputs = {{"tool", describe_tool(job.cutter, units) + ", " + std::to_string(job.cutter.teeth) +
                           " teeth"},
              {"path", describe_path(job.path, units)},
              {"patch", display_length(run.patch.size_x_mm, units) + " x " +
                            display_length(run.patch.size_y_mm, units) + ", cell " +
                            display_length(run.floor.cell_mm, units)},
              {"cut", format_number(job.cut.rpm) + " rpm, feed " +
                          display_length(job.cut.feed_mm_per_min, units) + "/min"},
              {"sweep", job.sim.tooth_marks ? "tooth by tooth" : "envelope of the revolving tool"}};
  const ProfileParameters& rough = run.texture.profile.roughness;
  const ArealParameters& areal = run.texture.areal.parameters;
  HtmlTable t;
  t.caption = "Predicted surface";
  t.columns = {"quantity", "value"};
  const auto row = [&](const std::string& name, const std::string& value) {
    t.rows.push_back({{name}, {value}});
  };
  row("Ra (across the lay)", display_roughness(rough.a_um, units) + " (" +
                                 run.texture.profile.iso1302_grade + ")");
  row("Rz", display_roughness(rough.z_um, units));
  row("Sa", display_roughness(areal.sa_um, units));
  row("Sz", display_roughness(areal.sz_um, units));
  row("cusp (peak to valley across the lay)", display_roughness(run.cusp_um, units));
  row("highest point, relative to nominal", display_roughness(run.highest_point_um, units));
  row("lowest point, relative to nominal", display_roughness(run.lowest_point_um, units));
  row("path length", display_length(run.path_length_mm, units));
  row("cycle time", display_time(run.cycle_time_s));
  r.tables.push_back(t);
  r.images.push_back({pictures.height_png, "height map", pictures.height_caption});
  r.images.push_back({pictures.shaded_png, "shaded relief", pictures.shaded_caption});
  if (pictures.has_detail) {
    r.images.push_back({pictures.detail_png, "detail: heights", pictures.detail_caption});
    r.images.push_back({pictures.detail_shaded_png, "detail: shaded relief",
                        shaded_image_caption(pictures.detail_shaded)});
  }
  if (!pictures.profile_png.empty()) {
    r.profile_plots.push_back({pictures.profile_png, "profiles", pictures.profile_caption});
  }
  const ProfileReport& p = run.texture.profile;
  r.filters = {"Profile: ISO 16610-21 Gaussian, lambda-c " + display_cutoff(p.cutoff_mm, units) +
                   " (" + p.cutoff_rule + "), lambda-s " + display_roughness(p.lambda_s_um, units) +
                   ", evaluation length " + display_length(p.evaluation_length_mm, units) + " (" +
                   std::to_string(p.sampling_lengths) + " sampling lengths, " +
                   std::to_string(p.traces) + " traces)",
               "Areal: least-squares plane removed (F-operator)"};
  if (const std::string fine = fine_ra_caution(rough.a_um, units); !fine.empty()) r.notes.push_back(fine);
  for (const std::string& w : run.texture.warnings) r.notes.push_back(w);
  if (const std::string margin = margin_passes_note(run.built); !margin.empty()) {
    r.notes.push_back(margin);
  }
  for (const PathWarning& w : run.built.warnings) {
    r.notes.push_back((w.line > 0 ? "line " + std::to_string(w.line) + ": " : "") + w.message);
  }
  for (const std::string& k : job.ignored_keys) r.notes.push_back("ignored key: " + k);
  return r;
}

}  // namespace cuspmap

// `cuspmap stepover`: closed-form cusp height, Ra/Rq/Rz and feed marks for a stepover, or the
// stepover for a target scallop/Ra/Rz; turning feed marks with --tool insert. Parses and checks
// the flags, calls cusp/, prints a compact table or one JSON object (mm, um).
// Method: cusp/ closed forms (DESIGN.md "Closed forms"); flag contract in DESIGN.md "Command line".
#include <array>
#include <charconv>
#include <cmath>
#include <iostream>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "cli/command.h"
#include "cli/shop_flag.h"
#include "cli/stepover_report.h"
#include "core/height_units.h"
#include "core/input_error.h"
#include "core/stage_timer.h"
#include "core/units.h"
#include "cusp/cross_feed_cusp.h"
#include "cusp/feed_mark.h"
#include "cusp/inverse_stepover.h"
#include "job/validate_cutter.h"

namespace cuspmap {
namespace {

// Flag values as typed; parsed in the callback so that every error names the value.
struct StepoverOptions {
  std::string tool = "ball";
  std::string diameter, corner_radius, dish, tilt, tilt_toward;
  std::string surface = "flat", surface_radius, slope;
  std::string feed_per_tooth, teeth, stepover, target_scallop, target_ra, target_rz, target_sa;
  std::string pass_direction = "one-way";
  std::string nose_radius, feed_per_rev;
  bool both_directions = false;
  CommonOptions common;
  ShopFlag shop;  ///< --shop profile
};

// Which flags were given on the command line.
class Given {
 public:
  explicit Given(const CLI::App& app) : app_(app) {}
  bool operator()(const char* flag) const { return app_.count(flag) > 0; }

 private:
  const CLI::App& app_;
};

double positive_length_mm(const std::string& text, LengthUnit unit, const char* flag) {
  const double mm = parse_length_mm(text, unit, flag);
  if (!(mm > 0.0))
    throw InputError(std::string(flag) + " " + format_number(mm) + " mm: must be > 0");
  return mm;
}

// A target height: bare numbers in um (--units mm) or uin (--units in); Ra also takes N-grades.
double positive_height_um(const std::string& text, LengthUnit unit, const char* flag) {
  const double um = std::string_view(flag) == "--target-ra" ? parse_ra_target_um(text, unit, flag)
                                                            : parse_height_um(text, unit, flag);
  if (!(um > 0.0))
    throw InputError(std::string(flag) + " " + format_number(um) + " um: must be > 0");
  return um;
}

// The single mode flag given among `flags`, or an error naming what is missing or doubled.
std::string single_mode(const Given& given, const std::vector<const char*>& flags) {
  std::vector<std::string> got;
  for (const char* f : flags) {
    if (given(f)) got.emplace_back(f);
  }
  std::string list;
  for (size_t k = 0; k < flags.size(); ++k) list += (k ? ", " : "") + std::string(flags[k]);
  if (got.empty()) throw InputError("one of " + list + " is required");
  if (got.size() > 1) {
    throw InputError("give only one of " + list + " (got " + got[0] + " and " + got[1] + ")");
  }
  return got[0];
}

FinishTarget target_kind(const std::string& flag) {
  if (flag == "--target-ra" || flag == "--target-sa") return FinishTarget::Ra;
  if (flag == "--target-rz") return FinishTarget::Rz;
  return FinishTarget::Scallop;
}

std::string target_word(FinishTarget t) {
  return t == FinishTarget::Ra ? "Ra" : t == FinishTarget::Rz ? "Rz" : "cusp";
}

// The parsed value of the --target-* flag `mode`, in um.
double target_value_um(const StepoverOptions& o, const std::string& mode, LengthUnit unit) {
  const FinishTarget t = target_kind(mode);
  const std::string& text = mode == "--target-sa"    ? o.target_sa
                            : t == FinishTarget::Ra   ? o.target_ra
                            : t == FinishTarget::Rz ? o.target_rz
                                                    : o.target_scallop;
  return positive_height_um(text, unit, mode.c_str());
}

void record_inverse(FinishTarget t, double target_um, const StepoverSolution& sol,
                    StepoverReport& rep) {
  rep.inverse = true;
  rep.target = t;
  rep.target_um = target_um;
  rep.stepover_approx_mm = sol.stepover_approx_mm;
  rep.cusp = sol.cusp;
}

// Marks of a circle of radius r stepped f apart overlap only while f < 2r.
void require_overlapping_marks(double f_mm, double radius_mm, const char* flag, const char* what) {
  if (f_mm < 2.0 * radius_mm) return;
  throw InputError(std::string(flag) + " " + format_number(f_mm) +
                   " mm: must be smaller than twice the " + what + " (" +
                   format_number(2.0 * radius_mm) + " mm)");
}

void note_ignored(const Given& given, const std::vector<const char*>& flags, const char* why,
                  StepoverReport& rep) {
  for (const char* f : flags) {
    if (given(f)) rep.notes.push_back(std::string("ignored: ") + f + " (" + why + ")");
  }
}

void run_turning(const StepoverOptions& o, const Given& given, LengthUnit unit,
                 StepoverReport& rep) {
  if (given("--stepover")) {
    throw InputError("--stepover does not apply to --tool insert; give --feed-per-rev");
  }
  if (!given("--nose-radius")) throw InputError("--nose-radius is required for --tool insert");
  const double r = positive_length_mm(o.nose_radius, unit, "--nose-radius");
  note_ignored(given,
               {"--diameter", "--corner-radius", "--dish", "--surface", "--surface-radius",
                "--slope", "--feed-per-tooth", "--teeth", "--target-sa", "--pass-direction"},
               "turning uses --nose-radius and --feed-per-rev", rep);
  rep.turning = true;
  rep.nose_radius_mm = r;
  const std::string mode =
      single_mode(given, {"--feed-per-rev", "--target-scallop", "--target-ra", "--target-rz"});
  if (mode == "--feed-per-rev") {
    const double f = positive_length_mm(o.feed_per_rev, unit, "--feed-per-rev");
    require_overlapping_marks(f, r, "--feed-per-rev", "nose radius");
    rep.cusp = feed_mark(r, f);
    return;
  }
  const FinishTarget t = target_kind(mode);
  const double target_um = target_value_um(o, mode, unit);
  const StepoverSolution sol = inverse_feed_mark(r, t, target_um);
  if (!sol.reachable) {
    throw InputError(mode + " " + format_number(target_um) + " um: unreachable; a " +
                     format_number(r) + " mm nose radius leaves at most " + target_word(t) + " " +
                     format_number(sol.max_target_um) + " um before its marks stop overlapping");
  }
  record_inverse(t, target_um, sol, rep);
}

Cutter read_cutter(const StepoverOptions& o, const Given& given, LengthUnit unit,
                   StepoverReport& rep) {
  Cutter c;
  c.shape = o.tool == "ball"       ? CutterShape::Ball
            : o.tool == "bullnose" ? CutterShape::BullNose
                                   : CutterShape::Flat;
  if (!given("--diameter")) throw InputError("--diameter is required for --tool " + o.tool);
  c.diameter_mm = parse_length_mm(o.diameter, unit, "--diameter");
  if (c.shape == CutterShape::BullNose) {
    if (!given("--corner-radius"))
      throw InputError("--corner-radius is required for --tool bullnose");
    c.corner_radius_mm = parse_length_mm(o.corner_radius, unit, "--corner-radius");
  } else {
    note_ignored(given, {"--corner-radius"}, "only a bull-nose has a separate corner radius", rep);
  }
  if (given("--dish")) {
    c.dish_deg = parse_angle_deg(o.dish, "--dish");
    if (c.shape == CutterShape::Ball) {
      note_ignored(given, {"--dish"}, "a ball has no flat face", rep);
      if (c.dish_deg >= 0.0) c.dish_deg = 0.0;  // a negative dish still fails validation
    }
  }
  if (given("--tilt")) c.tilt_deg = parse_angle_deg(o.tilt, "--tilt");
  if (given("--tilt-toward")) {
    c.tilt_toward_deg = parse_angle_deg(o.tilt_toward, "--tilt-toward");
    if (!given("--tilt")) note_ignored(given, {"--tilt-toward"}, "no --tilt given", rep);
  }
  if (given("--teeth")) {
    const double z = parse_number(o.teeth, "--teeth");
    if (z != std::floor(z) || z < 1.0 || z > 1000.0) {
      throw InputError("--teeth " + format_number(z) + ": must be a whole number >= 1");
    }
    c.teeth = static_cast<int>(z);
    rep.teeth_given = true;
  }
  validate_cutter(c, NameStyle::Flag);
  note_ignored(given, {"--nose-radius", "--feed-per-rev"}, "turning flags; use --tool insert", rep);
  return c;
}

CuspSetup read_setup(const StepoverOptions& o, const Given& given, LengthUnit unit,
                     StepoverReport& rep) {
  CuspSetup setup;
  setup.cutter = read_cutter(o, given, unit, rep);
  if (o.surface == "flat") {
    setup.surface = SurfaceKind::Plane;
    note_ignored(given, {"--surface-radius"}, "a flat surface has no radius", rep);
  } else if (o.surface == "convex" || o.surface == "concave") {
    setup.surface = o.surface == "convex" ? SurfaceKind::Convex : SurfaceKind::Concave;
    if (setup.cutter.shape != CutterShape::Ball) {
      throw InputError("--surface " + o.surface +
                       ": cylinder closed forms hold for --tool ball only (a flat-bottomed "
                       "cutter's contact jumps across its flat face); use a ball, or --surface "
                       "flat with --slope");
    }
    if (!given("--surface-radius")) {
      throw InputError("--surface-radius is required for --surface " + o.surface);
    }
    setup.surface_radius_mm = positive_length_mm(o.surface_radius, unit, "--surface-radius");
    if (setup.surface == SurfaceKind::Concave &&
        setup.surface_radius_mm <= setup.cutter.radius_mm()) {
      throw InputError("--surface-radius " + format_number(setup.surface_radius_mm) +
                       " mm: must be larger than the ball radius " +
                       format_number(setup.cutter.radius_mm()) +
                       " mm (a ball cannot follow a tighter concave surface)");
    }
    if (given("--slope")) {
      throw InputError(
          "--slope applies to --surface flat only (a cylinder's slope changes "
          "across the pass; its stepover is measured along the surface)");
    }
  } else {
    throw InputError("--surface '" + o.surface + "': allowed surfaces are flat, convex, concave");
  }
  if (setup.cutter.tilt_deg != 0.0 && (setup.surface != SurfaceKind::Plane || given("--slope"))) {
    throw InputError("--tilt " + format_number(setup.cutter.tilt_deg) +
                     " deg: a tilted cutter's cusp is modelled on a level floor only (--surface "
                     "flat, no --slope)");
  }
  if (given("--slope")) {
    setup.slope_deg = parse_angle_deg(o.slope, "--slope");
    if (!(std::abs(setup.slope_deg) < 90.0)) {
      throw InputError("--slope " + format_number(setup.slope_deg) +
                       " deg: must be greater than -90 and less than 90 deg");
    }
  }
  return setup;
}

// --target-sa: with --feed-per-tooth the stepover is designed on simulated windows (the marks
// along the feed count); without it the floor is the cross-feed profile extruded, Sa = Ra.
void run_areal_target(const StepoverOptions& o, const Given& given, LengthUnit unit,
                      const CuspSetup& setup, StepoverReport& rep) {
  if (setup.surface != SurfaceKind::Plane || setup.slope_deg != 0.0) {
    throw InputError("--target-sa: the areal design simulates a level floor; use --surface flat "
                     "without --slope, or --target-ra for cylinders and slopes");
  }
  if (o.pass_direction != "one-way" && o.pass_direction != "zigzag") {
    throw InputError("--pass-direction '" + o.pass_direction + "': allowed are one-way, zigzag");
  }
  rep.areal_target = true;
  rep.pass_direction =
      o.pass_direction == "zigzag" ? RasterDirection::Zigzag : RasterDirection::OneWay;
  const double target_um = target_value_um(o, "--target-sa", unit);
  if (!given("--feed-per-tooth")) {
    const StepoverSolution sol = inverse_stepover(setup, FinishTarget::Ra, target_um);
    if (!sol.reachable) {
      throw InputError(unreachable_message(setup, "--target-sa", FinishTarget::Ra, target_um, sol));
    }
    record_inverse(FinishTarget::Ra, target_um, sol, rep);
    return;
  }
  const double fz = positive_length_mm(o.feed_per_tooth, unit, "--feed-per-tooth");
  if (fz * setup.cutter.teeth >= setup.cutter.diameter_mm) {
    throw InputError("--feed-per-tooth " + format_number(fz) + " mm: the feed per revolution (x" +
                     std::to_string(setup.cutter.teeth) + " teeth) must stay below the diameter " +
                     format_number(setup.cutter.diameter_mm) + " mm");
  }
  const ArealStepover a = stepover_for_sa(setup.cutter, fz, rep.pass_direction, target_um);
  if (!a.reachable) {
    throw InputError("--target-sa " + format_number(target_um) +
                     " um: unreachable at --feed-per-tooth " + format_number(fz) +
                     " mm: the marks along the feed leave Sa " + format_number(a.sa_um) +
                     " um even at stepover " + format_number(a.smallest_tried_mm) +
                     " mm; reduce the feed per tooth (--both-directions --target-ra gives the "
                     "largest for a profile target)");
  }
  StepoverSolution sol;
  sol.reachable = true;
  sol.stepover_mm = a.stepover_mm;
  sol.cusp = cross_feed_cusp(setup, a.stepover_mm);
  record_inverse(FinishTarget::Ra, target_um, sol, rep);
  rep.areal = a;
}

void run_milling(const StepoverOptions& o, const Given& given, LengthUnit unit,
                 StepoverReport& rep) {
  const CuspSetup setup = read_setup(o, given, unit, rep);
  rep.setup = setup;
  const std::string mode = single_mode(
      given, {"--stepover", "--target-scallop", "--target-ra", "--target-rz", "--target-sa"});
  if (mode != "--target-sa") {
    note_ignored(given, {"--pass-direction"}, "it shapes the --target-sa design only", rep);
  }
  if (mode == "--target-sa") {
    run_areal_target(o, given, unit, setup, rep);
  } else if (mode == "--stepover") {
    rep.cusp = cross_feed_cusp(setup, positive_length_mm(o.stepover, unit, "--stepover"));
    if (rep.cusp.limit == CuspLimit::PassesDoNotOverlap) {
      throw InputError(no_overlap_message(setup, rep.cusp.stepover_mm));
    }
  } else {
    const FinishTarget t = target_kind(mode);
    const double target_um = target_value_um(o, mode, unit);
    const StepoverSolution sol = inverse_stepover(setup, t, target_um);
    if (!sol.reachable) throw InputError(unreachable_message(setup, mode, t, target_um, sol));
    record_inverse(t, target_um, sol, rep);
  }
  if (given("--feed-per-tooth")) {
    const double fz = positive_length_mm(o.feed_per_tooth, unit, "--feed-per-tooth");
    rep.feed_per_tooth_mm = fz;
    const double radius = setup.cutter.effective_corner_mm();
    if (radius > 0.0) {
      require_overlapping_marks(
          fz, radius, "--feed-per-tooth",
          setup.cutter.shape == CutterShape::Ball ? "ball radius" : "corner radius");
      rep.feed_mark = feed_mark(radius, fz);
      const double per_rev = fz * setup.cutter.teeth;
      if (rep.teeth_given && per_rev < 2.0 * radius)
        rep.feed_mark_per_rev = feed_mark(radius, per_rev);
    }
  }
  rep.both_directions = o.both_directions;
  const double corner = setup.cutter.effective_corner_mm();
  if (o.both_directions && rep.inverse && corner > 0.0) {
    // The same target along the feed: the feed per tooth whose marks meet it.
    const StepoverSolution along = inverse_feed_mark(corner, rep.target, rep.target_um);
    if (along.reachable) rep.feed_per_tooth_max_mm = along.stepover_mm;
  }
}

void run_stepover(const StepoverOptions& o, const CLI::App& app) {
  StageTimer timer;
  const Given given(app);
  const LengthUnit unit = o.common.length_unit();
  ShopFlag shop = o.shop;
  shop.load();
  StepoverReport rep;
  rep.unit = unit;
  if (o.tool == "insert") {
    run_turning(o, given, unit, rep);
  } else if (o.tool == "ball" || o.tool == "bullnose" || o.tool == "flat") {
    run_milling(o, given, unit, rep);
  } else {
    throw InputError("--tool '" + o.tool + "': allowed tools are ball, bullnose, flat, insert");
  }
  print_stage(o.common.verbose, "cusp", timer.lap());
  if (o.common.json) {
    nlohmann::json doc = stepover_json(rep);
    if (shop.active()) doc["shop"] = shop_ra_json(shop, rep.cusp.stats.ra_um);
    print_json(doc);
  } else {
    std::cout << stepover_table(rep);
    if (shop.active()) std::cout << shop_ra_text(shop, rep.cusp.stats.ra_um, unit) << '\n';
  }
  print_stage(o.common.verbose, "output", timer.lap());
}

}  // namespace

void setup_stepover(CLI::App& sub) {
  auto opts = std::make_shared<StepoverOptions>();
  sub.description(
      "Closed-form cusp height, Ra/Rq/Rz and feed marks of a finishing pass for a given stepover\n"
      "(--stepover), or the stepover that meets a target (--target-scallop | --target-ra |\n"
      "--target-rz | --target-sa). Exact geometry first, the small-stepover approximation beside it.");
  sub.add_option("--tool", opts->tool, "ball | bullnose | flat (end mills) | insert (turning)")
      ->type_name("KIND")
      ->capture_default_str();
  sub.add_option("--diameter", opts->diameter, "End-mill diameter D")->type_name("LENGTH");
  sub.add_option("--corner-radius", opts->corner_radius, "Bull-nose corner radius, 0 < rc <= D/2")
      ->type_name("LENGTH");
  sub.add_option("--dish", opts->dish, "End-face dish angle, >= 0 (matters only when tilted)")
      ->type_name("ANGLE");
  // Tram error is the usual reason a flat or bull-nose end mill leaves cusps at all (issue 13).
  sub.add_option("--tilt", opts->tilt, "Axis tilt (tram error), |tilt| <= 1 deg: level floor only")
      ->type_name("ANGLE");
  sub.add_option("--tilt-toward", opts->tilt_toward,
                 "Direction of the end face's lowest point, deg from the feed, ccw (default 0)")
      ->type_name("ANGLE");
  sub.add_option("--surface", opts->surface, "flat | convex | concave (cylinders: ball only)")
      ->type_name("KIND")
      ->capture_default_str();
  sub.add_option("--surface-radius", opts->surface_radius, "Cylinder radius rho")
      ->type_name("LENGTH");
  sub.add_option("--slope", opts->slope, "Slope of a flat surface across the pass, |a| < 90 deg")
      ->type_name("ANGLE");
  sub.add_option("--stepover", opts->stepover, "Stepover: plan view on planes, along cylinders")
      ->type_name("LENGTH");
  sub.add_option("--target-scallop", opts->target_scallop,
                 "Target cusp height, e.g. 5 (um; uin with --units in), 0.2thou")
      ->type_name("HEIGHT");
  sub.add_option("--target-ra", opts->target_ra,
                 "Target Ra of the ideal profile: 0.8 (um; 32 = uin with --units in), N6")
      ->type_name("HEIGHT");
  sub.add_option("--target-rz", opts->target_rz, "Target Rz of the ideal profile, e.g. 4um")
      ->type_name("HEIGHT");
  // Reason: an areal Sa sees the marks along the feed as well as the cusps across it, so the
  // stepover for it comes from simulated floor windows (issue 13).
  sub.add_option("--target-sa", opts->target_sa,
                 "Target Sa of the floor; with --feed-per-tooth designed on simulated windows")
      ->type_name("HEIGHT");
  sub.add_option("--pass-direction", opts->pass_direction,
                 "one-way | zigzag: passes of the --target-sa design")
      ->type_name("KIND")
      ->capture_default_str();
  sub.add_option("--feed-per-tooth", opts->feed_per_tooth, "Feed per tooth fz: adds feed marks")
      ->type_name("LENGTH");
  sub.add_option("--teeth", opts->teeth, "Teeth: adds the once-per-revolution mark (runout)")
      ->type_name("N");
  // Reason: a print's Ra may be checked across and along the lay, and an areal Sa sees both;
  // the stepover alone then does not decide the finish (issue 13).
  sub.add_flag("--both-directions", opts->both_directions,
               "The target holds along the feed too: gives the largest --feed-per-tooth for it");
  sub.add_option("--nose-radius", opts->nose_radius, "Turning insert nose radius r")
      ->type_name("LENGTH");
  sub.add_option("--feed-per-rev", opts->feed_per_rev, "Turning feed per revolution f")
      ->type_name("LENGTH");
  add_common_flags(sub, opts->common);
  add_shop_flag(sub, opts->shop);
  sub.footer(stepover_help_footer());
  sub.callback([opts, &sub] { run_stepover(*opts, sub); });
}

}  // namespace cuspmap

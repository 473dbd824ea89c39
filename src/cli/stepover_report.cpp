// Human table, JSON object and message lines of `cuspmap stepover`.
// Inputs: StepoverReport (mm, um); outputs: text in mm/um or in/uin, JSON in mm/um.
// Method: std::to_chars for numbers (locale-independent); 1 in = 25.4 mm, 1 um = 39.37 uin.
#include "cli/stepover_report.h"

#include <array>
#include <charconv>
#include <cmath>
#include <sstream>
#include <utility>

#include "cusp/kinematic_limits.h"
#include "cusp/iso1302_grade.h"
#include "cusp/scallop_curved.h"
#include "core/display_quantity.h"
#include "report/html_report.h"
#include "finish/wide_ridges.h"

namespace cuspmap {
namespace {

// Human text of the table: the shared display layer (3 significant figures, --units).
std::string sig(double v) { return display_number(v, 1e-9); }

std::string length(double mm, LengthUnit unit) { return display_length(mm, unit); }

std::string height(double um, LengthUnit unit) { return display_roughness(um, unit); }

std::string shape_words(const CuspSetup& s, LengthUnit unit) {
  const Cutter& c = s.cutter;
  std::string t = c.shape == CutterShape::Ball       ? "ball end mill D "
                  : c.shape == CutterShape::BullNose ? "bull-nose end mill D "
                                                     : "flat end mill D ";
  t += length(c.diameter_mm, unit);
  if (c.shape == CutterShape::BullNose) t += " rc " + length(c.corner_radius_mm, unit);
  if (c.dish_deg > 0.0) t += " dish " + sig(c.dish_deg) + " deg";
  if (c.tilt_deg != 0.0) {
    t += " tilted " + sig(c.tilt_deg) + " deg toward " + sig(c.tilt_toward_deg) +
         " deg from the feed";
  }
  if (s.surface == SurfaceKind::Plane) {
    t += s.slope_deg == 0.0 ? ", level floor" : ", floor sloped " + sig(s.slope_deg) + " deg";
  } else {
    t += s.surface == SurfaceKind::Convex ? ", convex" : ", concave";
    t += " cylinder rho " + length(s.surface_radius_mm, unit);
  }
  return t;
}

std::string target_name(FinishTarget t) {
  return t == FinishTarget::Ra ? "Ra" : t == FinishTarget::Rz ? "Rz" : "cusp";
}

std::string target_name(const StepoverReport& rep) {
  return rep.areal_target ? "Sa" : target_name(rep.target);
}

struct Messages {
  std::vector<std::string> warnings, notes, cautions;
};

// The mark along the feed (per tooth, or once per revolution when runout may make that one
// deeper) that is larger than the cross-feed cusp, with its words; none when the cusp is larger.
std::optional<std::pair<double, std::string>> larger_feed_mark(const StepoverReport& rep) {
  if (!rep.feed_mark) return std::nullopt;
  double um = rep.feed_mark->scallop_um;
  std::string what = "per tooth";
  if (rep.feed_mark_per_rev && rep.feed_mark_per_rev->scallop_um > um) {
    um = rep.feed_mark_per_rev->scallop_um;
    what = "once per revolution, as runout leaves it";
  }
  if (!(um > rep.cusp.scallop_um)) return std::nullopt;
  return std::make_pair(um, what);
}

// Warning and note lines for the result (units of the human table; JSON uses mm).
Messages collect(const StepoverReport& rep, LengthUnit unit) {
  Messages m;
  m.notes = rep.notes;
  const CuspResult& r = rep.cusp;
  if (rep.turning) {
    m.notes.push_back("turning: the feed per revolution is the mark spacing (shown as stepover)");
    return m;
  }
  const CuspSetup& s = rep.setup;
  const Cutter& c = s.cutter;
  const double big_r = c.radius_mm(), rc = c.effective_corner_mm();
  if (r.profile_overhangs) {
    m.warnings.push_back(
        "on this slope part of the cusp leans over the surface; Ra and Rq are "
        "of the net profile along the surface");
  }
  if (s.surface == SurfaceKind::Plane && c.shape != CutterShape::Ball && s.slope_deg == 0.0 &&
      r.scallop_um == 0.0 && r.limit == CuspLimit::None) {
    m.notes.push_back(
        (c.shape == CutterShape::Flat
             ? std::string("a flat end mill with a vertical axis leaves no cross-feed cusp below "
                           "one diameter")
             : "the flat faces of neighbouring passes overlap (stepover <= 2(R - rc) = " +
                   length(2.0 * (big_r - rc), unit) + "), so no cross-feed cusp forms") +
        "; real marks come from the rim, dish, tilt and runout: see `cuspmap simulate`");
  }
  if (c.tilt_deg != 0.0) {
    m.notes.push_back(
        "tilt: first-order model p(r) - tan(tilt) v.n (valid to |tilt| <= 1 deg); the cusp lies "
        "between the tilted lowest rings' projections across the feed (ellipses), one-way and "
        "zigzag alike; marks along the feed need `cuspmap simulate`");
  } else if (c.dish_deg > 0.0) {
    m.notes.push_back(
        "the dish does not change the cross-feed cusp of a straight pass (the "
        "lowest ring sweeps every chord); its rim marks need `cuspmap simulate`");
  }
  if (r.side_forms_cusp && r.limit == CuspLimit::None) {
    m.notes.push_back("on this slope the cutter's cylindrical side, not its end, bounds the cusp");
  }
  if (s.surface == SurfaceKind::Plane && s.slope_deg != 0.0) {
    m.notes.push_back("the stepover is in plan view; along the surface the contacts are " +
                      length(r.chord_mm, unit) + " apart");
  }
  if (s.surface != SurfaceKind::Plane) {
    m.notes.push_back(
        "the ball is treated as a full sphere: valid where the cusp lies on its "
        "lower half (near the crown, or with the axis along the surface normal)");
  }
  if (rep.areal) {
    const ArealStepover& a = *rep.areal;
    m.notes.push_back(
        "designed for Sa on " + std::to_string(a.windows) + " floor windows swept tooth by tooth (" +
        (rep.pass_direction == RasterDirection::Zigzag ? "zigzag" : "one-way") +
        " passes, ISO 25178-2 Sa after plane removal): simulated Sa " + height(a.sa_um, unit) +
        "; the cross-feed profile alone would allow " + length(a.profile_stepover_mm, unit) +
        (a.stepover_mm < a.profile_stepover_mm ? ", the marks along the feed take the rest"
                                               : ", the marks along the feed add nothing that "
                                                 "matters") +
        "; the teeth's phase from pass to pass follows the pass length and links, so a whole "
        "floor measures within about +-5 % of this (simulate it)");
  } else if (rep.areal_target) {
    m.notes.push_back(
        "no --feed-per-tooth: no marks along the feed, so Sa is the Ra of the cross-feed profile "
        "(the floor is that profile extruded along the passes)");
  }
  if (const auto along = larger_feed_mark(rep); along && !rep.areal) {
    m.warnings.push_back(
        "the feed mark along the feed (" + height(along->first, unit) + ", " + along->second +
        ") is larger than the cross-feed cusp " + height(r.scallop_um, unit) + " this stepover " +
        (rep.inverse ? "is designed for" : "leaves") +
        ": an areal finish (Sa) or one checked in both directions is set by the larger mark" +
        (rep.both_directions ? "" : "; add --both-directions to design for it"));
  }
  if (rep.feed_per_tooth_max_mm) {
    const double fz_max = *rep.feed_per_tooth_max_mm;
    const std::string limit = "feed per tooth <= " + length(fz_max, unit) + " meets the target " +
                              target_name(rep) + " " + height(rep.target_um, unit) +
                              " along the feed too";
    if (rep.feed_per_tooth_mm && *rep.feed_per_tooth_mm > fz_max) {
      m.warnings.push_back("--feed-per-tooth " + length(*rep.feed_per_tooth_mm, unit) +
                           " misses the target along the feed, whatever the stepover: " + limit);
    } else {
      m.notes.push_back(limit + (rep.teeth_given ? " (with runout: per revolution, i.e. fz <= " +
                                                       length(fz_max / c.teeth, unit) + ")"
                                                 : ""));
    }
  }
  if (r.scallop_um > 0.0 && ridges_hidden_by_ra(r.stepover_mm, r.scallop_um, r.stats.ra_um)) {
    m.cautions.push_back(
        wide_ridges_caution(height(r.scallop_um, unit), length(r.stepover_mm, unit)));
  }
  if (rep.feed_per_tooth_mm) {
    if (c.shape == CutterShape::Flat) {
      m.notes.push_back(
          "a flat end mill's ideal end face wipes its own feed marks (feed mark 0); "
          "real ones come from dish, tilt and runout: see `cuspmap simulate`");
    } else {
      m.notes.push_back(
          "feed-per-tooth marks run across the feed; they leave the cross-feed "
          "cusp and its Ra unchanged");
      if (c.shape == CutterShape::BullNose) {
        m.notes.push_back(
            "corner feed marks assume only the leading side cuts (dish or tilt lift "
            "the trailing side), as in face milling");
      }
    }
    if (rep.teeth_given && c.shape != CutterShape::Flat) {
      m.notes.push_back(
          "with runout larger than the feed mark one tooth cuts deepest and the "
          "marks repeat once per revolution (feed per revolution " +
          length(*rep.feed_per_tooth_mm * c.teeth, unit) + ")" +
          (rep.feed_mark_per_rev ? "" : "; too coarse for overlapping marks"));
    }
  }
  return m;
}

const char* kCaution =
    "finishing passes run a rotating cutter: guard it, clamp the work securely, and treat fine "
    "metal dust as combustible and harmful to breathe; follow local codes, the machine maker's "
    "instructions and licensed practice";

nlohmann::json optional_number(const std::optional<double>& v) {
  return v ? nlohmann::json(*v) : nlohmann::json(nullptr);
}

}  // namespace

nlohmann::json stepover_json(const StepoverReport& rep) {
  nlohmann::json j;
  const CuspResult& r = rep.cusp;
  if (rep.turning) {
    j["tool"] = {{"shape", "insert"}, {"nose_radius_mm", rep.nose_radius_mm}};
    j["feed_per_rev_mm"] = r.stepover_mm;
  } else {
    const Cutter& c = rep.setup.cutter;
    const char* shape = c.shape == CutterShape::Ball       ? "ball"
                        : c.shape == CutterShape::BullNose ? "bullnose"
                                                           : "flat";
    j["tool"] = {{"shape", shape},
                 {"diameter_mm", c.diameter_mm},
                 {"corner_radius_mm", c.effective_corner_mm()},
                 {"dish_deg", c.dish_deg},
                 {"tilt_deg", c.tilt_deg},
                 {"tilt_toward_deg", c.tilt_toward_deg}};
    if (rep.teeth_given) j["tool"]["teeth"] = c.teeth;
    const SurfaceKind k = rep.setup.surface;
    j["surface"] = {{"kind", k == SurfaceKind::Plane    ? "flat"
                             : k == SurfaceKind::Convex ? "convex"
                                                        : "concave"}};
    if (k == SurfaceKind::Plane) {
      j["surface"]["slope_deg"] = rep.setup.slope_deg;
      j["stepover_along_surface_mm"] = r.chord_mm;
    } else {
      j["surface"]["surface_radius_mm"] = rep.setup.surface_radius_mm;
    }
  }
  j["mode"] = rep.inverse ? "inverse" : "forward";
  if (rep.inverse) {
    j["target"] = {{"quantity", target_name(rep)}, {"value_um", rep.target_um}};
    j["stepover_approx_mm"] = rep.stepover_approx_mm > 0.0 ? nlohmann::json(rep.stepover_approx_mm)
                                                           : nlohmann::json(nullptr);
  }
  j["stepover_mm"] = r.stepover_mm;
  j["cusp_um"] = r.scallop_um;
  j["cusp_approx_um"] = r.scallop_approx_um;
  j["Ra_um"] = r.stats.ra_um;
  j["Rq_um"] = r.stats.rq_um;
  j["Rz_um"] = r.stats.rz_um;
  j["Ra_approx_um"] = r.stats_approx.ra_um;
  j["Rq_approx_um"] = r.stats_approx.rq_um;
  j["Rz_approx_um"] = r.stats_approx.rz_um;
  j["effective_radius_mm"] = optional_number(r.effective_radius_mm);
  const auto grade = r.stats.ra_um > 0.0 ? iso1302_grade(r.stats.ra_um) : std::nullopt;
  j["iso1302_grade"] = grade ? nlohmann::json(grade->label()) : nlohmann::json(nullptr);
  if (rep.areal) {
    j["areal_design"] = {{"Sa_um", rep.areal->sa_um},
                         {"profile_stepover_mm", rep.areal->profile_stepover_mm},
                         {"windows", rep.areal->windows},
                         {"pass_direction", rep.pass_direction == RasterDirection::Zigzag
                                                ? "zigzag"
                                                : "one-way"}};
  }
  if (rep.feed_per_tooth_mm) {
    j["feed_per_tooth_mm"] = *rep.feed_per_tooth_mm;
    j["feed_mark_um"] = rep.feed_mark ? rep.feed_mark->scallop_um : 0.0;
    j["feed_mark_approx_um"] = rep.feed_mark ? rep.feed_mark->scallop_approx_um : 0.0;
    if (rep.teeth_given) {
      j["feed_per_rev_mm"] = *rep.feed_per_tooth_mm * rep.setup.cutter.teeth;
      if (rep.feed_mark_per_rev) j["feed_mark_per_rev_um"] = rep.feed_mark_per_rev->scallop_um;
    }
  }
  const Messages m = collect(rep, LengthUnit::Millimetre);
  j["within_model"] = r.limit == CuspLimit::None;
  j["warnings"] = m.warnings;
  j["notes"] = m.notes;
  j["cautions"] = m.cautions;
  j["cautions"].push_back(kCaution);
  if (const std::string fine = fine_ra_caution(r.stats.ra_um); !fine.empty()) {
    j["cautions"].push_back(fine);
  }
  j["model"] = kKinematicBestCase;
  j["both_directions"] = rep.both_directions;
  if (rep.feed_per_tooth_max_mm) j["feed_per_tooth_max_mm"] = *rep.feed_per_tooth_max_mm;
  return j;
}

std::string stepover_table(const StepoverReport& rep) {
  const LengthUnit u = rep.unit;
  const CuspResult& r = rep.cusp;
  std::ostringstream out;
  auto row = [&out](const std::string& label, const std::string& exact, const std::string& approx) {
    std::string line = "  " + label;
    line.resize(22, ' ');
    line += exact;
    if (!approx.empty()) {
      if (line.size() < 48) line.resize(48, ' ');
      line += "  " + approx;
    }
    out << line << '\n';
  };
  out << "cuspmap stepover: "
      << (rep.turning ? "turning insert, nose radius " + length(rep.nose_radius_mm, u)
                      : shape_words(rep.setup, u))
      << '\n';
  if (rep.inverse) {
    out << "  target " << target_name(rep) << " " << height(rep.target_um, u) << '\n';
  }
  row("", "exact", "small-stepover approx.");
  row(rep.turning ? "feed per rev" : "stepover", length(r.stepover_mm, u),
      rep.inverse ? (rep.stepover_approx_mm > 0.0 ? length(rep.stepover_approx_mm, u) : "-") : "");
  row("cusp height", height(r.scallop_um, u), height(r.scallop_approx_um, u));
  row("Ra", height(r.stats.ra_um, u), height(r.stats_approx.ra_um, u));
  row("Rq", height(r.stats.rq_um, u), height(r.stats_approx.rq_um, u));
  row("Rz", height(r.stats.rz_um, u), height(r.stats_approx.rz_um, u));
  const auto grade = r.stats.ra_um > 0.0 ? iso1302_grade(r.stats.ra_um) : std::nullopt;
  // The grade with both columns of the ISO 1302:1992 table (N6: Ra 0.8 um = 32 uin).
  const auto grade_ra = [u](const RoughnessGrade& g) {
    return u == LengthUnit::Inch ? sig(g.ra_uin) + " uin = " + sig(g.ra_um) + " um"
                                 : sig(g.ra_um) + " um = " + sig(g.ra_uin) + " uin";
  };
  row("ISO 1302:1992 grade",
      grade ? grade->label() + " (Ra up to " + grade_ra(*grade) + ")"
            : (r.stats.ra_um > 0.0 ? "coarser than N12" : "none (no ideal cusp)"),
      "");
  row("effective radius",
      r.effective_radius_mm ? length(*r.effective_radius_mm, u) : "none (flat face)", "");
  if (rep.areal) row("Sa (simulated)", height(rep.areal->sa_um, u), "");
  if (rep.feed_per_tooth_mm) {
    row("feed mark", height(rep.feed_mark ? rep.feed_mark->scallop_um : 0.0, u),
        rep.feed_mark ? height(rep.feed_mark->scallop_approx_um, u) : "");
    if (rep.feed_mark_per_rev) {
      row("once-per-rev mark", height(rep.feed_mark_per_rev->scallop_um, u),
          height(rep.feed_mark_per_rev->scallop_approx_um, u));
    }
  }
  const Messages m = collect(rep, u);
  for (const std::string& w : m.warnings) out << "warning: " << w << '\n';
  for (const std::string& n : m.notes) out << "note: " << n << '\n';
  for (const std::string& c : m.cautions) out << "caution: " << c << '\n';
  if (const std::string fine = fine_ra_caution(r.stats.ra_um, u); !fine.empty()) {
    out << "caution: " << fine << '\n';
  }
  out << "model: " << kKinematicBestCase << '\n';
  out << kShortCaution << '\n';
  return out.str();
}

std::string no_overlap_message(const CuspSetup& setup, double stepover_mm) {
  const Cutter& c = setup.cutter;
  const std::string head = "--stepover " + format_number(stepover_mm) + " mm: ";
  if (setup.surface == SurfaceKind::Plane) {
    return head + "must be < the tool diameter " + format_number(c.diameter_mm) +
           " mm (wider passes leave uncut strips between them)";
  }
  const bool convex = setup.surface == SurfaceKind::Convex;
  return head + "must be <= " +
         format_number(curved_reach_mm(c.radius_mm(), setup.surface_radius_mm, convex)) +
         " mm along this " + (convex ? "convex" : "concave") +
         " surface (beyond it neighbouring tool circles no longer meet and leave uncut strips)";
}

std::string unreachable_message(const CuspSetup& setup, const std::string& flag,
                                FinishTarget target, double target_um,
                                const StepoverSolution& sol) {
  const Cutter& c = setup.cutter;
  const std::string head = flag + " " + format_number(target_um) + " um: unreachable; ";
  if (setup.surface == SurfaceKind::Concave && setup.surface_radius_mm <= c.radius_mm()) {
    return head + "a ball of radius " + format_number(c.radius_mm()) +
           " mm cannot follow a concave radius of " + format_number(setup.surface_radius_mm) +
           " mm";
  }
  if (sol.max_target_um == 0.0) {
    return head + "a " + (c.shape == CutterShape::Flat ? "flat end mill" : "bull-nose") +
           " on a level floor leaves no cross-feed cusp at stepovers below its diameter (marks "
           "come from the rim, dish, tilt and runout: use cuspmap simulate)";
  }
  const std::string what = target == FinishTarget::Ra   ? "Ra"
                           : target == FinishTarget::Rz ? "Rz"
                                                        : "cusp";
  std::string why = "before neighbouring passes stop overlapping";
  if (c.shape == CutterShape::BullNose && setup.surface == SurfaceKind::Plane &&
      setup.slope_deg == 0.0) {
    why = "(a cusp is never deeper than the corner radius " + format_number(c.corner_radius_mm) +
          " mm)";
  }
  return head + "the largest " + what + " this cutter and surface leave is " +
         format_number(sol.max_target_um) + " um " + why;
}

std::string stepover_help_footer() {
  return "Conventions: heights are along the surface normal. --slope tilts a flat floor across\n"
         "the pass and takes the stepover in plan view. --surface convex|concave is a cylinder\n"
         "whose axis runs along the feed; its stepover is measured along the surface.\n"
         "Lengths take the suffixes mm, um, in, thou, uin, and fractions (1/4, 1-1/4in); bare\n"
         "numbers use --units. Bare heights (--target-*) are um, or uin with --units in (Ra 32\n"
         "on an inch print is 32 uin); --target-ra also takes ISO 1302:1992 grades (N6 = 0.8 um).\n"
         "Ra, Rq, Rz are those of the ideal periodic profile (ISO 4287 over whole periods); the\n"
         "exact arc profile comes first, the parabolic small-stepover form beside it\n"
         "(Ra = 4h/(9 sqrt 3), Rq = 2h/(3 sqrt 5), Rz = h). --json prints one object in mm/um;\n"
         "effective_radius_mm is R (ball on a plane), R rho/(rho +- R) (cylinders), rc (bull-nose\n"
         "corner), 0 (sharp corner on a slope) or null (a flat face finishes the floor).\n"
         "Examples:\n"
         "  cuspmap stepover --tool ball --diameter 6 --stepover 0.5\n"
         "  cuspmap stepover --tool ball --diameter 1/4 --target-ra 32 --units in\n"
         "  cuspmap stepover --tool bullnose --diameter 10 --corner-radius 1 --tilt 0.02 "
         "--stepover 6\n"
         "  cuspmap stepover --tool bullnose --diameter 10 --corner-radius 1 --slope 20 "
         "--target-ra 0.8um\n"
         "  cuspmap stepover --tool ball --diameter 6 --surface concave --surface-radius 20 \\\n"
         "      --stepover 0.4 --feed-per-tooth 0.08 --teeth 2 --json\n"
         "  cuspmap stepover --tool insert --nose-radius 0.8 --feed-per-rev 0.2\n" +
         cautions_help_text({kCaution});
}

}  // namespace cuspmap

// `cuspmap plan`'s flags and what they ask for: the options as given on the command line and
// the PlanRequest they build (tools, stepovers, floor, rates, targets, sanding, sweep basis),
// with one-line refusals naming the offending flag. Inputs: flag strings with unit suffixes;
// output: PlanRequest in mm / um / s (units parsed here, at the edge).
#pragma once

#include <string>

#include "cli/command.h"
#include "cli/finish_flags.h"
#include "cli/shop_flag.h"
#include "core/units.h"
#include "finish/plan_stepover.h"

namespace cuspmap {

/// The flags of `cuspmap plan`, as given.
struct PlanOptions {
  CommonOptions common;
  ShopFlag shop;                  // --shop profile
  ToolFlags tool;
  GritFlags grits;
  std::string tools;              // --tools ball:6,flat:12.7 (else the single-tool flags)
  std::string stepovers;          // --stepovers 0.1,0.2mm,... (else the default range per tool)
  std::string size;               // --size 120x80
  std::string feed;               // --feed, length per minute
  std::string rapid = "10000mm";  // --rapid, length per minute (CutSpec's default rapid rate)
  std::string retract = "2mm";    // --retract
  std::string pass_direction = "one-way";  // --pass-direction (texture's --direction is the trace)
  double pass_overhead_s = kDefaultPassOverheadS;
  std::string machine_rate;    // per hour
  std::string bench_rate;      // per hour
  std::string target_ra;       // height
  std::string target_scallop;  // height
  std::string tolerance;       // length (+-)
  std::string sand = "when-needed";
  std::string job;        // --job FILE: tool, floor, feed and sweep of a raster job
  std::string out;        // --out DIR
  bool simulate = false;  // --simulate: surfaces from a simulated window, not the closed form
};

/// Builds the plan's request from the flags (and the job file with --job).
/// @throws InputError (one line, naming the flag and what is allowed) for bad values
PlanRequest request_from_flags(const PlanOptions& o, LengthUnit units);

}  // namespace cuspmap

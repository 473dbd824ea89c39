// The subcommand table and the helpers every cli/cmd_<name>.cpp shares: common flags, JSON
// printing with the finite-number check, and the "not built yet" refusal.
// cli/ holds no computation: it parses flags, calls the library and prints.
#pragma once

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>
#include <functional>
#include <string>

#include "core/units.h"
#include "job/run_estimate.h"

namespace cuspmap {

/// Flags that most subcommands take.
struct CommonOptions {
  std::string units = "mm";  ///< unit of bare numbers and of human output: mm | in
  bool json = false;         ///< print exactly one JSON object on stdout
  bool verbose = false;      ///< one aligned line per stage with its time on stderr
  /// The parsed --units value (throws InputError naming the value when it is neither).
  LengthUnit length_unit() const { return parse_length_unit(units, "--units"); }
};

/// Adds --units, --json and --verbose to a subcommand, bound to `common`.
void add_common_flags(CLI::App& sub, CommonOptions& common);

/// Prints `doc` on stdout as one JSON object (2-space indent, trailing newline).
/// @throws std::logic_error (internal error, exit 1) if any number in it is NaN or infinite.
void print_json(const nlohmann::json& doc);

/// A RunOptions::before_sweep that prints the forecast line on stderr when the run is forecast
/// to take kAnnounceRunS or longer, or always when verbose. `prefix` names the job ("" = none).
std::function<void(const RunEstimate&)> forecast_printer(bool verbose, std::string prefix = "");

/// Prints "<name> <ms> ms" for a stage on stderr when verbose.
void print_stage(bool verbose, const char* stage, double seconds);

/// Registers each subcommand; one function per cli/cmd_<name>.cpp.
void setup_stepover(CLI::App& sub);
void setup_simulate(CLI::App& sub);
void setup_compare(CLI::App& sub);
void setup_texture(CLI::App& sub);
void setup_allowance(CLI::App& sub);
void setup_plan(CLI::App& sub);
void setup_demo(CLI::App& sub);
void setup_calibrate(CLI::App& sub);
void setup_diagnose(CLI::App& sub);

/// One row of the command table: name, one-line help, and its setup function.
struct CommandEntry {
  const char* name;
  const char* help;
  void (*setup)(CLI::App& sub);
};

/// The command table, in the order `cuspmap --help` lists them.
inline constexpr CommandEntry kCommands[] = {
    {"stepover", "Closed-form cusp height, Ra/Rq/Rz and stepover for a target finish", setup_stepover},
    {"simulate", "Simulate the floor a finishing path leaves (heightfield, images, report)", setup_simulate},
    {"compare", "Simulate several jobs and compare their floors side by side", setup_compare},
    {"texture", "ISO 4287 / 25178-2 texture parameters of a simulated or measured surface", setup_texture},
    {"allowance", "Sanding depth, programmed stock and grit sequence to erase the marks", setup_allowance},
    {"plan", "Cheapest stepover once machine and bench time are both counted", setup_plan},
    {"calibrate", "Fit a shop's measured Ra against the predictions of its past jobs", setup_calibrate},
    {"diagnose", "Read a measured floor or trace back to stepover, cutter radius and feed marks", setup_diagnose},
    {"demo", "Run the built-in pump-cover scenario end to end", setup_demo},
};

}  // namespace cuspmap

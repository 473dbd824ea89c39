// cuspmap entry point: builds the CLI11 app from the command table and turns errors into exit
// codes: 0 ok, 2 bad input (one line on stderr naming the value), 1 internal error.
// The only place in the program that prints errors or exits.
#include <CLI/CLI.hpp>
#include <cstdio>
#include <exception>
#include <string>

#include "cli/command.h"
#include "core/input_error.h"
#include "core/process_memory.h"
#include "core/write_file_atomic.h"

namespace {

// One stderr line, whatever the message holds (newlines folded into "; ").
void print_error_line(const char* kind, std::string message) {
  for (char& c : message) {
    if (c == '\n' || c == '\r') c = ' ';
  }
  std::fprintf(stderr, "cuspmap: %s: %s\n", kind, message.c_str());
}

}  // namespace

int main(int argc, char** argv) {
  cuspmap::tune_process_memory();
  cuspmap::install_temp_cleanup_handlers();
  CLI::App app{
      "cuspmap predicts the surface a CNC finishing pass leaves: cusp heights, simulated floors,\n"
      "ISO texture parameters, pictures, sanding allowance and the cheapest stepover."};
  app.set_version_flag("--version", "cuspmap 0.1.0");
  app.require_subcommand(1);
  for (const cuspmap::CommandEntry& entry : cuspmap::kCommands) {
    CLI::App* sub = app.add_subcommand(entry.name, entry.help);
    entry.setup(*sub);
  }
  try {
    app.parse(argc, argv);
  } catch (const CLI::CallForHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForAllHelp& e) {
    return app.exit(e);
  } catch (const CLI::CallForVersion& e) {
    return app.exit(e);
  } catch (const CLI::ParseError& e) {
    print_error_line("error", e.what());
    return 2;
  } catch (const cuspmap::InputError& e) {
    print_error_line("error", e.what());
    return 2;
  } catch (const std::exception& e) {
    print_error_line("internal error", e.what());
    return 1;
  }
  return 0;
}

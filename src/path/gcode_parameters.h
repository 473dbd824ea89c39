// Parameters of an RS-274 program: numbered #1..#5399, named globals #<_name> and named locals
// #<name> (one scope per subroutine call; #1..#30 are a call's arguments and are restored when it
// returns). Values are plain numbers in program units. Cost O(1) per numbered access, O(log n)
// per named one. Method: RS274NGC v3 (Kramer, Proctor & Messina, NIST IR 6556, 2000) §3.2.1
// parameters, §3.3.3 parameter setting; named parameters and call scopes as common controls
// extend v3 (O-word subroutines).
#pragma once

#include <array>
#include <map>
#include <optional>
#include <string>
#include <vector>

namespace cuspmap {

/// Numbered parameters run from 0 to 5399 (RS274NGC v3 §3.2.1: "a parameter table of 5400").
inline constexpr int kGcodeParameterCount = 5400;
/// A subroutine call passes its arguments in #1..#30 (common practice, no source: O-word calls).
inline constexpr int kGcodeCallArguments = 30;

/// Parameter store of one program run.
class GcodeParameters {
 public:
  GcodeParameters();

  /// Value of numbered parameter n (0 <= n < kGcodeParameterCount); never-set ones read 0.
  double numbered(int n) const { return numbered_[static_cast<std::size_t>(n)]; }
  /// Sets numbered parameter n.
  void set_numbered(int n, double value) { numbered_[static_cast<std::size_t>(n)] = value; }

  /// Value of a named parameter (lower-case name without '<' '>'); a leading '_' is global.
  /// @return nullopt when it was never set in reach (a local of another call is out of reach)
  std::optional<double> named(const std::string& name) const;
  /// Sets a named parameter: globals for "_name", else a local of the current call.
  void set_named(const std::string& name, double value);

  /// Enters a subroutine call: a new local scope; #1..#30 saved, then set from `args`
  /// (the rest to 0).
  void push_call(const std::vector<double>& args);
  /// Leaves the innermost call: its locals are dropped and #1..#30 restored.
  void pop_call();
  /// Calls in progress (0 in the main program).
  std::size_t depth() const { return frames_.size(); }

 private:
  struct Frame {
    std::array<double, kGcodeCallArguments> saved{};  // #1..#30 of the caller
    std::map<std::string, double> locals;             // named locals of this call
  };
  std::vector<double> numbered_;
  std::map<std::string, double> globals_;
  std::map<std::string, double> main_locals_;
  std::vector<Frame> frames_;
};

}  // namespace cuspmap

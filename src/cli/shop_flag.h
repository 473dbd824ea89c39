// `--shop <profile>` for stepover, simulate, compare, allowance and plan: reads a shop profile
// written by `calibrate` and shows the shop-calibrated Ra beside the kinematic one (never in its
// place), in the human output and as a `shop` object in JSON.
// cli/ holds no computation beyond applying the fitted line (finish/shop_calibration).
#pragma once

#include <CLI/CLI.hpp>
#include <nlohmann/json.hpp>
#include <optional>
#include <string>

#include "core/units.h"
#include "io/shop_profile.h"

namespace cuspmap {

/// The --shop flag's value and, once read, its profile.
struct ShopFlag {
  std::string path;                    ///< --shop as given; empty = not given
  std::optional<ShopProfile> profile;  ///< read by load()
  /// Reads the profile when the flag was given (InputError naming the file otherwise).
  void load();
  /// True when a profile is loaded.
  bool active() const { return profile.has_value(); }
};

/// Adds --shop to a subcommand.
void add_shop_flag(CLI::App& sub, ShopFlag& flag);

/// One human line: "shop-calibrated Ra 0.62 um (+-0.05), kinematic 0.4 um [profile.toml]".
/// @param[in] kinematic_um  the model's Ra, um
std::string shop_ra_text(const ShopFlag& flag, double kinematic_um, LengthUnit unit);

/// JSON {profile, model, kinematic_Ra_um, calibrated_Ra_um, calibrated_Ra_sd_um}.
nlohmann::json shop_ra_json(const ShopFlag& flag, double kinematic_um);

/// The calibrated value alone (for table columns), um.
double shop_ra_um(const ShopFlag& flag, double kinematic_um);

}  // namespace cuspmap

// --shop: the shop-calibrated Ra beside the kinematic one (text and JSON).
#include "cli/shop_flag.h"

#include <cassert>

#include "report/nice_ticks.h"

namespace cuspmap {
namespace {

std::string roughness(double um, LengthUnit unit) {
  return unit == LengthUnit::Inch ? format_significant(um * kUinPerUm, 3) + " uin"
                                  : format_significant(um, 3) + " um";
}

}  // namespace

void ShopFlag::load() {
  if (!path.empty()) profile = read_shop_profile(path);
}

void add_shop_flag(CLI::App& sub, ShopFlag& flag) {
  // Reason: a shop that measured its own parts sees the prediction its instrument would read,
  // beside the kinematic value (docs/calibration.md).
  sub.add_option("--shop", flag.path,
                 "Shop profile from `cuspmap calibrate`: also show the shop-calibrated Ra");
}

double shop_ra_um(const ShopFlag& flag, double kinematic_um) {
  assert(flag.active() && "load() the profile first");
  return apply_shop_calibration(flag.profile->ra, kinematic_um).value_um;
}

std::string shop_ra_text(const ShopFlag& flag, double kinematic_um, LengthUnit unit) {
  assert(flag.active() && "load() the profile first");
  const CalibratedValue c = apply_shop_calibration(flag.profile->ra, kinematic_um);
  return "shop-calibrated Ra " + roughness(c.value_um, unit) + " (+-" +
         roughness(c.sd_um, unit) + "), kinematic " + roughness(kinematic_um, unit) + " [" +
         flag.path + "]";
}

nlohmann::json shop_ra_json(const ShopFlag& flag, double kinematic_um) {
  assert(flag.active() && "load() the profile first");
  const CalibratedValue c = apply_shop_calibration(flag.profile->ra, kinematic_um);
  return {{"profile", flag.path},
          {"model", calibration_model_name(flag.profile->ra.model)},
          {"kinematic_Ra_um", kinematic_um},
          {"calibrated_Ra_um", c.value_um},
          {"calibrated_Ra_sd_um", c.sd_um}};
}

}  // namespace cuspmap

// Tests of the shop profile file: round trip through encode/parse, and refusals with the file,
// line, column and key named.
#include "core/input_error.h"
#include "io/shop_profile.h"
#include "test_support.h"

namespace cuspmap {

TEST_CASE("encode_shop_profile / parse_shop_profile: round trip keeps every number", "[io]") {
  ShopProfile p;
  p.source = "jobs \"2026\".csv";
  p.created = "2026-12-04";
  p.ra.model = CalibrationModel::FloorAndScale;
  p.ra.floor_um = 0.1234567890123;
  p.ra.floor_sd_um = 0.0123;
  p.ra.scale = 1.3;
  p.ra.scale_sd = 0.05;
  p.ra.cov_floor_scale_um = -1.25e-4;
  p.ra.rows = 9;
  p.ra.rms_before_um = 0.4;
  p.ra.rms_after_um = 0.03;
  const ShopProfile q = parse_shop_profile(encode_shop_profile(p), "shop.toml");
  REQUIRE(q.source == p.source);
  REQUIRE(q.created == p.created);
  REQUIRE(q.ra.model == p.ra.model);
  REQUIRE(q.ra.floor_um == p.ra.floor_um);  // shortest round-trip text: bit-exact
  REQUIRE(q.ra.cov_floor_scale_um == p.ra.cov_floor_scale_um);
  REQUIRE(q.ra.scale == 1.3);
  REQUIRE(q.ra.rows == 9);
  REQUIRE(q.ra.why.empty());
}

TEST_CASE("parse_shop_profile: bad files name the place and the key", "[io]") {
  auto message = [](const std::string& text) {
    try {
      parse_shop_profile(text, "s.toml");
    } catch (const InputError& e) {
      return std::string(e.what());
    }
    return std::string("no error");
  };
  REQUIRE(message("source = \"a\"\n") ==
          "s.toml:1:1: [ra] table is missing (write one with `cuspmap calibrate`)");
  REQUIRE(message("[ra]\nmodel = \"line\"\n") ==
          "s.toml:1:1: ra.model 'line': allowed values are floor+scale, floor");
  REQUIRE(message("[ra]\nmodle = 1\n") ==
          "s.toml:2:1: unknown key 'ra.modle'; allowed keys are model, floor_um, floor_sd_um, "
          "scale, scale_sd, cov_floor_scale_um, rows, rms_before_um, rms_after_um, why");
  REQUIRE(message("[ra]\nmodel = \"floor\"\nfloor_um = 0.1\nfloor_sd_um = 0.01\nscale = 0.0\n"
                  "scale_sd = 0\ncov_floor_scale_um = 0\nrows = 3\nrms_before_um = 1\n"
                  "rms_after_um = 1\n") == "s.toml:1:1: ra.scale 0: must be > 0");
}

}  // namespace cuspmap

// Tests of report/display_quantity: 3 significant figures, resolution floors, unit choice.
#include "core/display_quantity.h"

#include "test_support.h"

namespace cuspmap {

TEST_CASE("display_number: three significant figures, trailing zeros dropped", "[report]") {
  // The examples (issue 14): "Ra 0.966016 um", "path 348.125 mm", "cycle 7.39275 s".
  CHECK(display_number(0.966016, 1e-4) == "0.966");
  CHECK(display_number(348.125, 1e-7) == "348");
  CHECK(display_number(7.39275, 1e-3) == "7.39");
  CHECK(display_number(0.0641921, 1e-7) == "0.0642");
  CHECK(display_number(2.5, 0.0) == "2.5");
  CHECK(display_number(0.8, 0.0) == "0.8");
  CHECK(display_number(-3.50622, 1e-4) == "-3.51");
  // Whole numbers past 3 digits are not rounded further: 12345 stays readable as a count.
  CHECK(display_number(12345.4, 0.0) == "12345");
}

TEST_CASE("display_number: values below the resolution floor print 0", "[report]") {
  // issue 14: "Ra 2.10942e-15 um" on a plane-fitted flat floor.
  CHECK(display_number(2.10942e-15, 1e-4) == "0");
  CHECK(display_number(-3e-9, 1e-4) == "0");
  CHECK(display_roughness(2.10942e-15, LengthUnit::Millimetre) == "0 um");
}

TEST_CASE("display_roughness / stock / length: --units picks um, uin, thou, mm or in",
          "[report]") {
  // 1 um = 39.37 uin; 1 thou = 25.4 um; 1 in = 25.4 mm (exact, 1959).
  CHECK(display_roughness(0.8, LengthUnit::Millimetre) == "0.8 um");
  CHECK(display_roughness(0.8, LengthUnit::Inch) == "31.5 uin");
  CHECK(display_stock(25.4, LengthUnit::Inch) == "1 thou");
  CHECK(display_stock(25.7, LengthUnit::Millimetre) == "25.7 um");
  CHECK(display_length(579.533, LengthUnit::Millimetre) == "580 mm");
  CHECK(display_length(579.533, LengthUnit::Inch) == "22.8 in");
}

TEST_CASE("display_cutoff: ISO 4288 values with their ASME B46.1 inch values", "[report]") {
  // ASME B46.1 cut-offs 0.003, 0.010, 0.030, 0.100, 0.300 in beside ISO 4288's 0.08 ... 8 mm.
  CHECK(display_cutoff(0.8, LengthUnit::Millimetre) == "0.8 mm");
  CHECK(display_cutoff(0.8, LengthUnit::Inch) == "0.8 mm (0.03 in)");
  CHECK(display_cutoff(2.5, LengthUnit::Inch) == "2.5 mm (0.1 in)");
  CHECK(display_cutoff(0.08, LengthUnit::Inch) == "0.08 mm (0.003 in)");
  CHECK(display_cutoff(1.0, LengthUnit::Inch) == "1 mm (0.0394 in)");  // derived: 1 / 25.4
}

TEST_CASE("display_area / display_volume: mm or in, 3 figures", "[report]") {
  // issue 14: "0.00001 in^3" hid the value; 100 cm^2 = 15.5 in^2 (derived: 10000 / 25.4^2).
  CHECK(display_area(10000.0, LengthUnit::Millimetre) == "10000 mm^2");
  CHECK(display_area(10000.0, LengthUnit::Inch) == "15.5 in^2");
  CHECK(display_volume(0.2, LengthUnit::Inch) == "0.0000122 in^3");  // derived: 0.2 / 25.4^3
  CHECK(display_volume(882.87, LengthUnit::Millimetre) == "883 mm^3");
}

TEST_CASE("time_unit_for: one unit per column, chosen by its largest entry", "[report]") {
  // issue 14: a plan column mixed "2.34 h", "117.6 min", "113 s".
  const TimeUnit u = time_unit_for(std::vector<double>{113.0, 117.6 * 60.0, 2.34 * 3600.0});
  CHECK(u == TimeUnit::Hour);
  CHECK(display_time_number(113.0, u) == "0.0314");
  CHECK(display_time_number(117.6 * 60.0, u) == "1.96");
  CHECK(display_time(7.39275) == "7.39 s");
  CHECK(display_time(600.0) == "10 min");
  CHECK(time_unit_for(std::vector<double>{}) == TimeUnit::Second);
}

}  // namespace cuspmap

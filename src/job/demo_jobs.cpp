// Built-in demo jobs: an invented pump-cover floor (aluminium) finished four ways.
// Output: validated Jobs plus the TOML each came from. Numbers are invented for the demo only.
#include "job/demo_jobs.h"

#include <string>

namespace cuspmap {
namespace {

// Common [patch] block; quick mode halves the patch and doubles the cell.
std::string patch_block(bool quick, double size_mm, double cell_mm) {
  const double size = quick ? size_mm / 2 : size_mm;
  const double cell = quick ? cell_mm * 2 : cell_mm;
  return "[patch]\nsize = [" + format_number(size) + ", " + format_number(size) +
         "]\ncell = " + format_number(cell) + "\n";
}

DemoJob make(const std::string& file_name, const std::string& text) {
  DemoJob d{file_name, text, parse_job(text, file_name, ".")};
  return d;
}

}  // namespace

std::vector<DemoJob> demo_jobs(bool quick) {
  std::vector<DemoJob> jobs;
  jobs.push_back(make("ball_raster.toml", R"(# Pump cover floor, 6 mm ball, zigzag raster at 0.3 mm
name = "6 mm ball, raster 0.3 mm"
units = "mm"
)" + patch_block(quick, 6, 0.005) + R"(
[tool]
shape = "ball"
diameter = 6
teeth = 2

[cut]
rpm = 12000
feed = 1800

[path]
kind = "raster"
stepover = 0.3
direction = "zigzag"
)"));
  const std::string flat_tool = R"(
[tool]
shape = "flat"
diameter = 6
dish_deg = 1
teeth = 3
)";
  const std::string flat_cut = R"(
[cut]
rpm = 10000
feed = 1500
spindle = "cw"
)";
  jobs.push_back(make("flat_one_way.toml", R"(# Pump cover floor, 6 mm flat end mill with a 1 deg dish, one-way
name = "6 mm flat, 1 deg dish, one-way 0.5 mm"
units = "mm"
)" + patch_block(quick, 6, 0.005) + flat_tool + flat_cut + R"(
[path]
kind = "raster"
stepover = 0.5
direction = "one-way"

[sim]
tooth_marks = true
)"));
  std::string tram_tool = flat_tool;
  tram_tool += "tilt_deg = 0.01\ntilt_toward_deg = 90\n";
  jobs.push_back(make("flat_zigzag_tram.toml", R"(# The same flat end mill on a zigzag, spindle trammed 0.01 deg off square
name = "6 mm flat, zigzag 0.5 mm, 0.01 deg tram"
units = "mm"
)" + patch_block(quick, 6, 0.005) + tram_tool + flat_cut + R"(
[path]
kind = "raster"
stepover = 0.5
direction = "zigzag"

[sim]
tooth_marks = true
)"));
  jobs.push_back(make("trochoidal.toml", R"(# Pump cover floor cleared with trochoidal loops of a 6 mm ball
name = "6 mm ball, trochoidal loops"
units = "mm"
)" + patch_block(quick, 6, 0.005) + R"(
[tool]
shape = "ball"
diameter = 6
teeth = 2

[cut]
rpm = 12000
feed = 2400

[path]
kind = "trochoidal"
stepover = 3
loop_diameter = 3
advance = 0.4
)"));
  return jobs;
}

}  // namespace cuspmap

// One job per value of a varied parameter (stepover, angle, direction, tilt, dish), validated.
// Inputs: base Job, parameter name, value strings; output: Jobs (mm, deg).
#include "job/vary_job.h"

#include "core/input_error.h"
#include "job/validate_cutter.h"

namespace cuspmap {

std::vector<Job> vary_job(const Job& base, std::string_view parameter,
                          const std::vector<std::string>& values, LengthUnit unit) {
  const std::string flag = "--" + std::string(parameter);
  if (values.empty()) throw InputError(flag + " is empty: give one or more values, comma-separated");
  std::vector<Job> jobs;
  for (const std::string& value : values) {
    Job job = base;
    if (parameter == "stepover") {
      if (base.path.kind == PathKind::Gcode) {
        throw InputError(flag + ": a G-code job has no stepover to vary");
      }
      job.path.stepover_mm = parse_positive_length_mm(value, unit, flag);
    } else if (parameter == "angle") {
      job.path.angle_deg = parse_angle_deg(value, flag);
    } else if (parameter == "raster-direction") {
      if (value != "one-way" && value != "zigzag") {
        throw InputError(flag + " '" + value + "': allowed values are one-way, zigzag");
      }
      job.path.direction = value == "one-way" ? RasterDirection::OneWay : RasterDirection::Zigzag;
    } else if (parameter == "tilt") {
      job.cutter.tilt_deg = parse_angle_deg(value, flag);
      validate_cutter(job.cutter, NameStyle::Flag);
    } else if (parameter == "dish") {
      job.cutter.dish_deg = parse_angle_deg(value, flag);
      validate_cutter(job.cutter, NameStyle::Flag);
    } else {
      throw InputError(flag + ": not a parameter that can be varied");
    }
    job.name = std::string(parameter) + " " + value + " | " + base.name;
    jobs.push_back(std::move(job));
  }
  return jobs;
}

}  // namespace cuspmap

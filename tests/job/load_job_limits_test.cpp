// Hardening tests of the job loader: unreadable sources (folders, devices), values that overflow
// after unit conversion, coordinates beyond the patch limit and degenerate path geometry, each
// refused with one located line.
#include <fstream>

#include "core/input_error.h"
#include "job/job.h"
#include "job/validate_cutter.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

// A valid raster job; each test swaps one line (the shape mirrors tests/job/load_job_test.cpp).
std::string job_text(const std::string& patch_extra, const std::string& path_extra,
                     const std::string& units = "mm", const std::string& stepover = "0.3") {
  return "units = \"" + units + "\"\n[patch]\nsize = [12, 8]\ncell = 0.01\n" + patch_extra +
         "[tool]\nshape = \"ball\"\ndiameter = 6\n[cut]\nrpm = 12000\nfeed = 1500\n"
         "[path]\nkind = \"raster\"\nstepover = " + stepover + "\n" + path_extra;
}

std::string error_of(const std::string& text) {
  try {
    parse_job(text, "job.toml", ".");
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

std::string load_error(const std::string& path) {
  try {
    load_job(path);
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

}  // namespace

TEST_CASE("load_job: a folder is named as a folder", "[job]") {
  test::TempDir dir;
  CHECK(load_error(dir.path()) == dir.path() + ": is a folder; expected a job file (.toml)");
}

TEST_CASE("load_job: an endless device is cut off at 1 MiB, not read forever", "[job]") {
  CHECK(load_error("/dev/zero") == "/dev/zero: job file larger than 1 MiB");
}

TEST_CASE("load_job: a file just over 1 MiB is refused", "[job]") {
  test::TempDir dir;
  const std::string path = dir.file("big.toml");
  test::write_text(path, std::string((1 << 20) + 1, '#'));
  CHECK(load_error(path) == path + ": job file larger than 1 MiB");
}

TEST_CASE("parse_job: an inch length that overflows once converted is out of range", "[job]") {
  CHECK(error_of(job_text("", "", "in", "1e308")) == "job.toml:13:12: path.stepover 1e+308: out of range");
}

TEST_CASE("parse_job: any length beyond 1e6 mm is refused where it is written", "[job]") {
  CHECK(error_of(job_text("origin = [2e6, 0]\n", "")) ==
        "job.toml:5:11: patch.origin 2e+06 mm: must be within +-1e+06 mm");
  CHECK(error_of(job_text("floor_z = -3e6\n", "")) ==
        "job.toml:5:11: patch.floor_z -3e+06 mm: must be within +-1e+06 mm");
  // issue 8 fuzz finding (tests/fuzz/regressions/fuzz_path): a 1e308 mm ball built rasters of
  // infinite length.
  std::string text = job_text("", "");
  text.replace(text.find("diameter = 6"), 12, "diameter = 1e308");
  CHECK(error_of(text) == "job.toml:7:12: tool.diameter 1e+308 mm: must be within +-1e+06 mm");
}

TEST_CASE("validate_patch: origin beyond 1e6 mm from flags is refused", "[job]") {
  Patch patch;
  patch.origin_x_mm = 2e6;
  try {
    validate_patch(patch, NameStyle::Flag);
    FAIL("no error");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()) == "--origin[0] 2e+06 mm: must be within +-1e+06 mm");
  }
}

TEST_CASE("parse_job: stepover at or past the tool diameter leaves strips uncut", "[job]") {
  CHECK(error_of(job_text("", "", "mm", "6")) ==
        "job.toml:13:12: path.stepover 6 mm: must be smaller than the cut width 6 mm so that "
        "neighbouring passes overlap");
}

TEST_CASE("parse_job: stepover finer than a cell cannot be resolved", "[job]") {
  CHECK(error_of(job_text("", "", "mm", "0.001")) ==
        "job.toml:13:12: path.stepover 0.001 mm: must be at least patch.cell 0.01 mm; the grid "
        "cannot resolve finer passes");
}

TEST_CASE("parse_job: an offset boundary on one line encloses no area", "[job]") {
  std::string text = job_text("", "boundary = [[0, 0], [5, 5], [10, 10]]\n");
  text.replace(text.find("\"raster\""), 8, "\"offset\"");
  CHECK(error_of(text) ==
        "job.toml:14:12: path.boundary encloses no area: needs at least 3 points that are not on "
        "one line");
}

TEST_CASE("parse_job: trochoidal advance finer than a cell is refused", "[job]") {
  std::string text = job_text("", "advance = 0.000001\n", "mm", "3");
  text.replace(text.find("\"raster\""), 8, "\"trochoidal\"");
  CHECK(error_of(text) ==
        "job.toml:14:11: path.advance 1e-06 mm: must be 0 (automatic) or at least patch.cell "
        "0.01 mm");
}

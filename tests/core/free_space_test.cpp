// Free-space check of a large output: refused with one line naming the size needed and the space
// free when file + margin exceed it; the free-space query itself reads the nearest existing folder.
// Method: statvfs(3) f_bavail x f_frsize; the margin rule is core/free_space.h's (common
// practice, no source).
#include "core/free_space.h"

#include <sys/statvfs.h>

#include "core/input_error.h"
#include "test_support.h"

using namespace cuspmap;

TEST_CASE("require_free_space: refuses a file whose size plus margin exceeds the free space",
          "[core]") {
  // 1.6 GB .npy (100 x 100 mm at 5 um: 4e8 cells x 4 bytes + 128 header bytes).
  const std::int64_t file = 1600000128;
  const std::int64_t margin = free_space_margin_bytes(file);
  CHECK(margin == (std::int64_t{64} << 20) + file / 100);
  CHECK_NOTHROW(require_free_space("--npy: height.npy", file, file + margin, "/data/out"));
  try {
    require_free_space("--npy: height.npy", file, file + margin - 1, "/data/out");
    FAIL("expected InputError");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()) ==
          "--npy: height.npy needs 1.68 GB (1600000128 bytes + a 83.1 MB margin) but /data/out "
          "has 1.68 GB free; free some space, use a larger cell, or leave the file out");
  }
  try {
    require_free_space("--npy: height.npy", file, 500000000, "out");
    FAIL("expected InputError");
  } catch (const InputError& e) {
    CHECK(std::string(e.what()) ==
          "--npy: height.npy needs 1.68 GB (1600000128 bytes + a 83.1 MB margin) but out has "
          "500 MB free; free some space, use a larger cell, or leave the file out");
  }
  // Unknown free space (-1) never refuses: the write itself will report a full disk.
  CHECK_NOTHROW(require_free_space("--npy: height.npy", file, -1, "out"));
}

// Other processes on this shared machine may write between two queries: 1 GiB of slack
// (common practice, no source) still tells a parent's file system from a wrong or zero answer.
constexpr double kConcurrentWritesBytes = 1073741824.0;

TEST_CASE("free_space_bytes: a folder not made yet is measured on its nearest parent",
          "[core]") {
  test::TempDir dir;
  struct statvfs st {};
  REQUIRE(statvfs(dir.path().c_str(), &st) == 0);
  const std::int64_t direct = free_space_bytes(dir.path());
  REQUIRE(direct > 0);
  const std::int64_t nested = free_space_bytes(dir.file("out/run1"));
  REQUIRE_NEAR(static_cast<double>(nested), static_cast<double>(direct), kConcurrentWritesBytes);
  REQUIRE_NEAR(static_cast<double>(direct),
               static_cast<double>(st.f_bavail) * static_cast<double>(st.f_frsize),
               kConcurrentWritesBytes);
}

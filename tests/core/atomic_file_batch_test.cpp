// Batched atomic files: nothing appears before commit(), everything (exact bytes) after, and an
// abandoned batch leaves neither targets nor temp files.
// Sources: the all-or-nothing contract of core/atomic_file_batch.h (derived from POSIX
// rename(2) atomicity, POSIX.1-2017).
#include "core/atomic_file_batch.h"

#include <stdexcept>
#include <string>
#include <string_view>
#include <vector>

#include "test_support.h"

TEST_CASE("AtomicFileBatch: files appear only at commit, with their bytes", "[core]") {
  cuspmap::test::TempDir dir;
  cuspmap::test::write_text(dir.file("height.png"), "old picture");
  cuspmap::AtomicFileBatch batch;
  batch.add(dir.file("height.png"), "new picture");
  const std::string binary("\x93NUMPY\0\xff", 8);
  batch.add(dir.file("height.npy"), binary);
  batch.add(dir.file("report.json"), "");
  REQUIRE(batch.size() == 3);
  // Before commit: the old file is untouched and the new ones exist only under temp names.
  REQUIRE(cuspmap::test::read_text(dir.file("height.png")) == "old picture");
  std::vector<std::string> before = dir.list();
  REQUIRE(before.size() == 4);  // height.png + three temps
  batch.commit();
  REQUIRE(dir.list() == std::vector<std::string>{"height.npy", "height.png", "report.json"});
  REQUIRE(cuspmap::test::read_text(dir.file("height.png")) == "new picture");
  REQUIRE(cuspmap::test::read_text(dir.file("height.npy")) == binary);
  REQUIRE(cuspmap::test::read_text(dir.file("report.json")).empty());
}

TEST_CASE("AtomicFileBatch: a file given in parts is written in order", "[core]") {
  cuspmap::test::TempDir dir;
  cuspmap::AtomicFileBatch batch;
  const std::vector<std::string_view> parts{"header|", "", "values"};
  batch.add(dir.file("height.npy"), parts);
  batch.commit();
  REQUIRE(cuspmap::test::read_text(dir.file("height.npy")) == "header|values");
}

TEST_CASE("AtomicFileBatch: an abandoned batch leaves nothing", "[core]") {
  cuspmap::test::TempDir dir;
  {
    cuspmap::AtomicFileBatch batch;
    batch.add(dir.file("a.png"), "a");
    batch.add(dir.file("b.png"), "b");
    REQUIRE(dir.list().size() == 2);  // the temps
  }
  REQUIRE(dir.list().empty());
}

TEST_CASE("AtomicFileBatch: a file that cannot be opened throws, the others are removed",
          "[core]") {
  cuspmap::test::TempDir dir;
  const std::string bad = dir.file("no-such-folder/out.png");
  {
    cuspmap::AtomicFileBatch batch;
    batch.add(dir.file("a.png"), "a");
    try {
      batch.add(bad, "x");
      FAIL("expected std::runtime_error");
    } catch (const std::runtime_error& e) {
      REQUIRE(std::string(e.what()) == "cannot write " + bad + ": open: No such file or directory");
    }
  }
  REQUIRE(dir.list().empty());
}

// Atomic whole-file writes: new file, replacement, no temp left behind, failure leaves nothing.
#include "core/write_file_atomic.h"

#include <stdexcept>
#include <string>

#include "test_support.h"

TEST_CASE("write_file_atomic: writes, replaces, leaves no temp file", "[core]") {
  cuspmap::test::TempDir dir;
  const std::string path = dir.file("report.json");
  cuspmap::write_file_atomic(path, "first");
  REQUIRE(cuspmap::test::read_text(path) == "first");
  const std::string binary("a\0b\xff", 4);
  cuspmap::write_file_atomic(path, binary);
  REQUIRE(cuspmap::test::read_text(path) == binary);
  cuspmap::write_file_atomic(dir.file("empty.npy"), "");
  REQUIRE(cuspmap::test::read_text(dir.file("empty.npy")).empty());
  REQUIRE(dir.list() == std::vector<std::string>{"empty.npy", "report.json"});
}

TEST_CASE("write_file_atomic: a missing folder throws and leaves nothing", "[core]") {
  cuspmap::test::TempDir dir;
  const std::string path = dir.file("no-such-folder/out.png");
  try {
    cuspmap::write_file_atomic(path, "x");
    FAIL("expected std::runtime_error");
  } catch (const std::runtime_error& e) {
    REQUIRE(std::string(e.what()) == "cannot write " + path + ": open: No such file or directory");
  }
  REQUIRE(dir.list().empty());
}

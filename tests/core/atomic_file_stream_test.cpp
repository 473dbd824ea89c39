// Streamed atomic writes: the target appears whole only on commit; destruction without commit,
// an exception, or SIGINT/SIGTERM mid-write leave neither the target nor a temp file.
// Method: POSIX rename(2) atomicity; signal cleanup through the temp-name registry.
#include "core/atomic_file_stream.h"

#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <filesystem>
#include <stdexcept>
#include <string>

#include "core/write_file_atomic.h"
#include "test_support.h"

using cuspmap::AtomicFileStream;
using cuspmap::test::read_text;
using cuspmap::test::TempDir;

namespace {

bool has_temp(const TempDir& dir) {
  for (const std::string& n : dir.list()) {
    if (n.find(".tmp-") != std::string::npos) return true;
  }
  return false;
}

}  // namespace

TEST_CASE("AtomicFileStream: appends pieces and publishes them whole on commit", "[core]") {
  TempDir dir;
  const std::string path = dir.file("height.npy");
  AtomicFileStream file(path);
  file.append("head");
  file.append("");
  file.append(std::string("\0\xff", 2));
  // Before commit only the temp name exists beside the target.
  REQUIRE(dir.list().size() == 1);
  CHECK(dir.list()[0].rfind("height.npy.tmp-" + std::to_string(getpid()) + "-", 0) == 0);
  CHECK(file.bytes_written() == 6);
  file.commit();
  CHECK(read_text(path) == std::string("head\0\xff", 6));
  CHECK(dir.list() == std::vector<std::string>{"height.npy"});
}

TEST_CASE("AtomicFileStream: replaces an existing file only on commit", "[core]") {
  TempDir dir;
  const std::string path = dir.file("a.txt");
  cuspmap::write_file_atomic(path, "old");
  {
    AtomicFileStream file(path);
    file.append("new contents");
    CHECK(read_text(path) == "old");
    file.commit();
  }
  CHECK(read_text(path) == "new contents");
  CHECK(dir.list() == std::vector<std::string>{"a.txt"});
}

TEST_CASE("AtomicFileStream: destroyed without commit leaves no file and no temp", "[core]") {
  TempDir dir;
  {
    AtomicFileStream file(dir.file("height.npy"));
    file.append(std::string(1 << 20, 'x'));
  }
  CHECK(dir.list().empty());
  // An exception thrown between appends unwinds the stream the same way.
  try {
    AtomicFileStream file(dir.file("height.npy"));
    file.append("partial");
    throw std::runtime_error("sweep failed");
  } catch (const std::runtime_error& e) {
    CHECK(std::string(e.what()) == "sweep failed");
  }
  CHECK(dir.list().empty());
}

TEST_CASE("AtomicFileStream: open and rename failures name the file and leave nothing",
          "[core]") {
  TempDir dir;
  const std::string missing = dir.file("no-such-folder/height.npy");
  try {
    AtomicFileStream file(missing);
    FAIL("expected std::runtime_error");
  } catch (const std::runtime_error& e) {
    CHECK(std::string(e.what()) ==
          "cannot write " + missing + ": open: No such file or directory");
  }
  std::filesystem::create_directories(dir.file("height.npy"));  // a folder where the file goes
  AtomicFileStream file(dir.file("height.npy"));
  file.append("data");
  CHECK_THROWS_AS(file.commit(), std::runtime_error);
  CHECK(dir.list() == std::vector<std::string>{"height.npy"});
  CHECK(std::filesystem::is_directory(dir.file("height.npy")));
}

TEST_CASE("AtomicFileStream: SIGINT or SIGTERM mid-write removes the temp file", "[core]") {
  for (const int sig : {SIGINT, SIGTERM}) {
    CAPTURE(sig);
    TempDir dir;
    const pid_t pid = fork();
    REQUIRE(pid >= 0);
    if (pid == 0) {
      // Child: a stream half written when the signal arrives (as main installs the handlers).
      cuspmap::install_temp_cleanup_handlers();
      AtomicFileStream file(dir.file("height.npy"));
      file.append(std::string(4096, 'x'));
      if (!has_temp(dir)) _exit(3);  // no temp before the signal: the test would prove nothing
      raise(sig);
      _exit(4);  // not reached: the handler re-raises with the default action
    }
    int status = 0;
    REQUIRE(waitpid(pid, &status, 0) == pid);
    INFO("child status " << status);
    REQUIRE(WIFSIGNALED(status));
    CHECK(WTERMSIG(status) == sig);
    CHECK(dir.list().empty());
  }
}

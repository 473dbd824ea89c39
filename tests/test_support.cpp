// Test helpers: process spawning with captured output (posix_spawn), temp folders, file I/O.
#include "test_support.h"

#include <fcntl.h>
#include <spawn.h>
#include <sys/wait.h>
#include <unistd.h>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <stdexcept>

extern char** environ;

namespace cuspmap::test {
namespace {

std::string slurp_fd(int fd) {
  std::string s;
  char buf[65536];
  for (;;) {
    const ssize_t n = read(fd, buf, sizeof buf);
    if (n <= 0) break;
    s.append(buf, static_cast<size_t>(n));
  }
  return s;
}

}  // namespace

RunResult run_cuspmap(const std::vector<std::string>& args) {
  // stdout and stderr go to temp files so that large outputs cannot dead-lock a pipe.
  TempDir dir;
  const std::string out_path = dir.file("stdout"), err_path = dir.file("stderr");
  std::vector<std::string> argv_s{CUSPMAP_BIN};
  argv_s.insert(argv_s.end(), args.begin(), args.end());
  std::vector<char*> argv;
  for (std::string& a : argv_s) argv.push_back(a.data());
  argv.push_back(nullptr);
  posix_spawn_file_actions_t actions;
  posix_spawn_file_actions_init(&actions);
  posix_spawn_file_actions_addopen(&actions, 0, "/dev/null", O_RDONLY, 0);
  posix_spawn_file_actions_addopen(&actions, 1, out_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
  posix_spawn_file_actions_addopen(&actions, 2, err_path.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
  pid_t pid = 0;
  const int rc = posix_spawn(&pid, argv[0], &actions, nullptr, argv.data(), environ);
  posix_spawn_file_actions_destroy(&actions);
  if (rc != 0) throw std::runtime_error("cannot start " + argv_s[0]);
  int status = 0;
  waitpid(pid, &status, 0);
  RunResult result;
  result.exit_code = WIFEXITED(status) ? WEXITSTATUS(status) : 128 + WTERMSIG(status);
  result.out = read_text(out_path);
  result.err = read_text(err_path);
  return result;
}

void require_input_error(const std::vector<std::string>& args, const std::string& line) {
  const RunResult r = run_cuspmap(args);
  CAPTURE(args, r.out);
  REQUIRE(r.exit_code == 2);
  REQUIRE(r.err == "cuspmap: error: " + line + "\n");
  REQUIRE(r.out.empty());
}

TempDir::TempDir() {
  std::string templ = (std::filesystem::temp_directory_path() / "cuspmap-test-XXXXXX").string();
  if (mkdtemp(templ.data()) == nullptr) throw std::runtime_error("mkdtemp failed");
  path_ = templ;
}

TempDir::~TempDir() {
  std::error_code ec;
  std::filesystem::remove_all(path_, ec);
}

std::vector<std::string> TempDir::list() const {
  std::vector<std::string> names;
  for (const auto& entry : std::filesystem::directory_iterator(path_)) {
    names.push_back(entry.path().filename().string());
  }
  std::sort(names.begin(), names.end());
  return names;
}

void write_text(const std::string& path, const std::string& text) {
  std::ofstream f(path, std::ios::binary);
  f << text;
  if (!f) throw std::runtime_error("cannot write fixture " + path);
}

std::string read_text(const std::string& path) {
  const int fd = open(path.c_str(), O_RDONLY);
  if (fd < 0) throw std::runtime_error("cannot read " + path);
  std::string s = slurp_fd(fd);
  close(fd);
  return s;
}

std::string data_path(const std::string& name) { return std::string(CUSPMAP_TEST_DATA) + "/" + name; }
std::string source_path(const std::string& name) {
  return std::string(CUSPMAP_SOURCE_DIR) + "/" + name;
}

}  // namespace cuspmap::test

// simulate on a streamed floor: the same files as in memory (height.npy only with --npy, then
// byte for byte the in-memory one), no temp names left, and --npy refused before any work when
// the --out disk cannot hold the file. Method: DESIGN.md "simulate" outputs; POSIX statvfs.
#include <sys/statvfs.h>

#include <algorithm>
#include <filesystem>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "test_support.h"

using cuspmap::test::read_text;
using cuspmap::test::run_cuspmap;
using cuspmap::test::TempDir;

namespace {

// The pump cover example (10 x 10 mm at 10 um: 1e6 cells) runs in memory by default; --stream
// with a 4 MiB limit sweeps it in 1 MiB bands.
const std::string kJob = "examples/pump_cover_ball.toml";

std::vector<std::string> simulate(const TempDir& dir, const std::string& out,
                                  std::vector<std::string> extra) {
  std::vector<std::string> args{"simulate", cuspmap::test::source_path(kJob), "--out",
                                dir.file(out), "--json"};
  args.insert(args.end(), extra.begin(), extra.end());
  const auto run = run_cuspmap(args);
  INFO(run.err);
  REQUIRE(run.exit_code == 0);
  const auto report = nlohmann::json::parse(run.out);
  return report["files"].get<std::vector<std::string>>();
}

// Sorted names in a folder (none when it does not exist).
std::vector<std::string> names_in(const std::string& folder) {
  std::vector<std::string> names;
  if (!std::filesystem::exists(folder)) return names;
  for (const auto& e : std::filesystem::directory_iterator(folder)) {
    names.push_back(e.path().filename().string());
  }
  std::sort(names.begin(), names.end());
  return names;
}

}  // namespace

TEST_CASE("simulate --stream: writes profile.png; height.npy only with --npy, equal to memory's",
          "[cli]") {
  TempDir dir;
  const auto mem_files = simulate(dir, "mem", {});
  const auto streamed_files = simulate(dir, "streamed", {"--stream", "--max-memory", "4MiB"});
  const auto npy_files =
      simulate(dir, "npy", {"--stream", "--max-memory", "4MiB", "--npy"});
  // In memory the native cells give a detail view; a streamed floor keeps none (issue 14).
  CHECK(mem_files == std::vector<std::string>{"height.npy", "height.png", "shaded.png",
                                              "detail.png", "detail_shaded.png", "profile.png",
                                              "moves.csv", "path.svg", "report.json"});
  CHECK(streamed_files == std::vector<std::string>{"height.png", "shaded.png", "profile.png",
                                                   "moves.csv", "path.svg", "report.json"});
  CHECK(npy_files == std::vector<std::string>{"height.npy", "height.png", "shaded.png",
                                              "profile.png", "moves.csv", "path.svg",
                                              "report.json"});
  // The folders hold exactly the files listed: no temp name left behind.
  for (const auto& [out, files] : {std::pair{"mem", mem_files}, std::pair{"npy", npy_files}}) {
    CAPTURE(out);
    std::vector<std::string> sorted = files;
    std::sort(sorted.begin(), sorted.end());
    CHECK(names_in(dir.file(out)) == sorted);
  }
  const std::string npy = read_text(dir.file("npy/height.npy"));
  CHECK(npy.size() == 128 + 4u * 1000 * 1000);  // 1000 x 1000 cells of float32
  CHECK(npy == read_text(dir.file("mem/height.npy")));
  CHECK(read_text(dir.file("streamed/profile.png")) == read_text(dir.file("mem/profile.png")));
}

TEST_CASE("simulate --npy: refused in one line when the --out disk cannot hold the file",
          "[cli]") {
  TempDir dir;
  // 190 x 190 mm at 1 um: 1.9e5 x 1.9e5 = 3.61e10 cells (under the 4e10 streaming cap), a
  // 144 GB .npy. The check runs before the sweep, so a refusal is immediate.
  std::string job = read_text(cuspmap::test::source_path(kJob));
  job.replace(job.find("size = [10, 10]"), 15, "size = [190, 190]");
  job.replace(job.find("cell = 0.01 "), 12, "cell = 0.001 ");
  cuspmap::test::write_text(dir.file("big.toml"), job);
  const std::int64_t npy_bytes = 128 + std::int64_t{4} * 190000 * 190000;
  const std::int64_t margin = (std::int64_t{64} << 20) + npy_bytes / 100;  // core/free_space.h
  struct statvfs st {};
  REQUIRE(statvfs(dir.path().c_str(), &st) == 0);
  const std::int64_t free_bytes =
      static_cast<std::int64_t>(st.f_bavail) * static_cast<std::int64_t>(st.f_frsize);
  if (free_bytes > npy_bytes + margin) {
    WARN("skipped: " << dir.path() << " has room for a 144 GB file; the refusal needs less");
    SUCCEED("skipped");
    return;
  }
  const std::string out = dir.file("out");
  const auto run = run_cuspmap({"simulate", dir.file("big.toml"), "--out", out, "--npy"});
  CHECK(run.exit_code == 2);
  const std::string head = "cuspmap: error: --npy: height.npy needs 146 GB (144400000128 bytes + "
                           "a 1.51 GB margin) but " + out + " has ";
  const std::string tail = " free; free some space, use a larger cell, or leave the file out\n";
  CHECK(run.err.rfind(head, 0) == 0);
  REQUIRE(run.err.size() > head.size() + tail.size());
  CHECK(run.err.compare(run.err.size() - tail.size(), tail.size(), tail) == 0);
  CHECK(std::count(run.err.begin(), run.err.end(), '\n') == 1);
  CHECK(names_in(out).empty());  // nothing written
}

TEST_CASE("simulate --stream --npy: a run that fails mid-sweep leaves no height.npy or temp",
          "[cli]") {
  TempDir dir;
  // The passes run 50 mm above the floor: no move reaches it, which is known only after pass 1
  // has streamed every band into the temp height.npy.
  std::string job = read_text(cuspmap::test::source_path(kJob));
  job.replace(job.find("depth = 0"), 9, "depth = 50");
  cuspmap::test::write_text(dir.file("job.toml"), job);
  const std::string out = dir.file("out");
  const auto run = run_cuspmap({"simulate", dir.file("job.toml"), "--out", out, "--stream",
                                "--npy", "--max-memory", "4MiB"});
  INFO(run.err);
  CHECK(run.exit_code == 2);
  CHECK(run.err.find("no move of the path reaches the patch") != std::string::npos);
  CHECK(names_in(out).empty());
}

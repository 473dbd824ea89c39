// Table test of bad inputs across every command (cases in tests/data/bad_inputs.toml): each must
// exit 2 with exactly one stderr line naming the value, print nothing on stdout, and leave every
// file around it untouched (its fixtures and a pre-existing output folder with a foreign file).
// Cases whose command is not built yet ("'X' is not built yet") are counted as pending; cases
// marked `open` (a defect reported to another part's owner) warn instead of failing.
#include <toml++/toml.h>

#include <filesystem>
#include <map>
#include <regex>
#include <set>
#include <sstream>

#include "test_support.h"

namespace fs = std::filesystem;
using cuspmap::test::run_cuspmap;
using cuspmap::test::TempDir;

namespace {

// The foreign file placed in every case's output folder: cuspmap must never touch it.
constexpr const char* kForeignName = "notes_from_someone_else.txt";
constexpr const char* kForeignText = "not written by cuspmap\n";

// Whether main's binary implements a command: unbuilt ones refuse every call the same way.
bool command_built(const std::string& name) {
  static std::map<std::string, bool> cache;
  const auto it = cache.find(name);
  if (it != cache.end()) return it->second;
  const auto run = run_cuspmap({name});
  const bool built = run.err.find("is not built yet") == std::string::npos;
  cache[name] = built;
  return built;
}

std::string replace_all(std::string s, const std::string& from, const std::string& to) {
  for (size_t at = s.find(from); at != std::string::npos; at = s.find(from, at + to.size())) {
    s.replace(at, from.size(), to);
  }
  return s;
}

std::string regex_escape(const std::string& s) {
  static const std::regex special(R"([.^$|()\[\]{}*+?\\])");
  return std::regex_replace(s, special, R"(\$&)");
}

// Placeholders in args and expected lines: {tmp} the case's folder, {out} its output folder,
// {examples} the source tree's examples/.
struct Places {
  std::string tmp, out, examples;
  std::string expand(const std::string& s, bool for_regex) const {
    const auto v = [&](const std::string& x) { return for_regex ? regex_escape(x) : x; };
    std::string r = replace_all(s, "{tmp}", v(tmp));
    r = replace_all(r, "{out}", v(out));
    return replace_all(r, "{examples}", v(examples));
  }
};

// Every file and folder under `root` with its contents ("" for folders), for before/after checks.
std::map<std::string, std::string> snapshot(const std::string& root) {
  std::map<std::string, std::string> files;
  for (const auto& e : fs::recursive_directory_iterator(root)) {
    const std::string rel = fs::relative(e.path(), root).string();
    files[rel] = e.is_regular_file() ? cuspmap::test::read_text(e.path().string()) : "<dir>";
  }
  return files;
}

std::string hex_bytes(const std::string& hex) {
  std::string out;
  std::istringstream in(hex);
  std::string byte;
  while (in >> byte) out.push_back(static_cast<char>(std::stoi(byte, nullptr, 16)));
  return out;
}

// Builds one fixture file: literal text (repeated), hex bytes, or a named base job with edits,
// each edit [old, new] required to match exactly once so the table cannot rot silently.
std::string fixture_bytes(const toml::table& file, const toml::table& bases, std::string& problem) {
  std::string bytes;
  if (const auto base = file["base"].value<std::string>()) {
    const auto text = bases[*base].value<std::string>();
    if (!text) {
      problem = "unknown base '" + *base + "'";
      return "";
    }
    bytes = *text;
    if (const toml::array* edits = file["edit"].as_array()) {
      for (const toml::node& e : *edits) {
        const toml::array* pair = e.as_array();
        const auto from = pair ? (*pair)[0].value<std::string>() : std::nullopt;
        const auto to = pair ? (*pair)[1].value<std::string>() : std::nullopt;
        if (!from || !to) {
          problem = "edit must be [old, new]";
          return "";
        }
        const size_t at = bytes.find(*from);
        if (at == std::string::npos || bytes.find(*from, at + 1) != std::string::npos) {
          problem = "edit '" + *from + "' does not match exactly once";
          return "";
        }
        bytes.replace(at, from->size(), *to);
      }
    }
  } else if (const auto hex = file["hex"].value<std::string>()) {
    bytes = hex_bytes(*hex);
  } else {
    const std::string piece = file["text"].value_or(std::string());
    const int64_t repeat = file["repeat"].value_or(int64_t{1});
    bytes.reserve(piece.size() * static_cast<size_t>(repeat));
    for (int64_t k = 0; k < repeat; ++k) bytes += piece;
    bytes += file["tail"].value_or(std::string());
  }
  return bytes;
}

const toml::table& table_file() {
  static const toml::table table = toml::parse_file(cuspmap::test::data_path("bad_inputs.toml"));
  return table;
}

}  // namespace

TEST_CASE("bad inputs: table covers every command with at least 40 cases", "[cli]") {
  const toml::array* cases = table_file()["case"].as_array();
  REQUIRE(cases != nullptr);
  CHECK(cases->size() >= 40);
  std::set<std::string> commands;
  std::set<std::string> names;
  for (const toml::node& c : *cases) {
    const toml::table& t = *c.as_table();
    const auto name = t["name"].value<std::string>();
    REQUIRE(name);
    CAPTURE(*name);
    CHECK(names.insert(*name).second);  // names are unique
    const toml::array* args = t["args"].as_array();
    REQUIRE(args != nullptr);
    REQUIRE(!args->empty());
    commands.insert((*args)[0].value_or(std::string()));
    // Exactly one expectation per case; verbatim is preferred, a regex only where the wording
    // is not ours to fix (messages from other libraries, machine-dependent numbers).
    CHECK(t.contains("stderr") != t.contains("stderr_regex"));
  }
  for (const char* command : {"stepover", "simulate", "compare", "texture", "allowance", "plan",
                              "demo"}) {
    CAPTURE(command);
    CHECK(commands.count(command) == 1);
  }
}

TEST_CASE("bad inputs: exit 2, one stderr line naming the value, nothing written", "[cli]") {
  const toml::table& root = table_file();
  const toml::table empty;
  const toml::table& bases = root["base"].as_table() ? *root["base"].as_table() : empty;
  int ran = 0;
  int open_cases = 0;
  std::map<std::string, int> pending;
  for (const toml::node& c : *root["case"].as_array()) {
    const toml::table& t = *c.as_table();
    const std::string name = t["name"].value_or(std::string());
    INFO("case: " << name);
    const std::string command = (*t["args"].as_array())[0].value_or(std::string());
    if (!command_built(command)) {
      ++pending[command];
      continue;
    }
    TempDir dir;
    const Places places{dir.path(), dir.file("out"), cuspmap::test::source_path("examples")};
    fs::create_directories(places.out);
    cuspmap::test::write_text(places.out + "/" + kForeignName, kForeignText);
    if (const toml::array* files = t["files"].as_array()) {
      for (const toml::node& f : *files) {
        const toml::table& file = *f.as_table();
        std::string problem;
        const std::string bytes = fixture_bytes(file, bases, problem);
        INFO("fixture problem: " << problem);
        REQUIRE(problem.empty());
        const fs::path path = fs::path(dir.path()) / file["name"].value_or(std::string("x"));
        fs::create_directories(path.parent_path());
        cuspmap::test::write_text(path.string(), bytes);
      }
    }
    std::vector<std::string> args;
    for (const toml::node& a : *t["args"].as_array()) {
      args.push_back(places.expand(a.value_or(std::string()), false));
    }
    const auto before = snapshot(dir.path());
    const auto run = run_cuspmap(args);
    ++ran;
    const std::string line = run.err.substr(0, run.err.find('\n'));
    bool line_ok = false;
    if (const auto verbatim = t["stderr"].value<std::string>()) {
      line_ok = line == places.expand(*verbatim, false);
    } else {
      const std::string pattern = places.expand(t["stderr_regex"].value_or(std::string()), true);
      line_ok = std::regex_match(line, std::regex(pattern));
    }
    // Exit 2, nothing on stdout, exactly one stderr line (ending in the only newline), the
    // expected text, and every file as it was.
    const bool one_line = !run.err.empty() && run.err.find('\n') == run.err.size() - 1;
    const bool unchanged = snapshot(dir.path()) == before;
    const bool ok = run.exit_code == 2 && run.out.empty() && one_line && line_ok && unchanged;
    // An `open` case is a reported defect in someone else's code: it must not pass silently
    // (a warning either way), and must not fail the suite until its fix lands.
    if (const auto open = t["open"].value<std::string>()) {
      ++open_cases;
      if (ok) {
        WARN("open bad-input case now passes; drop its `open` field: " << name);
      } else {
        WARN("open bad-input case still fails (" << *open << "): " << name << "; exit "
                                                 << run.exit_code << ", stderr: " << run.err);
      }
      continue;
    }
    INFO("exit " << run.exit_code << ", stderr: " << run.err << "stdout: " << run.out);
    CHECK(run.exit_code == 2);
    CHECK(run.out.empty());
    CHECK(one_line);
    CHECK(line_ok);
    CHECK(unchanged);
  }
  std::string waiting;
  for (const auto& [command, n] : pending) {
    waiting += " " + command + " (" + std::to_string(n) + ")";
  }
  if (!waiting.empty()) WARN("bad-input cases pending until their command is built:" << waiting);
  INFO("cases run: " << ran << ", of which open: " << open_cases);
  SUCCEED();
}

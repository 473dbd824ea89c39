// One JSON key style across every command (issue 14): ISO symbols keep their case with a unit
// suffix (Ra_um, Sz_um, RSm_mm), everything else is lower snake_case, and the quantity "cusp"
// is never called scallop. Walks every key of each command's --json output.
#include <nlohmann/json.hpp>
#include <set>
#include <string>
#include <vector>

#include "test_support.h"

namespace cuspmap {
namespace {

// ISO 4287 / 25178-2 symbols as the standards spell them (primary P, waviness W, roughness R).
const std::set<std::string>& iso_symbols() {
  static const std::set<std::string> symbols = [] {
    std::set<std::string> s;
    for (const char* p : {"P", "W", "R"}) {
      for (const char* q : {"a", "q", "z", "p", "v", "t", "sk", "ku", "Sm", "c"}) s.insert(std::string(p) + q);
    }
    for (const char* q : {"Sa", "Sq", "Sz", "Sp", "Sv", "Ssk", "Sku", "Sdr", "Str", "Sal", "Std"}) s.insert(q);
    return s;
  }();
  return symbols;
}

std::string lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

// Every problem with the keys under `value` ("where: key: why").
void check_keys(const nlohmann::json& value, const std::string& where,
                const std::set<std::string>& exceptions, std::vector<std::string>& problems) {
  if (value.is_array()) {
    for (size_t k = 0; k < value.size(); ++k) {
      check_keys(value[k], where + "[" + std::to_string(k) + "]", exceptions, problems);
    }
    return;
  }
  if (!value.is_object()) return;
  for (const auto& [key, item] : value.items()) {
    check_keys(item, where + "." + key, exceptions, problems);
    if (exceptions.count(key)) continue;
    if (key.find("scallop") != std::string::npos) {
      problems.push_back(where + ": " + key + ": the quantity is cusp (cusp_um)");
    }
    size_t start = 0;
    while (start <= key.size()) {
      const size_t end = std::min(key.find('_', start), key.size());
      const std::string token = key.substr(start, end - start);
      start = end + 1;
      if (iso_symbols().count(token)) continue;
      if (token != lower(token)) {
        problems.push_back(where + ": " + key + ": '" + token + "' is neither an ISO symbol nor snake_case");
        continue;
      }
      for (const std::string& s : iso_symbols()) {
        if (s.size() >= 2 && token == lower(s) && token != "pt" && token != "pa") {
          problems.push_back(where + ": " + key + ": write the ISO symbol " + s + " in its case");
        }
      }
    }
  }
}

void require_style(const std::vector<std::string>& args,
                   const std::set<std::string>& exceptions = {}) {
  CAPTURE(args[0]);
  const test::RunResult r = test::run_cuspmap(args);
  INFO(r.err);
  REQUIRE(r.exit_code == 0);
  std::vector<std::string> problems;
  check_keys(nlohmann::json::parse(r.out), "$", exceptions, problems);
  for (const std::string& p : problems) UNSCOPED_INFO(p);
  CHECK(problems.empty());
}

}  // namespace

TEST_CASE("JSON keys: one style across stepover, allowance, plan, texture", "[cli]") {
  require_style({"stepover", "--tool", "ball", "--diameter", "6", "--stepover", "0.5",
                 "--feed-per-tooth", "0.05", "--teeth", "2", "--json"});
  require_style({"stepover", "--tool", "insert", "--nose-radius", "0.8", "--target-ra", "0.8um",
                 "--json"});
  require_style({"allowance", "--tool", "ball", "--diameter", "6", "--stepover", "0.5",
                 "--tolerance", "0.02", "--json"});
  require_style({"plan", "--tools", "ball:6,flat:10", "--tilt", "0.05", "--size", "80x50",
                 "--feed", "1500", "--machine-rate", "90", "--bench-rate", "45", "--stepovers",
                 "0.2,0.5", "--target-ra", "0.8um", "--json"});
  test::TempDir dir;
  const std::string job = test::source_path("examples/pump_cover_ball.toml");
  REQUIRE(test::run_cuspmap({"simulate", job, "--out", dir.path()}).exit_code == 0);
  require_style({"texture", dir.file("height.npy"), "--json"});
}

TEST_CASE("JSON keys: one style across simulate and compare", "[cli]") {
  const std::set<std::string> pending = {};
  test::TempDir dir;
  const std::string job = test::source_path("examples/pump_cover_ball.toml");
  require_style({"simulate", job, "--out", dir.file("sim"), "--json"}, pending);
  require_style({"compare", job, "--stepover", "0.3,0.6", "--out", dir.file("cmp"), "--json"},
                pending);
}

}  // namespace cuspmap

// TOML grade-table reader and grade-sequence check for the sanding model. Sizes um, rates mm^3/min.
// Errors: one line with file:line:col, the key or value, and what is allowed.
// Method: TOML v1.0 (toml++ 3.3); derived values as in finish/grit_table.h.
#include "io/read_grit_table.h"

#include <toml++/toml.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <fstream>
#include <sstream>

#include "core/input_error.h"
#include "core/units.h"

namespace cuspmap {
namespace {

std::string where(const std::string& file, const toml::source_region& region) {
  return file + ":" + std::to_string(region.begin.line) + ":" + std::to_string(region.begin.column);
}

// Rejects keys outside `allowed`, naming the key and the allowed ones.
template <std::size_t N>
void check_keys(const toml::table& table, const std::array<std::string_view, N>& allowed,
                const std::string& file, const std::string& prefix) {
  for (const auto& [key, node] : table) {
    if (std::find(allowed.begin(), allowed.end(), key.str()) != allowed.end()) continue;
    std::string list;
    for (std::string_view a : allowed) list += (list.empty() ? "" : ", ") + std::string(a);
    throw InputError(where(file, key.source()) + ": unknown key '" + prefix +
                     std::string(key.str()) + "'; allowed keys are " + list);
  }
}

// A positive finite number at `key`, or `fallback` when absent.
double positive(const toml::table& table, std::string_view key, double fallback,
                const std::string& file, const std::string& name,
                const toml::source_region& owner) {
  const toml::node* node = table.get(key);
  if (node == nullptr) {
    if (fallback > 0.0) return fallback;
    throw InputError(where(file, owner) + ": " + name + " is missing: expected a number > 0");
  }
  const std::optional<double> value = node->value<double>();
  if (!value) {
    throw InputError(where(file, node->source()) + ": " + name + ": expected a number > 0");
  }
  if (!std::isfinite(*value) || *value <= 0.0) {
    throw InputError(where(file, node->source()) + ": " + name + " " + format_number(*value) +
                     ": must be a finite number > 0");
  }
  return *value;
}

}  // namespace

GritTable parse_grit_table(std::string_view text, const std::string& file_name) {
  toml::table root;
  try {
    root = toml::parse(text, file_name);
  } catch (const toml::parse_error& e) {
    throw InputError(where(file_name, e.source()) + ": " + std::string(e.description()));
  }
  static constexpr std::array<std::string_view, 6> kRootKeys = {
      "source",
      "sequence",
      "scratch_per_particle",
      "ra_per_particle",
      "removal_mm3_per_min_per_particle_um",
      "grit"};
  check_keys(root, kRootKeys, file_name, "");
  const toml::source_region& top = root.source();
  const double scratch_frac = positive(root, "scratch_per_particle", kScratchDepthPerParticle,
                                       file_name, "scratch_per_particle", top);
  const double ra_frac =
      positive(root, "ra_per_particle", kRaPerParticle, file_name, "ra_per_particle", top);
  const double removal_frac =
      positive(root, "removal_mm3_per_min_per_particle_um", kRemovalMm3PerMinPerParticleUm,
               file_name, "removal_mm3_per_min_per_particle_um", top);

  GritTable table;
  table.source = root["source"].value_or(std::string("grade table ") + file_name);
  const toml::array* grits = root["grit"].as_array();
  if (grits == nullptr || grits->empty()) {
    throw InputError(file_name + ": 'grit' is missing: expected an array of grade tables");
  }
  static constexpr std::array<std::string_view, 5> kGritKeys = {"name", "particle_um", "scratch_um",
                                                                "ra_um", "removal_mm3_per_min"};
  for (std::size_t k = 0; k < grits->size(); ++k) {
    const toml::node& node = (*grits)[k];
    const std::string name_k = "grit[" + std::to_string(k) + "]";
    const toml::table* entry = node.as_table();
    if (entry == nullptr) {
      throw InputError(where(file_name, node.source()) + ": " + name_k + ": expected a table");
    }
    check_keys(*entry, kGritKeys, file_name, name_k + ".");
    const std::optional<std::string> name = (*entry)["name"].value<std::string>();
    if (!name || name->empty()) {
      throw InputError(where(file_name, node.source()) + ": " + name_k +
                       ".name: expected a grade name such as \"P240\"");
    }
    if (find_grit(table, *name) != nullptr) {
      throw InputError(where(file_name, node.source()) + ": " + name_k + ".name '" + *name +
                       "': appears twice");
    }
    Grit grit;
    grit.name = *name;
    grit.particle_um =
        positive(*entry, "particle_um", 0.0, file_name, name_k + ".particle_um", node.source());
    grit.scratch_um = positive(*entry, "scratch_um", scratch_frac * grit.particle_um, file_name,
                               name_k + ".scratch_um", node.source());
    grit.ra_um = positive(*entry, "ra_um", ra_frac * grit.particle_um, file_name, name_k + ".ra_um",
                          node.source());
    grit.removal_mm3_per_min =
        positive(*entry, "removal_mm3_per_min", removal_frac * grit.particle_um, file_name,
                 name_k + ".removal_mm3_per_min", node.source());
    table.grits.push_back(grit);
  }
  std::stable_sort(table.grits.begin(), table.grits.end(),
                   [](const Grit& a, const Grit& b) { return a.particle_um > b.particle_um; });

  if (const toml::node* seq = root.get("sequence")) {
    const toml::array* names = seq->as_array();
    if (names == nullptr) {
      throw InputError(where(file_name, seq->source()) + ": sequence: expected an array of names");
    }
    std::string joined;
    for (const toml::node& n : *names) {
      const std::optional<std::string> s = n.value<std::string>();
      if (!s) throw InputError(where(file_name, n.source()) + ": sequence: expected names");
      joined += (joined.empty() ? "" : ",") + *s;
    }
    table.sequence =
        parse_grit_sequence(joined, table, where(file_name, seq->source()) + ": sequence");
  } else {
    for (const Grit& g : table.grits) table.sequence.push_back(g.name);
  }
  return table;
}

GritTable read_grit_table(const std::string& path) {
  std::ifstream in(path, std::ios::binary);
  if (!in) throw InputError("--grit-table " + path + ": cannot read the file");
  std::ostringstream text;
  text << in.rdbuf();
  return parse_grit_table(text.str(), path);
}

std::vector<std::string> parse_grit_sequence(std::string_view text, const GritTable& table,
                                             std::string_view what) {
  std::vector<std::string> names;
  std::size_t start = 0;
  while (start <= text.size()) {
    const std::size_t comma = std::min(text.find(',', start), text.size());
    std::string_view item = text.substr(start, comma - start);
    while (!item.empty() && item.front() == ' ') item.remove_prefix(1);
    while (!item.empty() && item.back() == ' ') item.remove_suffix(1);
    if (!item.empty()) names.emplace_back(item);
    start = comma + 1;
  }
  if (names.empty()) {
    throw InputError(std::string(what) + " '" + std::string(text) +
                     "': expected grade names, coarse to fine, e.g. P180,P240,P320");
  }
  const Grit* previous = nullptr;
  for (const std::string& name : names) {
    const Grit* grit = find_grit(table, name);
    if (grit == nullptr) {
      std::string known;
      for (const Grit& g : table.grits) known += (known.empty() ? "" : ", ") + g.name;
      throw InputError(std::string(what) + " '" + name + "': unknown grade; the table has " +
                       known);
    }
    if (previous != nullptr && grit->particle_um >= previous->particle_um) {
      throw InputError(std::string(what) + " '" + std::string(text) + "': " + name +
                       " is not finer than " + previous->name + "; list grades coarse to fine");
    }
    previous = grit;
  }
  return names;
}

}  // namespace cuspmap

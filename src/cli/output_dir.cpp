// Output folder handling: create, never wipe, write only cuspmap-chosen names atomically.
#include "cli/output_dir.h"

#include <cassert>
#include <filesystem>
#include <system_error>

#include "core/input_error.h"
#include "core/write_file_atomic.h"

namespace cuspmap {

OutputDir::OutputDir(std::string path) : path_(std::move(path)) {
  namespace fs = std::filesystem;
  if (path_.empty()) throw InputError("--out is empty: expected a folder name");
  std::error_code ec;
  if (fs::exists(path_, ec) && !fs::is_directory(path_, ec)) {
    throw InputError("--out " + path_ + ": exists and is not a folder");
  }
  fs::create_directories(path_, ec);
  if (ec) throw InputError("--out " + path_ + ": cannot create the folder: " + ec.message());
}

void OutputDir::write(std::string_view name, std::string_view bytes) {
  write_file_atomic(path_of(name), bytes);
  written_.emplace_back(name);
}

void OutputDir::stage(std::string_view name, std::string_view bytes) {
  stage(name, std::span<const std::string_view>(&bytes, 1));
}

void OutputDir::stage(std::string_view name, std::span<const std::string_view> parts) {
  staged_.add(path_of(name), parts);
  written_.emplace_back(name);
}

void OutputDir::publish() { staged_.commit(); }

void OutputDir::add_committed(std::string_view name) { written_.emplace_back(name); }

std::string OutputDir::path_of(std::string_view name) const {
  assert(!name.empty() && name.find('/') == std::string_view::npos && name != ".." &&
         name != "." && "output names are chosen by cuspmap");
  return path_ + "/" + std::string(name);
}

std::string safe_file_stem(std::string_view text) {
  std::string out;
  for (char c : text) {
    const bool ok = (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') ||
                    c == '-' || c == '_' || c == '.';
    out.push_back(ok ? c : '_');
    if (out.size() >= 60) break;
  }
  while (!out.empty() && out.front() == '.') out.erase(out.begin());
  return out.empty() ? "job" : out;
}

}  // namespace cuspmap

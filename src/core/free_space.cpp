// Free disk space (statvfs on the nearest existing folder) and the fits-or-refuse check.
// Inputs: folder, byte counts; output: bytes free, or InputError. Method: see free_space.h.
#include "core/free_space.h"

#include <sys/statvfs.h>

#include <array>
#include <charconv>
#include <filesystem>
#include <system_error>

#include "core/input_error.h"

namespace cuspmap {
namespace {

// Fixed space kept free beside a big file: the pictures and report of the same run are a few
// MiB; 64 MiB leaves room for them and for other processes' small writes.
constexpr std::int64_t kMarginFixedBytes = std::int64_t{64} << 20;
// Share of the file kept free for file-system metadata (extent trees or indirect blocks).
constexpr std::int64_t kMarginDivisor = 100;

// "1.62 GB": 3 significant digits, decimal units (as df -H), locale-independent.
std::string size_text(std::int64_t bytes) {
  static constexpr const char* kUnits[] = {"bytes", "kB", "MB", "GB", "TB", "PB"};
  double v = static_cast<double>(bytes);
  int u = 0;
  while (v >= 1000.0 && u < 5) {
    v /= 1000.0;
    ++u;
  }
  std::array<char, 32> buf{};
  const auto [ptr, ec] =
      std::to_chars(buf.data(), buf.data() + buf.size(), v, std::chars_format::general, 3);
  return std::string(buf.data(), ec == std::errc() ? ptr : buf.data()) + " " + kUnits[u];
}

}  // namespace

std::int64_t free_space_bytes(const std::string& folder) {
  namespace fs = std::filesystem;
  std::error_code ec;
  fs::path p = fs::absolute(folder.empty() ? fs::path(".") : fs::path(folder), ec);
  if (ec) return -1;
  // The folder may not exist yet (--out is created later): ask its nearest existing parent.
  while (!fs::exists(p, ec) && p.has_parent_path() && p.parent_path() != p) p = p.parent_path();
  struct statvfs st {};
  if (statvfs(p.c_str(), &st) != 0) return -1;
  return static_cast<std::int64_t>(st.f_bavail) * static_cast<std::int64_t>(st.f_frsize);
}

std::int64_t free_space_margin_bytes(std::int64_t file_bytes) {
  return kMarginFixedBytes + file_bytes / kMarginDivisor;
}

void require_free_space(const std::string& what, std::int64_t file_bytes,
                        std::int64_t free_bytes, const std::string& folder) {
  if (free_bytes < 0) return;  // unknown: let the write itself report a full disk
  const std::int64_t margin = free_space_margin_bytes(file_bytes);
  if (file_bytes + margin <= free_bytes) return;
  throw InputError(what + " needs " + size_text(file_bytes + margin) + " (" +
                   std::to_string(file_bytes) + " bytes + a " + size_text(margin) +
                   " margin) but " + folder + " has " + size_text(free_bytes) +
                   " free; free some space, use a larger cell, or leave the file out");
}

}  // namespace cuspmap

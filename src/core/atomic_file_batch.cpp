// Batched atomic files: temp files written (and their write-back started) as added; commit() =
// fsync each, rename each, fsync each folder once. Inputs: paths and bytes; output: the files, all
// complete or (on failure before the renames) none. Method: POSIX fsync/rename, Linux
// sync_file_range; the per-file steps of core/atomic_file_stream.
#include "core/atomic_file_batch.h"

#include <fcntl.h>
#include <unistd.h>

#include <cerrno>
#include <cstring>
#include <filesystem>
#include <set>
#include <stdexcept>

namespace cuspmap {
namespace {

// fsync of a folder makes the renames into it durable (POSIX leaves a rename's durability to
// an fsync of the directory).
void sync_folder(const std::string& folder) {
  const int fd = open(folder.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (fd < 0) {
    throw std::runtime_error("cannot write " + folder + ": open: " + std::strerror(errno));
  }
  const int rc = fsync(fd);
  const int err = errno;
  close(fd);
  if (rc != 0) {
    throw std::runtime_error("cannot write " + folder + ": flush: " + std::strerror(err));
  }
}

}  // namespace

void AtomicFileBatch::add(const std::string& path, std::string_view bytes) {
  add(path, std::span<const std::string_view>(&bytes, 1));
}

void AtomicFileBatch::add(const std::string& path, std::span<const std::string_view> parts) {
  auto file = std::make_unique<AtomicFileStream>(path);
  for (std::string_view part : parts) file->append(part);
  // Write-back starts now, not at commit(): a file staged early (a floor's height.npy, beside
  // its texture report) is mostly on disk by then and its fsync waits the less.
  file->start_flush();
  files_.push_back(std::move(file));
}

void AtomicFileBatch::commit() {
  // Write-back of every file started when it was added, before any fsync waits, so the first
  // fsync's journal commit carries them all and the later ones find little left to do.
  for (auto& f : files_) f->flush();
  std::set<std::string> folders;
  for (auto& f : files_) {
    f->publish();
    const std::filesystem::path parent = std::filesystem::path(f->path()).parent_path();
    folders.insert(parent.empty() ? std::string(".") : parent.string());
  }
  for (const std::string& folder : folders) sync_folder(folder);
  files_.clear();
}

}  // namespace cuspmap

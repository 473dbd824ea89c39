// The --out folder of a command: created if missing, never wiped; files are written only under
// names cuspmap chooses (never names taken from input files), each through write_file_atomic
// (or, for a file too large to hold, an AtomicFileStream on path_of(name)).
#pragma once

#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "core/atomic_file_batch.h"

namespace cuspmap {

/// An output folder and the files written into it so far.
class OutputDir {
 public:
  /// Creates the folder (and parents) if needed.
  /// @throws InputError when the path exists and is not a folder, or cannot be created.
  explicit OutputDir(std::string path);

  /// Writes `bytes` to <folder>/<name> atomically. `name` must be a plain file name made by
  /// cuspmap (no '/', no "..", not empty): anything else is a programming error.
  void write(std::string_view name, std::string_view bytes);

  /// Like write(), but the file appears only at publish(), together with the others staged
  /// (one journal commit for the set, core/atomic_file_batch.h); if publish() is never reached
  /// none of them appears. Listed in written() at once.
  void stage(std::string_view name, std::string_view bytes);
  /// As stage(name, bytes) for a file given in parts (written in order, never joined).
  void stage(std::string_view name, std::span<const std::string_view> parts);
  /// Publishes the staged files (fsync each, rename each, fsync the folder).
  void publish();

  /// Records a file published in the folder by a streamed writer (an AtomicFileStream opened
  /// on path_of(name) and committed), so written() lists it. Same rules for `name` as write().
  void add_committed(std::string_view name);

  /// Full path of a file in the folder.
  std::string path_of(std::string_view name) const;
  /// The folder.
  const std::string& path() const { return path_; }
  /// Names written so far, in order.
  const std::vector<std::string>& written() const { return written_; }

 private:
  std::string path_;
  std::vector<std::string> written_;
  AtomicFileBatch staged_;
};

/// A file name derived from user text (a job name) reduced to [A-Za-z0-9_-.], at most 60 chars,
/// never starting with '.', so it cannot leave the output folder.
std::string safe_file_stem(std::string_view text);

}  // namespace cuspmap

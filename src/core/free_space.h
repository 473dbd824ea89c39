// Free disk space for an output file, and the check that refuses a file that cannot fit before
// any work starts. Inputs: a folder (may not exist yet: its nearest existing parent is asked),
// byte counts; output: bytes free to an unprivileged user, or an InputError.
// Method: POSIX statvfs(3) f_bavail x f_frsize (blocks free to non-root processes).
#pragma once

#include <cstdint>
#include <string>

namespace cuspmap {

/// Bytes an unprivileged process may still write on the file system holding `folder`.
/// @param[in] folder  a folder; when it does not exist yet, its nearest existing parent is used
/// @return free bytes, or -1 when no parent can be queried (the caller should then not refuse)
std::int64_t free_space_bytes(const std::string& folder);

/// Space to keep free beside a file of `file_bytes`: the run's other outputs (pictures and
/// report, a few MiB) and file-system metadata (extent or indirect blocks, well under 1 % of
/// the data on ext4/xfs, from memory): 64 MiB plus 1 % of the file.
std::int64_t free_space_margin_bytes(std::int64_t file_bytes);

/// Refuses a file that, with its margin, does not fit.
/// @param[in] what        the flag and file, e.g. "--npy: height.npy" (starts the message)
/// @param[in] file_bytes  size of the file to write
/// @param[in] free_bytes  from free_space_bytes; -1 (unknown) never refuses
/// @param[in] folder      where it goes (named in the message)
/// @throws InputError "<what> needs <size> (<n> bytes, with a <m> margin) but <folder> has
///         <size> free; ..." when file_bytes + margin > free_bytes
void require_free_space(const std::string& what, std::int64_t file_bytes,
                        std::int64_t free_bytes, const std::string& folder);

}  // namespace cuspmap

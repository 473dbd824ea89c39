// libzip, loaded when an X3P file is first read or written rather than at every start: the
// library and what it links (a crypto library among them) cost every command ~6 ms of dynamic
// loading (docs/performance.md, "Fourth pass").
// Input: none; output: the libzip functions X3P uses. Method: dlopen(3) / dlsym(3) (POSIX).
#pragma once

#include <zip.h>

namespace cuspmap {

/// The libzip functions io/heightmap_x3p uses, with libzip's own signatures.
struct ZipLibrary {
  decltype(&::zip_close) close;
  decltype(&::zip_discard) discard;
  decltype(&::zip_error_init) error_init;
  decltype(&::zip_file_add) file_add;
  decltype(&::zip_fopen) fopen;
  decltype(&::zip_fclose) fclose;
  decltype(&::zip_fread) fread;
  decltype(&::zip_open_from_source) open_from_source;
  decltype(&::zip_source_buffer) source_buffer;
  decltype(&::zip_source_buffer_create) source_buffer_create;
  decltype(&::zip_source_close) source_close;
  decltype(&::zip_source_free) source_free;
  decltype(&::zip_source_keep) source_keep;
  decltype(&::zip_source_open) source_open;
  decltype(&::zip_source_read) source_read;
  decltype(&::zip_source_seek) source_seek;
  decltype(&::zip_source_tell) source_tell;
  decltype(&::zip_stat) stat;
  decltype(&::zip_stat_init) stat_init;
};

/// libzip, loaded on the first call (thread-safe) and kept for the process.
/// @throws std::runtime_error naming the library and the Debian package when it cannot be loaded
const ZipLibrary& zip_library();

}  // namespace cuspmap

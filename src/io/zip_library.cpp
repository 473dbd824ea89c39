// libzip loaded on first use: dlopen by its soname, every function looked up once.
// Input: none; output: ZipLibrary. Cost: one dlopen (~6 ms) in the processes that read X3P.
// Method: dlopen(3) / dlsym(3) (POSIX); C++11 thread-safe initialisation of a local static.
#include "io/zip_library.h"

#include <dlfcn.h>

#include <stdexcept>
#include <string>

namespace cuspmap {
namespace {

// Sonames tried in order: Debian 12's libzip4, then a later major version, then the
// development link.
constexpr const char* kSonames[] = {"libzip.so.4", "libzip.so.5", "libzip.so"};

template <class F>
void look_up(void* lib, const char* name, F& out) {
  void* f = dlsym(lib, name);
  if (f == nullptr) {
    throw std::runtime_error(std::string("libzip has no ") + name +
                             ": X3P needs libzip 1.7 or later (Debian package libzip4)");
  }
  out = reinterpret_cast<F>(f);
}

ZipLibrary load() {
  void* lib = nullptr;
  for (const char* soname : kSonames) {
    lib = dlopen(soname, RTLD_NOW | RTLD_LOCAL);
    if (lib != nullptr) break;
  }
  if (lib == nullptr) {
    throw std::runtime_error("reading or writing X3P needs libzip (Debian package libzip4), "
                             "which cannot be loaded: " + std::string(dlerror()));
  }
  ZipLibrary z{};
  look_up(lib, "zip_close", z.close);
  look_up(lib, "zip_discard", z.discard);
  look_up(lib, "zip_error_init", z.error_init);
  look_up(lib, "zip_file_add", z.file_add);
  look_up(lib, "zip_fopen", z.fopen);
  look_up(lib, "zip_fclose", z.fclose);
  look_up(lib, "zip_fread", z.fread);
  look_up(lib, "zip_open_from_source", z.open_from_source);
  look_up(lib, "zip_source_buffer", z.source_buffer);
  look_up(lib, "zip_source_buffer_create", z.source_buffer_create);
  look_up(lib, "zip_source_close", z.source_close);
  look_up(lib, "zip_source_free", z.source_free);
  look_up(lib, "zip_source_keep", z.source_keep);
  look_up(lib, "zip_source_open", z.source_open);
  look_up(lib, "zip_source_read", z.source_read);
  look_up(lib, "zip_source_seek", z.source_seek);
  look_up(lib, "zip_source_tell", z.source_tell);
  look_up(lib, "zip_stat", z.stat);
  look_up(lib, "zip_stat_init", z.stat_init);
  return z;  // the library stays loaded for the process
}

}  // namespace

const ZipLibrary& zip_library() {
  static const ZipLibrary z = load();
  return z;
}

}  // namespace cuspmap

// PNG encoding into memory; the single translation unit that compiles stb_image_write.
// Inputs: Image (gray or RGB, top row first); output: PNG bytes.
// Method: ISO/IEC 15948 PNG through stb_image_write (public domain, S. Barrett), its deflate
// stream by zlib (RFC 1950/1951).
#include "io/png.h"

#include <stdexcept>

#include <zlib.h>

#include <cstdlib>

namespace {

// Deflate level of the pictures' zlib streams: zlib's fastest level 1 compresses a 1200 x 1200
// picture several times faster than stb's own deflate (level 8) at a similar size, since the
// pictures are smooth gray ramps that PNG's row filters already flatten (common practice, no
// source).
constexpr int kPngDeflateLevel = 1;

// stb_image_write's hook for a zlib stream (STBIW_ZLIB_COMPRESS): zlib's compress2 at
// kPngDeflateLevel; the buffer is freed by stb with free(). `quality` (stb's level) is unused.
unsigned char* zlib_compress(unsigned char* data, int data_len, int* out_len, int /*quality*/) {
  uLongf size = compressBound(static_cast<uLong>(data_len));
  auto* out = static_cast<unsigned char*>(std::malloc(size));
  if (out == nullptr) return nullptr;
  if (compress2(out, &size, data, static_cast<uLong>(data_len), kPngDeflateLevel) != Z_OK) {
    std::free(out);
    return nullptr;
  }
  *out_len = static_cast<int>(size);
  return out;
}

}  // namespace

// STBI_WRITE_NO_STDIO: the library must not open files itself (write_file_atomic does that).
#define STBI_WRITE_NO_STDIO
#define STBIW_ZLIB_COMPRESS zlib_compress
#define STB_IMAGE_WRITE_IMPLEMENTATION
#define STB_IMAGE_WRITE_STATIC
#include <stb_image_write.h>

namespace {

// One PNG row filter for every row (ISO/IEC 15948 s. 9.2, type 4 "Paeth") instead of stb trying
// all five per row and keeping the smallest sum: on the pictures (smooth ramps, flat fills,
// anti-aliased lines) it costs a few per cent in size and a fifth of the filtering time
// (docs/performance.md, "Fourth pass"). Set once, before main, in this translation unit's copy.
constexpr int kPngRowFilter = 4;
[[maybe_unused]] const bool kPngRowFilterSet = (stbi_write_force_png_filter = kPngRowFilter, true);

}  // namespace

namespace cuspmap {
namespace {

// stb calls this with each chunk of the encoded file; the context is the output string.
void append_bytes(void* context, void* data, int size) {
  static_cast<std::string*>(context)->append(static_cast<const char*>(data),
                                             static_cast<std::size_t>(size));
}

}  // namespace

std::string encode_png(const Image& image) {
  if (image.width < 1 || image.height < 1) {
    throw std::invalid_argument("encode_png: empty image");
  }
  if (image.channels != 1 && image.channels != 3) {
    throw std::invalid_argument("encode_png: channels must be 1 or 3");
  }
  if (image.pixels.size() !=
      static_cast<std::size_t>(image.width) * image.height * image.channels) {
    throw std::invalid_argument(
        "encode_png: pixel buffer does not match width x height x channels");
  }
  std::string bytes;
  const int ok =
      stbi_write_png_to_func(append_bytes, &bytes, image.width, image.height, image.channels,
                             image.pixels.data(), image.width * image.channels);
  if (ok == 0) throw std::runtime_error("encode_png: the PNG encoder failed (out of memory?)");
  return bytes;
}

}  // namespace cuspmap

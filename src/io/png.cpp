// PNG encoding into memory; the single translation unit that compiles stb_image_write.
// Inputs: Image (gray or RGB, top row first); output: PNG bytes.
// Method: ISO/IEC 15948 PNG through stb_image_write (public domain, S. Barrett), its deflate
// stream by zlib (RFC 1950/1951).
#include "io/png.h"

#include <stdexcept>

#include <zlib.h>

#include <cstdlib>

namespace {

// Deflate level and strategy of the pictures' zlib streams: zlib's fastest level 1 compresses
// a 1200 x 1200 picture several times faster than stb's own deflate (level 8) at a similar size,
// since the pictures are smooth gray ramps that PNG's row filters already flatten; run-length
// matches only (Z_RLE, zlib manual: "designed to be almost as fast as Z_HUFFMAN_ONLY, but give
// better compression for PNG image data") made the 12 mm job's five pictures 57.4 -> 40.3 kB
// at the same cost (measured; common practice for filtered image rows, no further source).
constexpr int kPngDeflateLevel = 1;
constexpr int kPngDeflateStrategy = Z_RLE;

// stb_image_write's hook for a zlib stream (STBIW_ZLIB_COMPRESS): zlib's deflate at
// kPngDeflateLevel and kPngDeflateStrategy (zlib's default 32 KiB window, 15 bits, and memory
// level 8); the buffer is freed by stb with free(). `quality` (stb's level) is unused.
unsigned char* zlib_compress(unsigned char* data, int data_len, int* out_len, int /*quality*/) {
  z_stream zs{};
  if (deflateInit2(&zs, kPngDeflateLevel, Z_DEFLATED, 15, 8, kPngDeflateStrategy) != Z_OK) {
    return nullptr;
  }
  uLong size = deflateBound(&zs, static_cast<uLong>(data_len));
  auto* out = static_cast<unsigned char*>(std::malloc(size));
  if (out == nullptr) {
    deflateEnd(&zs);
    return nullptr;
  }
  zs.next_in = data;
  zs.avail_in = static_cast<uInt>(data_len);
  zs.next_out = out;
  zs.avail_out = static_cast<uInt>(size);
  const int done = deflate(&zs, Z_FINISH);
  deflateEnd(&zs);
  if (done != Z_STREAM_END) {
    std::free(out);
    return nullptr;
  }
  *out_len = static_cast<int>(zs.total_out);
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

// One PNG row filter for every row (ISO/IEC 15948 s. 9.2, type 2 "Up") instead of stb trying
// all five per row and keeping the smallest sum: the pictures are smooth ramps, flat fills and
// anti-aliased lines, whose rows differ little from the row above. Measured on the 12 mm job's
// pictures: Up 57.4 kB, Paeth 55.7 kB, Sub 77.1 kB; Up costs one subtraction per byte against
// Paeth's predictor (82 M instructions less, ~5 % of the whole command: docs/performance.md
// "Fifth pass"). Set once, before main, in this translation unit's copy.
constexpr int kPngRowFilter = 2;
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

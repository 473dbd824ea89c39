// PNG encoding into memory; the single translation unit that compiles stb_image_write.
// Inputs: Image (gray or RGB, top row first); output: PNG bytes. An RGB image of at most 256
// colours is written as an indexed-colour PNG (1-8 bits per pixel), the others by stb.
// Method: ISO/IEC 15948 PNG (stb_image_write, public domain, S. Barrett; the indexed form here,
// s. 11.2.2 IHDR, 11.2.3 PLTE, 12.8 filter choice), deflate streams by zlib (RFC 1950/1951).
#include "io/png.h"

#include <algorithm>
#include <array>
#include <cstdint>
#include <stdexcept>
#include <string_view>
#include <vector>

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

// Indexed colour (ISO/IEC 15948 colour type 3) for RGB pictures of few colours (plots, the
// shaded relief's levels): one byte per pixel or less instead of three, so the row filter and
// deflate see 3-24x fewer bytes (the 12 mm job's profile plot: 6 colours, 4 bits per pixel).
constexpr int kMaxPaletteColours = 256;

// The colours of an RGB image in order of first appearance and each pixel's index into them;
// false (and nothing kept) when there are more than kMaxPaletteColours.
bool index_colours(const Image& image, std::vector<std::uint32_t>& colours,
                   std::vector<std::uint8_t>& index) {
  // Open addressing over 1024 slots (4x the most colours kept): key = colour + 1, 0 = empty.
  constexpr std::uint32_t kSlots = 1024;
  std::array<std::uint32_t, kSlots> key{};
  std::array<std::uint8_t, kSlots> value{};
  const std::size_t n = static_cast<std::size_t>(image.width) * image.height;
  index.resize(n);
  const std::uint8_t* px = image.pixels.data();
  std::uint32_t last = 0xffffffffu;  // no colour: the first pixel always looks up
  std::uint8_t last_index = 0;
  for (std::size_t k = 0; k < n; ++k, px += 3) {
    const std::uint32_t c = (std::uint32_t{px[0]} << 16) | (std::uint32_t{px[1]} << 8) | px[2];
    if (c != last) {
      std::uint32_t slot = (c * 2654435761u) >> 22;  // Knuth's multiplicative hash, 10 bits
      while (key[slot] != 0 && key[slot] != c + 1) slot = (slot + 1) & (kSlots - 1);
      if (key[slot] == 0) {
        if (colours.size() == kMaxPaletteColours) return false;
        key[slot] = c + 1;
        value[slot] = static_cast<std::uint8_t>(colours.size());
        colours.push_back(c);
      }
      last = c;
      last_index = value[slot];
    }
    index[k] = last_index;
  }
  return true;
}

void put_u32(std::string& out, std::uint32_t v) {
  for (int shift = 24; shift >= 0; shift -= 8) out.push_back(static_cast<char>(v >> shift));
}

// One chunk: length, type, data, CRC-32 of type and data (ISO/IEC 15948 s. 5.3).
void put_chunk(std::string& out, const char (&type)[5], std::string_view data) {
  put_u32(out, static_cast<std::uint32_t>(data.size()));
  const std::size_t crc_from = out.size();
  out.append(type, 4);
  out.append(data);
  const auto* crc_bytes = reinterpret_cast<const Bytef*>(out.data() + crc_from);
  put_u32(out, static_cast<std::uint32_t>(
                   crc32(crc32(0L, Z_NULL, 0), crc_bytes, static_cast<uInt>(4 + data.size()))));
}

// An indexed-colour PNG: bit depth 1, 2, 4 or 8 by the number of colours, every row with filter
// type 0 (None: "usually the most effective" for indexed colour, ISO/IEC 15948 s. 12.8).
std::string encode_indexed_png(const Image& image, const std::vector<std::uint32_t>& colours,
                               const std::vector<std::uint8_t>& index) {
  const int n = static_cast<int>(colours.size());
  const int depth = n <= 2 ? 1 : n <= 4 ? 2 : n <= 16 ? 4 : 8;
  const int per_byte = 8 / depth;
  const std::size_t row_bytes = (static_cast<std::size_t>(image.width) + per_byte - 1) / per_byte;
  std::vector<unsigned char> rows(static_cast<std::size_t>(image.height) * (row_bytes + 1), 0);
  for (int y = 0; y < image.height; ++y) {
    unsigned char* out = rows.data() + static_cast<std::size_t>(y) * (row_bytes + 1) + 1;
    const std::uint8_t* in = index.data() + static_cast<std::size_t>(y) * image.width;
    for (int x = 0; x < image.width; x += per_byte) {
      const int m = std::min(per_byte, image.width - x);
      unsigned v = 0;
      for (int k = 0; k < m; ++k) v |= unsigned{in[x + k]} << (8 - depth * (k + 1));  // left high
      out[x / per_byte] = static_cast<unsigned char>(v);
    }
  }
  int idat_len = 0;
  unsigned char* idat = zlib_compress(rows.data(), static_cast<int>(rows.size()), &idat_len, 0);
  if (idat == nullptr) throw std::runtime_error("encode_png: the PNG encoder failed");
  std::string ihdr;
  put_u32(ihdr, static_cast<std::uint32_t>(image.width));
  put_u32(ihdr, static_cast<std::uint32_t>(image.height));
  ihdr += {static_cast<char>(depth), 3, 0, 0, 0};  // indexed; deflate; adaptive; no interlace
  std::string plte;
  for (const std::uint32_t c : colours) {
    plte += {static_cast<char>(c >> 16), static_cast<char>(c >> 8), static_cast<char>(c)};
  }
  std::string png("\x89PNG\r\n\x1a\n", 8);
  put_chunk(png, "IHDR", ihdr);
  put_chunk(png, "PLTE", plte);
  put_chunk(png, "IDAT", std::string_view(reinterpret_cast<const char*>(idat),
                                          static_cast<std::size_t>(idat_len)));
  std::free(idat);
  put_chunk(png, "IEND", {});
  return png;
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
  if (image.channels == 3) {
    std::vector<std::uint32_t> colours;
    std::vector<std::uint8_t> index;
    if (index_colours(image, colours, index)) return encode_indexed_png(image, colours, index);
  }
  std::string bytes;
  const int ok =
      stbi_write_png_to_func(append_bytes, &bytes, image.width, image.height, image.channels,
                             image.pixels.data(), image.width * image.channels);
  if (ok == 0) throw std::runtime_error("encode_png: the PNG encoder failed (out of memory?)");
  return bytes;
}

}  // namespace cuspmap

// PNG encoding into memory; the single translation unit that compiles stb_image_write.
// Inputs: Image (gray or RGB, top row first); output: PNG bytes.
// Method: ISO/IEC 15948 PNG through stb_image_write (public domain, S. Barrett).
#include "io/png.h"

#include <stdexcept>

// STBI_WRITE_NO_STDIO: the library must not open files itself (write_file_atomic does that).
#define STBI_WRITE_NO_STDIO
#define STB_IMAGE_WRITE_IMPLEMENTATION
#include <stb_image_write.h>

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

// PNG encoder: an 8-bit gray or RGB Image to the bytes of a PNG file, in memory (write the bytes
// with write_file_atomic). The project's one stb_image_write implementation lives in png.cpp.
// Cost: O(pixels) (zlib deflate, level 1, run-length matches).
// Method: PNG (ISO/IEC 15948:2004) via stb_image_write's stbi_write_png_to_func; indexed colour
// written here.
#pragma once

#include <string>

#include "io/raster_image.h"

namespace cuspmap {

/// Encodes an image as a PNG file held in a string (binary bytes).
/// @param[in] image  width, height >= 1; channels 1 (8-bit grayscale PNG) or 3 (an indexed-colour
///                   PNG of 1-8 bits per pixel when the image has at most 256 colours, else an
///                   8-bit RGB PNG); decoders give back the same pixels either way
/// @return the complete file contents, starting with the 8-byte PNG signature
/// @throws std::invalid_argument for an empty image or other channel counts (a programming
///         error); std::runtime_error if the encoder fails (out of memory).
std::string encode_png(const Image& image);

}  // namespace cuspmap

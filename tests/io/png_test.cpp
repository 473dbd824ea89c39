// Tests for io/png: the encoded bytes decode (stb_image, test-only) to the same pixels.
#include "io/png.h"

#include <string>

#include "test_support.h"

// A private copy of the decoder for this test only (static functions: no clash with any other
// translation unit).
#define STB_IMAGE_STATIC
#define STB_IMAGE_IMPLEMENTATION
#define STBI_ONLY_PNG
#include <stb_image.h>

using namespace cuspmap;

namespace {

Image decode(const std::string& png, int expected_channels) {
  int w = 0, h = 0, n = 0;
  stbi_uc* data = stbi_load_from_memory(reinterpret_cast<const stbi_uc*>(png.data()),
                                        static_cast<int>(png.size()), &w, &h, &n, 0);
  REQUIRE(data != nullptr);
  REQUIRE(n == expected_channels);
  Image img;
  img.width = w;
  img.height = h;
  img.channels = n;
  img.pixels.assign(data, data + static_cast<std::size_t>(w) * h * n);
  stbi_image_free(data);
  return img;
}

}  // namespace

TEST_CASE("encode_png: gray image round-trips through a PNG decoder", "[io]") {
  Image img = make_image(37, 11, 1, kWhite);
  for (int y = 0; y < img.height; ++y) {
    for (int x = 0; x < img.width; ++x)
      img.at(x, y) = static_cast<std::uint8_t>((x * 7 + y * 31) % 256);
  }
  const std::string png = encode_png(img);
  // PNG signature, ISO/IEC 15948 sec. 5.2.
  REQUIRE(png.substr(0, 8) == std::string("\x89PNG\r\n\x1a\n", 8));
  const Image back = decode(png, 1);
  REQUIRE(back.width == 37);
  REQUIRE(back.height == 11);
  REQUIRE(back.pixels == img.pixels);
}

TEST_CASE("encode_png: RGB image round-trips with channel order kept", "[io]") {
  Image img = make_image(5, 4, 3, kBlack);
  for (int y = 0; y < 4; ++y) {
    for (int x = 0; x < 5; ++x) {
      set_pixel(img, x, y,
                Color{static_cast<std::uint8_t>(50 * x), static_cast<std::uint8_t>(60 * y), 200});
    }
  }
  const Image back = decode(encode_png(img), 3);
  REQUIRE(back.pixels == img.pixels);
  REQUIRE(pixel(back, 4, 1) == Color{200, 60, 200});
}

TEST_CASE("encode_png: rejects empty images and unsupported channel counts", "[io]") {
  REQUIRE_THROWS_AS(encode_png(Image{}), std::invalid_argument);
  Image two;
  two.width = two.height = 1;
  two.channels = 2;
  two.pixels = {0, 0};
  REQUIRE_THROWS_AS(encode_png(two), std::invalid_argument);
}

TEST_CASE("encode_png: RGB images of few colours are written indexed, same pixels", "[io]") {
  // IHDR fields after the signature, length and type: width 16..19, height 20..23, bit depth 24,
  // colour type 25 (ISO/IEC 15948 s. 11.2.2: 2 = truecolour, 3 = indexed).
  const auto ihdr_byte = [](const std::string& png, int at) {
    return static_cast<int>(static_cast<unsigned char>(png[static_cast<std::size_t>(at)]));
  };
  struct Case {
    int colours, depth, colour_type;
  };
  for (const Case c : {Case{2, 1, 3}, Case{3, 2, 3}, Case{6, 4, 3}, Case{17, 8, 3},
                       Case{256, 8, 3}, Case{257, 8, 2}}) {
    // 37 columns: rows end inside a packed byte at 1, 2 and 4 bits per pixel.
    Image img = make_image(37, 9, 3, kWhite);
    for (int y = 0; y < img.height; ++y) {
      for (int x = 0; x < img.width; ++x) {
        const int k = (x + y * 37) % c.colours;  // every colour used: 333 distinct x + 37 y
        set_pixel(img, x, y,
                  Color{static_cast<std::uint8_t>(k % 256), static_cast<std::uint8_t>(k / 256),
                        static_cast<std::uint8_t>(255 - k % 256)});
      }
    }
    const std::string png = encode_png(img);
    CAPTURE(c.colours);
    REQUIRE(ihdr_byte(png, 24) == c.depth);
    REQUIRE(ihdr_byte(png, 25) == c.colour_type);
    // stb_image expands an indexed image to its palette's RGB.
    REQUIRE(decode(png, 3).pixels == img.pixels);
  }
}

// Round trips (write -> read) for CSV, XYZ, SDF and X3P, and malformed files with their
// one-line messages.
// Sources: ISO 25178-71:2012 (SDF header keys, BAD invalid points, '*' sections), ISO 25178-72
// (X3P: main.xml + bindata/data.bin + md5checksum.hex), RFC 4180 (CSV layout).
#include <zip.h>

#include <cmath>
#include <cstdio>
#include <stdexcept>

#include "core/input_error.h"
#include "io/heightmap_csv.h"
#include "io/heightmap_sdf.h"
#include "io/heightmap_x3p.h"
#include "io/heightmap_xyz.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

Heightfield field() {
  Heightfield hf;
  hf.nx = 5;
  hf.ny = 3;
  hf.cell_mm = 0.02;
  hf.z_um.resize(3, 5);
  for (int k = 0; k < 15; ++k) hf.z_um.data()[k] = 0.1f * static_cast<float>(k * k) - 3.7f;
  hf.z_um(2, 1) = kUnreached;
  return hf;
}

void require_same(const Heightfield& a, const Heightfield& b, double rel) {
  REQUIRE(a.nx == b.nx);
  REQUIRE(a.ny == b.ny);
  for (int k = 0; k < a.nx * a.ny; ++k) {
    CAPTURE(k);
    const float x = a.z_um.data()[k], y = b.z_um.data()[k];
    if (std::isnan(x)) {
      REQUIRE(std::isnan(y));
    } else {
      REQUIRE_NEAR(y, x, rel * std::max(1.0f, std::abs(x)));
    }
  }
}

// Reads one entry of an in-memory zip.
std::string read_zip_entry(const std::string& zip, const char* entry) {
  zip_source_t* src = zip_source_buffer_create(zip.data(), zip.size(), 0, nullptr);
  zip_t* za = zip_open_from_source(src, ZIP_RDONLY, nullptr);
  zip_stat_t st;
  zip_stat(za, entry, 0, &st);
  std::string out(st.size, '\0');
  zip_file_t* f = zip_fopen(za, entry, 0);
  zip_fread(f, out.data(), st.size);
  zip_fclose(f);
  zip_discard(za);
  return out;
}

// Copy of an in-memory zip with one entry's contents replaced (to build damaged files).
std::string replace_zip_entry(const std::string& zip, const char* entry, const std::string& bytes) {
  zip_source_t* src = zip_source_buffer_create(nullptr, 0, 0, nullptr);
  zip_source_begin_write(src);
  zip_source_write(src, zip.data(), zip.size());
  zip_source_commit_write(src);
  zip_source_keep(src);
  zip_t* za = zip_open_from_source(src, 0, nullptr);
  if (!za) throw std::runtime_error("test zip cannot be opened");
  zip_source_t* s = zip_source_buffer(za, bytes.data(), bytes.size(), 0);
  zip_file_add(za, entry, s, ZIP_FL_OVERWRITE);
  zip_close(za);
  zip_source_open(src);
  zip_source_seek(src, 0, SEEK_END);
  std::string out(static_cast<size_t>(zip_source_tell(src)), '\0');
  zip_source_seek(src, 0, SEEK_SET);
  zip_source_read(src, out.data(), out.size());
  zip_source_close(src);
  zip_source_free(src);
  return out;
}

}  // namespace

TEST_CASE("decode_csv_grid: round trip", "[io]") {
  const Heightfield hf = field();
  const Heightfield back = decode_csv_grid(encode_csv_grid(hf), "a.csv");
  require_same(hf, back, 0.0);
  REQUIRE(back.cell_mm == 0.0);
}

TEST_CASE("decode_csv_grid: comments, blanks, semicolons and empty fields", "[io]") {
  const Heightfield hf = decode_csv_grid("# heights in um\n1;2;3\n\n4;;6\n", "b.csv");
  REQUIRE(hf.nx == 3);
  REQUIRE(hf.ny == 2);
  REQUIRE(std::isnan(hf.z_um(1, 1)));
  REQUIRE(hf.z_um(1, 2) == 6.0f);
}

TEST_CASE("decode_csv_grid: malformed rows name file and line", "[io]") {
  REQUIRE_THROWS_WITH(decode_csv_grid("1,2,3\n4,5\n", "g.csv"),
                      "g.csv:2: 2 values, expected 3 as on line 1");
  REQUIRE_THROWS_WITH(decode_csv_grid("1,2,3\n4,x5,6\n", "g.csv"),
                      "g.csv:2: value 2 'x5' is not a number");
  REQUIRE_THROWS_WITH(decode_csv_grid("# nothing\n", "g.csv"),
                      "g.csv: no data rows (empty CSV grid)");
}

TEST_CASE("decode_xyz: round trip infers cell and origin", "[io]") {
  Heightfield hf = field();
  hf.origin_x_mm = 1.0;
  hf.origin_y_mm = -2.0;
  const Heightfield back = decode_xyz(encode_xyz(hf), "a.xyz");
  require_same(hf, back, 0.0);
  REQUIRE_NEAR(back.cell_mm, 0.02, 1e-12);
  REQUIRE_NEAR(back.origin_x_mm, 1.0, 1e-12);
  REQUIRE_NEAR(back.origin_y_mm, -2.0, 1e-12);
}

TEST_CASE("decode_xyz: irregular points are rejected", "[io]") {
  REQUIRE_THROWS_WITH(
      decode_xyz("0 0 1\n0.1 0 2\n0.25 0 3\n0 0.1 4\n", "p.xyz"),
      "p.xyz:3: point (0.25, 0) is off the regular grid of cell 0.1 mm starting at (0, 0)");
  REQUIRE_THROWS_WITH(
      decode_xyz("0 0 1\n0.1 0 2\n0 0.2 4\n", "p.xyz"),
      "p.xyz: X spacing 0.1 mm differs from Y spacing 0.2 mm; cuspmap needs square cells");
  REQUIRE_THROWS_WITH(decode_xyz("0 0 1\n0.1 0\n", "p.xyz"),
                      "p.xyz:2: 2 values, expected 3 (X Y Z)");
  REQUIRE_THROWS_WITH(decode_xyz("0 0 1\n0.1 0 2\n0 0 3\n", "p.xyz"),
                      "p.xyz:3: point (0, 0) appears twice");
}

TEST_CASE("decode_sdf: round trip (ISO 25178-71 ASCII, BAD for unreached)", "[io]") {
  const Heightfield hf = field();
  const std::string text = encode_sdf(hf);
  REQUIRE(text.rfind("aBCR-1.0\n", 0) == 0);
  REQUIRE(text.find("Xscale      = 2e-05\n") != std::string::npos);
  REQUIRE(text.find("BAD") != std::string::npos);
  const Heightfield back = decode_sdf(text, "a.sdf");
  require_same(hf, back, 1e-7);
  REQUIRE_NEAR(back.cell_mm, 0.02, 1e-12);
}

TEST_CASE("decode_sdf: aISO magic, metres scale and malformed headers", "[io]") {
  const std::string ok =
      "aISO-1.0\nNumPoints = 2\nNumProfiles = 1\nXscale = 1e-5\nYscale = 0\nZscale = 1e-9\n*\n1000 "
      "-2000\n*\n*\n";
  const Heightfield hf = decode_sdf(ok, "n.sdf");
  REQUIRE_NEAR(hf.z_um(0, 0), 1.0, 1e-6);  // 1000 x 1e-9 m = 1 um
  REQUIRE_NEAR(hf.cell_mm, 0.01, 1e-12);
  REQUIRE_THROWS_WITH(decode_sdf("hello\n", "n.sdf"),
                      "n.sdf:1: not an ASCII SDF file (expected aBCR-1.0 or aISO-1.0)");
  REQUIRE_THROWS_WITH(
      decode_sdf("aBCR-1.0\nNumPoints = 2\nXscale = 1e-5\nYscale = 1e-5\nZscale = 1\n*\n1 2\n*\n",
                 "n.sdf"),
      "n.sdf: header lacks NumProfiles");
  REQUIRE_THROWS_WITH(decode_sdf("aBCR-1.0\nNumPoints = 2\nNumProfiles = 1\nXscale = 1e-5\nYscale "
                                 "= 0\nZscale = 1\n*\n1 2 3\n*\n",
                                 "n.sdf"),
                      "n.sdf:8: more data values than NumPoints x NumProfiles = 2");
  REQUIRE_THROWS_WITH(decode_sdf("aBCR-1.0\nNumPoints = two\n", "n.sdf"),
                      "n.sdf:2: NumPoints 'two' is not a number");
  REQUIRE_THROWS_WITH(
      decode_sdf("bBCR-1.0\n", "n.sdf"),
      "n.sdf:1: binary SDF (bBCR-1.0) is not read; save it as ASCII SDF (aBCR-1.0)");
}

TEST_CASE("decode_x3p: round trip (ISO 25178-72, NaN for unreached)", "[io]") {
  Heightfield hf = field();
  hf.origin_x_mm = 0.5;
  const std::string zip = encode_x3p(hf);
  REQUIRE(zip.rfind("PK\x03\x04", 0) == 0);
  const Heightfield back = decode_x3p(zip, "a.x3p");
  require_same(hf, back, 1e-6);
  REQUIRE_NEAR(back.cell_mm, 0.02, 1e-12);
  REQUIRE_NEAR(back.origin_x_mm, 0.5, 1e-12);
}

TEST_CASE("decode_x3p: malformed archives give one-line errors", "[io]") {
  REQUIRE_THROWS_WITH(decode_x3p("not a zip", "b.x3p"),
                      "b.x3p: not an X3P file (not a zip archive)");
  const std::string good = encode_x3p(field());
  const std::string xml = read_zip_entry(good, "main.xml");
  // A point-data checksum that does not match data.bin (ISO 25178-72 MD5ChecksumPointData).
  const size_t at =
      xml.find("<MD5ChecksumPointData>") + std::string("<MD5ChecksumPointData>").size();
  std::string bad_md5 = xml;
  bad_md5.replace(at, 32, std::string(32, '0'));
  REQUIRE_THROWS_WITH(decode_x3p(replace_zip_entry(good, "main.xml", bad_md5), "b.x3p"),
                      "b.x3p: MD5 of bindata/data.bin does not match main.xml (damaged file)");
  std::string profile = xml;
  profile.replace(profile.find(">SUR<"), 5, ">PRF<");
  REQUIRE_THROWS_WITH(decode_x3p(replace_zip_entry(good, "main.xml", profile), "b.x3p"),
                      "b.x3p: main.xml FeatureType 'PRF' is not SUR (an areal surface)");
  REQUIRE_THROWS_WITH(decode_x3p(replace_zip_entry(good, "main.xml", "<oops"), "b.x3p"),
                      "b.x3p: main.xml is not well-formed XML (Error parsing start element tag)");
  REQUIRE_THROWS_WITH(decode_x3p(replace_zip_entry(good, "bindata/data.bin", "12345678"), "b.x3p"),
                      "b.x3p: bindata/data.bin holds 8 bytes, SizeX x SizeY of type D needs 120");
}

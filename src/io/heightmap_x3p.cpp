// X3P (ISO 25178-72) reader and writer with libzip (in-memory archives, loaded on first use:
// io/zip_library) and pugixml.
// Inputs/outputs: Heightfield <-> zip bytes. Cost O(cells).
// Method: ISO 25178-72:2017 / ISO 5436-2:2012 file layout; MD5 from io/md5_hex.
#include "io/heightmap_x3p.h"


#include <algorithm>
#include <bit>
#include <chrono>
#include <cmath>
#include <cstdint>
#include <cstdio>
#include <cstring>
#include <memory>
#include <pugixml.hpp>
#include <sstream>
#include <stdexcept>

#include "core/input_error.h"
#include "core/units.h"
#include "io/heightmap_text.h"
#include "io/md5_hex.h"
#include "io/zip_library.h"

namespace cuspmap {
namespace {

constexpr double kMetresPerMm = 1e-3;
constexpr double kUmPerMetre = 1e6;
// CX and CY increments agreeing to 1e-6 are one square cell.
constexpr double kSquareCellRel = 1e-6;
// The current time as the X3P schema's xsd:dateTime, UTC ("2026-12-04T14:05:09.0+00:00").
std::string iso8601_utc_now() {
  const auto now = std::chrono::floor<std::chrono::seconds>(std::chrono::system_clock::now());
  const auto day = std::chrono::floor<std::chrono::days>(now);
  const std::chrono::year_month_day ymd{day};
  const std::chrono::hh_mm_ss hms{now - day};
  char buf[40];
  std::snprintf(buf, sizeof buf, "%04d-%02u-%02uT%02d:%02d:%02d.0+00:00", int(ymd.year()),
                unsigned(ymd.month()), unsigned(ymd.day()), int(hms.hours().count()),
                int(hms.minutes().count()), int(hms.seconds().count()));
  return buf;
}

constexpr const char* kNamespace = "http://www.opengps.eu/2008/ISO5436_2";

// Child element by local name (the root carries a namespace prefix, the records do not, but
// tolerate prefixes anywhere).
pugi::xml_node child(pugi::xml_node node, const char* local) {
  for (pugi::xml_node c : node.children()) {
    const char* n = c.name();
    const char* colon = std::strrchr(n, ':');
    if (std::strcmp(colon ? colon + 1 : n, local) == 0) return c;
  }
  return {};
}

std::string text_at(pugi::xml_node root, std::initializer_list<const char*> path) {
  pugi::xml_node n = root;
  for (const char* p : path) n = child(n, p);
  return n ? std::string(n.child_value()) : std::string();
}

std::string trimmed(std::string s) {
  const size_t a = s.find_first_not_of(" \t\r\n"), b = s.find_last_not_of(" \t\r\n");
  return a == std::string::npos ? std::string() : s.substr(a, b - a + 1);
}

void add_text(pugi::xml_node parent, const char* name, const std::string& value) {
  parent.append_child(name).text().set(value.c_str());
}

void add_axis(pugi::xml_node axes, const char* name, const char* type, const char* data_type,
              const std::string& increment, const std::string& offset) {
  pugi::xml_node a = axes.append_child(name);
  add_text(a, "AxisType", type);
  add_text(a, "DataType", data_type);
  add_text(a, "Increment", increment);
  add_text(a, "Offset", offset);
}

// Closes a read-only archive on every path out of decode_x3p, throws included.
struct ZipDiscard {
  void operator()(zip_t* za) const { zip_library().discard(za); }
};
using ZipPtr = std::unique_ptr<zip_t, ZipDiscard>;

// main.xml holds four short records; 16 MiB is far beyond any real one (common practice, no
// source) and keeps a forged directory size from allocating gigabytes.
constexpr zip_uint64_t kMaxMainXmlBytes = zip_uint64_t{16} << 20;
// Entries are read in pieces of this size, so memory follows the bytes really inflated.
constexpr zip_uint64_t kReadChunkBytes = zip_uint64_t{1} << 20;

// Size the zip directory declares for an entry; throws when the entry is missing.
zip_uint64_t entry_size(zip_t* za, const char* entry, const std::string& name) {
  const ZipLibrary& zip = zip_library();
  zip_stat_t st;
  zip.stat_init(&st);
  if (zip.stat(za, entry, 0, &st) != 0 || !(st.valid & ZIP_STAT_SIZE)) {
    throw InputError(name + ": X3P archive has no " + std::string(entry));
  }
  return st.size;
}

// Reads an entry whose declared size the caller has bounded, chunk by chunk.
std::string read_entry(zip_t* za, const char* entry, zip_uint64_t size, const std::string& name) {
  const ZipLibrary& zip = zip_library();
  std::unique_ptr<zip_file_t, int (*)(zip_file_t*)> f(zip.fopen(za, entry, 0), zip.fclose);
  std::string out;
  bool ok = f != nullptr;
  while (ok && out.size() < size) {
    const size_t at = out.size();
    const zip_uint64_t want = std::min<zip_uint64_t>(kReadChunkBytes, size - at);
    out.resize(at + static_cast<size_t>(want));
    const zip_int64_t got = zip.fread(f.get(), out.data() + at, want);
    ok = got > 0;
    out.resize(at + static_cast<size_t>(std::max<zip_int64_t>(got, 0)));
  }
  if (!ok || out.size() != size) {
    throw InputError(name + ": X3P entry " + std::string(entry) + " cannot be read (damaged zip)");
  }
  return out;
}

double number_or(const std::string& text, double fallback, const std::string& name,
                 const char* what) {
  const std::string t = trimmed(text);
  if (t.empty()) return fallback;
  double v = 0.0;
  if (!parse_height_value(t, v) || std::isnan(v)) {
    throw InputError(name + ": main.xml " + what + " '" + t + "' is not a number");
  }
  return v;
}

}  // namespace

std::string encode_x3p(const Heightfield& hf) {
  std::string data(static_cast<size_t>(hf.cells()) * 8, '\0');
  for (std::int64_t k = 0; k < hf.cells(); ++k) {
    const double metres = static_cast<double>(hf.z_um.data()[k]) / kUmPerMetre;
    const std::uint64_t bits = std::bit_cast<std::uint64_t>(metres);
    for (int b = 0; b < 8; ++b)
      data[static_cast<size_t>(k) * 8 + static_cast<size_t>(b)] =
          static_cast<char>((bits >> (8 * b)) & 0xff);
  }
  pugi::xml_document doc;
  pugi::xml_node decl = doc.append_child(pugi::node_declaration);
  decl.append_attribute("version") = "1.0";
  decl.append_attribute("encoding") = "UTF-8";
  pugi::xml_node root = doc.append_child("p:ISO5436_2");
  root.append_attribute("xmlns:p") = kNamespace;
  pugi::xml_node r1 = root.append_child("Record1");
  add_text(r1, "Revision", "ISO5436 - 2000");
  add_text(r1, "FeatureType", "SUR");
  pugi::xml_node axes = r1.append_child("Axes");
  const std::string inc = format_coordinate(hf.cell_mm * kMetresPerMm);
  // Offsets are the first point's position: the centre of cell 0.
  add_axis(axes, "CX", "I", "D", inc, format_coordinate(hf.x_mm(0) * kMetresPerMm));
  add_axis(axes, "CY", "I", "D", inc, format_coordinate(hf.y_mm(0) * kMetresPerMm));
  add_axis(axes, "CZ", "A", "D", "1", "0");
  pugi::xml_node r2 = root.append_child("Record2");
  // The real time of writing (ISO 8601, UTC): a file the tool writes carries the true date.
  const std::string now = iso8601_utc_now();
  add_text(r2, "Date", now);
  add_text(r2, "Creator", "cuspmap");
  pugi::xml_node inst = r2.append_child("Instrument");
  add_text(inst, "Manufacturer", "none");
  add_text(inst, "Model", "cuspmap simulation");
  add_text(inst, "Serial", "0");
  add_text(inst, "Version", "0.1.0");
  add_text(r2, "CalibrationDate", now);  // a simulation has no calibration: the creation time
  pugi::xml_node probe = r2.append_child("ProbingSystem");
  add_text(probe, "Type", "NonContacting");
  add_text(probe, "Identification", "simulated heightfield");
  add_text(r2, "Comment", "heights of a simulated floor; unreached cells are NaN");
  pugi::xml_node r3 = root.append_child("Record3");
  pugi::xml_node dim = r3.append_child("MatrixDimension");
  add_text(dim, "SizeX", std::to_string(hf.nx));
  add_text(dim, "SizeY", std::to_string(hf.ny));
  add_text(dim, "SizeZ", "1");
  pugi::xml_node link = r3.append_child("DataLink");
  add_text(link, "PointDataLink", "bindata/data.bin");
  add_text(link, "MD5ChecksumPointData", md5_hex(data));
  add_text(root.append_child("Record4"), "ChecksumFile", "md5checksum.hex");
  std::ostringstream xml_out;
  doc.save(xml_out, "  ", pugi::format_default, pugi::encoding_utf8);
  const std::string xml = xml_out.str();
  const std::string checksum = md5_hex(xml) + " *main.xml\n";

  const ZipLibrary& zip = zip_library();
  zip_error_t err;
  zip.error_init(&err);
  zip_source_t* src = zip.source_buffer_create(nullptr, 0, 0, &err);
  zip_t* za = src ? zip.open_from_source(src, ZIP_TRUNCATE, &err) : nullptr;
  if (!za) {
    if (src) zip.source_free(src);
    throw std::runtime_error("libzip cannot create an archive in memory");
  }
  zip.source_keep(src);
  auto add = [&](const char* entry, const std::string& bytes) {
    zip_source_t* s = zip.source_buffer(za, bytes.data(), bytes.size(), 0);
    if (!s || zip.file_add(za, entry, s, ZIP_FL_ENC_UTF_8) < 0) {
      if (s) zip.source_free(s);
      throw std::runtime_error(std::string("libzip cannot add ") + entry);
    }
  };
  add("main.xml", xml);
  add("bindata/data.bin", data);
  add("md5checksum.hex", checksum);
  if (zip.close(za) != 0) {
    zip.discard(za);
    zip.source_free(src);
    throw std::runtime_error("libzip cannot finish the archive in memory");
  }
  std::string out;
  if (zip.source_open(src) == 0) {
    zip.source_seek(src, 0, SEEK_END);
    const zip_int64_t size = zip.source_tell(src);
    zip.source_seek(src, 0, SEEK_SET);
    out.resize(static_cast<size_t>(std::max<zip_int64_t>(size, 0)));
    const zip_int64_t got = zip.source_read(src, out.data(), out.size());
    zip.source_close(src);
    if (got != size) out.clear();
  }
  zip.source_free(src);
  if (out.empty()) throw std::runtime_error("libzip cannot read back the archive from memory");
  return out;
}

Heightfield decode_x3p(std::string_view bytes, const std::string& name) {
  const ZipLibrary& zip = zip_library();
  zip_error_t err;
  zip.error_init(&err);
  zip_source_t* src = zip.source_buffer_create(bytes.data(), bytes.size(), 0, &err);
  ZipPtr za(src ? zip.open_from_source(src, ZIP_RDONLY, &err) : nullptr);
  if (!za) {
    if (src) zip.source_free(src);
    throw InputError(name + ": not an X3P file (not a zip archive)");
  }
  const zip_uint64_t xml_size = entry_size(za.get(), "main.xml", name);
  if (xml_size > kMaxMainXmlBytes) {
    throw InputError(name + ": X3P entry main.xml declares " + std::to_string(xml_size) +
                     " bytes; at most " + std::to_string(kMaxMainXmlBytes) + " are allowed");
  }
  const std::string xml = read_entry(za.get(), "main.xml", xml_size, name);
  pugi::xml_document doc;
  const pugi::xml_parse_result parsed = doc.load_buffer(xml.data(), xml.size());
  if (!parsed) {
    throw InputError(name + ": main.xml is not well-formed XML (" + parsed.description() + ")");
  }
  const pugi::xml_node root = doc.document_element();
  auto fail = [&](const std::string& what) { throw InputError(name + ": main.xml " + what); };
  const char* rn = std::strrchr(root.name(), ':');
  if (std::strcmp(rn ? rn + 1 : root.name(), "ISO5436_2") != 0)
    fail("root element is not ISO5436_2");
  const std::string feature = trimmed(text_at(root, {"Record1", "FeatureType"}));
  if (feature != "SUR") fail("FeatureType '" + feature + "' is not SUR (an areal surface)");
  if (child(child(root, "Record3"), "DataList"))
    fail("holds an inline <DataList>; only binary data links are read");
  const std::string link = trimmed(text_at(root, {"Record3", "DataLink", "PointDataLink"}));
  if (link.empty()) fail("has no Record3/DataLink/PointDataLink");
  const double sx =
      number_or(text_at(root, {"Record3", "MatrixDimension", "SizeX"}), -1, name, "SizeX");
  const double sy =
      number_or(text_at(root, {"Record3", "MatrixDimension", "SizeY"}), -1, name, "SizeY");
  const double sz =
      number_or(text_at(root, {"Record3", "MatrixDimension", "SizeZ"}), 1, name, "SizeZ");
  if (sx < 1 || sy < 1 || sx != std::floor(sx) || sy != std::floor(sy))
    fail("SizeX and SizeY must be whole numbers >= 1");
  if (sx * sy > static_cast<double>(kMaxHeightmapCells)) {
    fail("SizeX x SizeY = " + format_number(sx * sy) + " cells is over the limit of " +
         std::to_string(kMaxHeightmapCells) + " cells");
  }
  if (sz != 1) fail("SizeZ " + format_number(sz) + " is not 1 (layered data is not read)");
  const double inc_x =
      number_or(text_at(root, {"Record1", "Axes", "CX", "Increment"}), -1, name, "CX Increment");
  const double inc_y =
      number_or(text_at(root, {"Record1", "Axes", "CY", "Increment"}), inc_x, name, "CY Increment");
  if (!(inc_x > 0.0)) fail("CX Increment must be > 0 m");
  if (sy > 1 && std::abs(inc_y - inc_x) > kSquareCellRel * inc_x) {
    fail("CX Increment " + format_number(inc_x) + " m differs from CY Increment " +
         format_number(inc_y) + " m; cuspmap needs square cells");
  }
  const double off_x =
      number_or(text_at(root, {"Record1", "Axes", "CX", "Offset"}), 0, name, "CX Offset");
  const double off_y =
      number_or(text_at(root, {"Record1", "Axes", "CY", "Offset"}), 0, name, "CY Offset");
  const std::string type = trimmed(text_at(root, {"Record1", "Axes", "CZ", "DataType"}));
  const double inc_z =
      number_or(text_at(root, {"Record1", "Axes", "CZ", "Increment"}), 1, name, "CZ Increment");
  const double off_z =
      number_or(text_at(root, {"Record1", "Axes", "CZ", "Offset"}), 0, name, "CZ Offset");
  size_t item = 0;
  if (type == "I")
    item = 2;
  else if (type == "L" || type == "F")
    item = 4;
  else if (type == "D")
    item = 8;
  else
    fail("CZ DataType '" + type + "' is not I, L, F or D");
  const std::string expected_md5 =
      trimmed(text_at(root, {"Record3", "DataLink", "MD5ChecksumPointData"}));
  const long nx = static_cast<long>(sx), ny = static_cast<long>(sy);
  const zip_uint64_t need = static_cast<zip_uint64_t>(nx * ny) * item;
  const zip_uint64_t declared = entry_size(za.get(), link.c_str(), name);
  if (declared != need) {
    throw InputError(name + ": " + link + " holds " + std::to_string(declared) +
                     " bytes, SizeX x SizeY of type " + type + " needs " + std::to_string(need));
  }
  const std::string data = read_entry(za.get(), link.c_str(), need, name);
  za.reset();
  if (!expected_md5.empty()) {
    std::string want = expected_md5;
    for (char& c : want) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    if (md5_hex(data) != want)
      throw InputError(name + ": MD5 of " + link + " does not match main.xml (damaged file)");
  }
  Heightfield hf;
  hf.nx = static_cast<int>(nx);
  hf.ny = static_cast<int>(ny);
  hf.cell_mm = inc_x / kMetresPerMm;
  hf.origin_x_mm = off_x / kMetresPerMm - 0.5 * hf.cell_mm;  // offset = first cell's centre
  hf.origin_y_mm = off_y / kMetresPerMm - 0.5 * hf.cell_mm;
  hf.z_um.resize(hf.ny, hf.nx);
  for (long k = 0; k < nx * ny; ++k) {
    const unsigned char* p =
        reinterpret_cast<const unsigned char*>(data.data()) + static_cast<size_t>(k) * item;
    std::uint64_t bits = 0;
    for (size_t b = 0; b < item; ++b) bits |= static_cast<std::uint64_t>(p[b]) << (8 * b);
    double v = 0.0;
    if (type == "I")
      v = static_cast<std::int16_t>(bits);
    else if (type == "L")
      v = static_cast<std::int32_t>(bits);
    else if (type == "F")
      v = std::bit_cast<float>(static_cast<std::uint32_t>(bits));
    else
      v = std::bit_cast<double>(bits);
    hf.z_um.data()[k] = static_cast<float>((v * inc_z + off_z) * kUmPerMetre);
  }
  return hf;
}

}  // namespace cuspmap

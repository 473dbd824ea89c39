// Tests for io/html_report and io/base64: escaping, RFC 4648 vectors and round trip, sections,
// best-of-column marks, cautions, embedded pictures.
#include "report/html_report.h"

#include <random>

#include "report/base64.h"
#include "test_support.h"

using namespace cuspmap;

namespace {

// Independent decoder (test-only) for the round trip: RFC 4648 sec. 4 read backwards.
std::string base64_decode(const std::string& text) {
  const std::string alphabet = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";
  std::string out;
  unsigned buffer = 0;
  int bits = 0;
  for (char c : text) {
    if (c == '=') break;
    const std::size_t v = alphabet.find(c);
    REQUIRE(v != std::string::npos);
    buffer = (buffer << 6) | static_cast<unsigned>(v);
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      out += static_cast<char>((buffer >> bits) & 0xFF);
    }
  }
  return out;
}

std::size_t count(const std::string& hay, const std::string& needle) {
  std::size_t n = 0;
  for (std::size_t at = hay.find(needle); at != std::string::npos; at = hay.find(needle, at + 1))
    ++n;
  return n;
}

HtmlReport sample() {
  HtmlReport r;
  r.title = "Pump cover <floor> & \"pocket\"";
  r.subtitle = "simulated finishing pass";
  r.inputs = {{"tool", "ball, 6 mm"}, {"stepover", "0.3 mm"}};
  HtmlTable t;
  t.caption = "Strategies";
  t.columns = {"name", "Ra um", "path length mm"};
  t.best = {BestIs::None, BestIs::Lowest, BestIs::Highest};
  t.rows = {{{"zigzag"}, {"0.41", 0.41}, {"1200", 1200.0}},
            {{"one-way"}, {"0.29", 0.29}, {"900", 900.0}},
            {{"spiral"}, {"0.29", 0.29}, {"1000", 1000.0}}};
  r.tables = {t};
  r.images = {{std::string("\x89PNG\r\n\x1a\n", 8), "height picture", "height, 0..2 um"}};
  r.profile_plots = {{"PLOT", "profile plot", "cross-feed profile"}};
  r.filters = {"Gaussian filter ISO 16610-21, cut-off 0.8 mm"};
  r.notes = {"tool.dish_deg ignored for a ball"};
  r.cautions = {"Extra <caution>"};
  return r;
}

}  // namespace

TEST_CASE("html_escape: the five HTML special characters become entities", "[report]") {
  REQUIRE(html_escape("<a href=\"x\">&'</a>") ==
          "&lt;a href=&quot;x&quot;&gt;&amp;&#39;&lt;/a&gt;");
  REQUIRE(html_escape("\xC2\xB5m 3") == "\xC2\xB5m 3");  // UTF-8 passes unchanged
}

TEST_CASE("base64_encode: RFC 4648 sec. 10 test vectors", "[report]") {
  // RFC 4648, "The Base16, Base32, and Base64 Data Encodings", 2006, section 10.
  REQUIRE(base64_encode("") == "");
  REQUIRE(base64_encode("f") == "Zg==");
  REQUIRE(base64_encode("fo") == "Zm8=");
  REQUIRE(base64_encode("foo") == "Zm9v");
  REQUIRE(base64_encode("foob") == "Zm9vYg==");
  REQUIRE(base64_encode("fooba") == "Zm9vYmE=");
  REQUIRE(base64_encode("foobar") == "Zm9vYmFy");
}

TEST_CASE("base64_encode: random binary data round-trips", "[report]") {
  std::mt19937 rng(4648);
  for (int n = 0; n < 70; ++n) {
    std::string bytes(static_cast<std::size_t>(n), '\0');
    for (char& c : bytes) c = static_cast<char>(rng() & 0xFF);
    const std::string text = base64_encode(bytes);
    CAPTURE(n);
    REQUIRE(text.size() == (bytes.size() + 2) / 3 * 4);
    REQUIRE(base64_decode(text) == bytes);
  }
}

TEST_CASE("render_html_report: every section present, text escaped, pictures embedded", "[report]") {
  const std::string html = render_html_report(sample());
  REQUIRE(html.rfind("<!DOCTYPE html>", 0) == 0);
  REQUIRE(html.find("<meta charset=\"utf-8\">") != std::string::npos);
  REQUIRE(count(html, "Pump cover &lt;floor&gt; &amp; &quot;pocket&quot;") == 2);  // title, h1
  REQUIRE(html.find("<floor>") == std::string::npos);
  for (const char* id : {"inputs", "results", "pictures", "profiles", "filters", "notes",
                         "how-to-read", "cautions"}) {
    CAPTURE(id);
    REQUIRE(html.find(std::string("<section id=\"") + id + "\">") != std::string::npos);
  }
  REQUIRE(html.find("src=\"data:image/png;base64," +
                    base64_encode(std::string("\x89PNG\r\n\x1a\n", 8)) + "\"") !=
          std::string::npos);
  REQUIRE(html.find("src=\"data:image/png;base64,UExPVA==\"") != std::string::npos);  // "PLOT"
  REQUIRE(html.find("<figcaption>height, 0..2 um</figcaption>") != std::string::npos);
  REQUIRE(html.find("<li>Gaussian filter ISO 16610-21, cut-off 0.8 mm</li>") != std::string::npos);
  REQUIRE(html.find("document.body.dataset.imagesLoaded") != std::string::npos);
  REQUIRE(html.find("@media print") != std::string::npos);
  REQUIRE(html.find("break-inside: avoid") != std::string::npos);
}

TEST_CASE("render_html_report: best value per column marked by class and symbol, ties too",
          "[report]") {
  const std::string html = render_html_report(sample());
  // Ra: lowest 0.29 twice (tie); path length: highest 1200 once; the name column is not ranked.
  REQUIRE(count(html, "<td class=\"num best\">") == 3);
  REQUIRE(count(html, "<span class=\"sr\">best: </span>0.29</td>") == 2);
  REQUIRE(count(html, "<span class=\"sr\">best: </span>1200</td>") == 1);
  REQUIRE(count(html, "\u2605</span>") == 3);
  REQUIRE(html.find("lowest is best for Ra um; highest is best for path length mm") !=
          std::string::npos);
}

TEST_CASE("render_html_report: safety cautions and the reading guide are always there", "[report]") {
  HtmlReport bare;
  bare.title = "t";
  const std::string html = render_html_report(bare);
  for (const std::string& c : standard_cautions())
    REQUIRE(html.find(html_escape(c)) != std::string::npos);
  REQUIRE(html.find("combustible") != std::string::npos);
  REQUIRE(html.find("harmful to breathe") != std::string::npos);
  REQUIRE(html.find("workholding") != std::string::npos);
  REQUIRE(html.find("Rotating tools") != std::string::npos);
  REQUIRE(html.find("local codes, the machine maker") != std::string::npos);
  REQUIRE(html.find("Dark is low") != std::string::npos);
  REQUIRE(html.find("cut-off") != std::string::npos);
  REQUIRE(html.find("<section id=\"inputs\">") == std::string::npos);  // empty parts left out
  REQUIRE(render_html_report(sample()).find("<li>Extra &lt;caution&gt;</li>") != std::string::npos);
}

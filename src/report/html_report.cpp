// Self-contained HTML report page: escaped text, base64 PNGs, best-of-column marks, print CSS.
// Inputs: HtmlReport (strings, numbers, PNG bytes); output: UTF-8 HTML text.
// Method: HTML5 + CSS Paged Media (break-inside/page-break-inside), RFC 4648 data: URIs.
#include "report/html_report.h"

#include <cmath>

#include "cusp/kinematic_limits.h"
#include "report/base64.h"

namespace cuspmap {
namespace {

// Screen: a readable column. Print: A4 (210 mm) and Letter (215.9 mm) both fit a 186 mm text
// block inside 12 mm margins; figures, table rows and the cautions never split across pages.
constexpr const char* kStyle = R"css(
:root { color-scheme: light; }
body { font-family: "DejaVu Sans", Arial, Helvetica, sans-serif; color: #111; background: #fff;
       margin: 0 auto; padding: 1.2rem; max-width: 62rem; line-height: 1.45; }
h1 { font-size: 1.6rem; margin: 0 0 .2rem; }
h2 { font-size: 1.2rem; margin: 1.6rem 0 .5rem; border-bottom: 1px solid #999; }
p.subtitle { margin: 0 0 1rem; color: #333; }
table { border-collapse: collapse; margin: .4rem 0 .6rem; }
caption { text-align: left; font-weight: bold; padding: .2rem 0; }
th, td { border: 1px solid #888; padding: .25rem .55rem; text-align: left; vertical-align: top; }
td.num { text-align: right; font-variant-numeric: tabular-nums; }
th { background: #eee; }
td.best { font-weight: bold; background: #e8e8e8; }
.mark { margin-right: .25rem; }
.sr { position: absolute; width: 1px; height: 1px; overflow: hidden; clip: rect(0 0 0 0); }
p.key { font-size: .9rem; color: #333; margin-top: 0; }
figure { margin: .8rem 0 1.2rem; }
figure img { display: block; max-width: 100%; height: auto; border: 1px solid #bbb; }
figcaption { font-size: .92rem; color: #222; margin-top: .3rem; }
section#cautions { border: 2px solid #111; padding: .2rem 1rem .6rem; }
section#cautions h2 { border-bottom: none; }
dl.read dt { font-weight: bold; margin-top: .5rem; }
dl.read dd { margin: 0 0 0 1.2rem; }
@page { margin: 12mm; }
@media print {
  body { max-width: 186mm; padding: 0; font-size: 10pt; }
  h2 { break-after: avoid; page-break-after: avoid; }
  figure, tr, section#cautions, dl.read { break-inside: avoid; page-break-inside: avoid; }
  figure img { max-height: 230mm; }
  section#cautions { break-before: auto; }
  a { color: inherit; text-decoration: none; }
}
)css";

// Sets data-images-loaded on <body> once every <img> has decoded (naturalWidth > 0).
constexpr const char* kScript = R"js(
(function () {
  function check() {
    var imgs = document.images, ok = true;
    for (var i = 0; i < imgs.length; i++) {
      if (!(imgs[i].complete && imgs[i].naturalWidth > 0)) ok = false;
    }
    document.body.dataset.imagesLoaded = ok ? "true" : "false";
    document.body.dataset.imageCount = String(imgs.length);
  }
  if (document.readyState === "complete") check(); else window.addEventListener("load", check);
})();
)js";

// The reading guide, written for the shop floor.
constexpr const char* kHowToRead = R"html(
<dl class="read">
<dt>Height picture</dt>
<dd>The floor seen from above, +Y up. Dark is low, light is high; the legend gives the height
range in the units shown. Pure white marks spots the tool never reached. Unless a fixed range
was set, each picture stretches its own lowest-to-highest range, so compare pictures by their
legends, not by their grays. Where several floors are compared, each floor has two height
pictures, titled on the picture: one on the <em>shared scale</em> (the same gray is the same
height on every floor, so a shallow floor looks dark and even) and one on its <em>own
range</em> (its lowest point black, its highest light gray, so its marks show).</dd>
<dt>Shaded picture</dt>
<dd>The same floor lit from one side at a low angle, with the heights exaggerated (the factor is
in the caption). It shows the lay &mdash; the direction, spacing and pattern of the tool marks
&mdash; the way a work light held at a grazing angle does, even where the marks are far shallower
than a micrometre. Use it to judge the look and the pattern, not the depth. A whole floor is
drawn with several cells per pixel, averaged so that marks finer than a pixel (tooth marks on a
large floor) show as an even gray rather than as false stripes.</dd>
<dt>Detail pictures</dt>
<dd>A window of about 1.5 mm drawn cell by cell, placed where the marks are deepest and
outlined in orange on the whole-floor pictures; the caption gives its position. Here single
tooth marks &mdash; the rim arcs of a flat end mill, the feed marks of a ball &mdash; can be
counted; their spacing is the feed per tooth.</dd>
<dt>Ra</dt>
<dd>The average distance of a profile from its mean line: the number most drawings call for.</dd>
<dt>Rz</dt>
<dd>The average peak-to-valley height of five sampling lengths: closer to what a fingernail
feels and to what sanding must take off.</dd>
<dt>Sa and Sz</dt>
<dd>Sa is Ra taken over the whole area instead of along one line; Sz is the highest peak to the
deepest valley over the area.</dd>
<dt>Cut-off</dt>
<dd>The cut-off (&lambda;c) decides which wavelengths count as roughness. A cut-off shorter
than the stepover filters the cusps away and gives a lower Ra; a longer one counts them. Compare
Ra values only at the same cut-off, and quote it with the value.</dd>
<dt>Predictions</dt>
<dd>All numbers and pictures here come from a model of the cutter and the path, not from a
measurement. Check the first part with a gauge before relying on them.</dd>
</dl>
)html";

constexpr const char* kBestMark = "\u2605";  // BLACK STAR

void list(std::string& out, const std::vector<std::string>& items) {
  out += "<ul>\n";
  for (const std::string& item : items) out += "<li>" + html_escape(item) + "</li>\n";
  out += "</ul>\n";
}

void figure(std::string& out, const HtmlImage& image) {
  out += "<figure><img src=\"data:image/png;base64," + base64_encode(image.png) + "\" alt=\"" +
         html_escape(image.alt) + "\">";
  if (!image.caption.empty()) out += "<figcaption>" + html_escape(image.caption) + "</figcaption>";
  out += "</figure>\n";
}

// Appends <section id=..><h2>heading</h2>, the body, </section>; nothing when items is empty.
template <class T, class Body>
void section(std::string& out, const char* id, const char* heading, const std::vector<T>& items,
             Body body) {
  if (items.empty()) return;
  out += std::string("<section id=\"") + id + "\">\n<h2>" + heading + "</h2>\n";
  body();
  out += "</section>\n";
}

BestIs best_rule(const HtmlTable& t, std::size_t column) {
  return column < t.best.size() ? t.best[column] : BestIs::None;
}

void table(std::string& out, const HtmlTable& t) {
  // The best value per ranked column; ties are all marked.
  std::vector<double> best(t.columns.size(), std::nan(""));
  for (std::size_t c = 0; c < t.columns.size(); ++c) {
    const BestIs rule = best_rule(t, c);
    if (rule == BestIs::None) continue;
    for (const auto& row : t.rows) {
      if (c >= row.size() || !std::isfinite(row[c].value)) continue;
      const double v = row[c].value;
      if (std::isnan(best[c]) || (rule == BestIs::Lowest ? v < best[c] : v > best[c])) best[c] = v;
    }
  }
  out += "<table>\n";
  if (!t.caption.empty()) out += "<caption>" + html_escape(t.caption) + "</caption>\n";
  out += "<thead><tr>";
  for (const std::string& h : t.columns) out += "<th scope=\"col\">" + html_escape(h) + "</th>";
  out += "</tr></thead>\n<tbody>\n";
  bool any_best = false;
  for (const auto& row : t.rows) {
    out += "<tr>";
    for (std::size_t c = 0; c < row.size() && c < t.columns.size(); ++c) {
      const HtmlCell& cell = row[c];
      const bool numeric = !std::isnan(cell.value);
      const bool is_best = numeric && !std::isnan(best[c]) && cell.value == best[c];
      std::string cls = numeric ? "num" : "";
      if (is_best) cls += cls.empty() ? "best" : " best";
      out += cls.empty() ? "<td>" : "<td class=\"" + cls + "\">";
      if (is_best) {
        any_best = true;
        out += std::string("<span class=\"mark\" aria-hidden=\"true\">") + kBestMark +
               "</span><span class=\"sr\">best: </span>";
      }
      out += html_escape(cell.text) + "</td>";
    }
    out += "</tr>\n";
  }
  out += "</tbody>\n</table>\n";
  if (any_best) {
    std::string lowest, highest;
    for (std::size_t c = 0; c < t.columns.size(); ++c) {
      std::string& target = best_rule(t, c) == BestIs::Lowest ? lowest : highest;
      if (best_rule(t, c) == BestIs::None) continue;
      target += (target.empty() ? "" : ", ") + html_escape(t.columns[c]);
    }
    out += std::string("<p class=\"key\">") + kBestMark + " marks the best value of a column";
    if (!lowest.empty()) out += "; lowest is best for " + lowest;
    if (!highest.empty()) out += "; highest is best for " + highest;
    out += ".</p>\n";
  }
}

}  // namespace

std::string html_escape(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '&':
        out += "&amp;";
        break;
      case '<':
        out += "&lt;";
        break;
      case '>':
        out += "&gt;";
        break;
      case '"':
        out += "&quot;";
        break;
      case '\'':
        out += "&#39;";
        break;
      default:
        out += c;
    }
  }
  return out;
}

std::vector<std::string> standard_cautions() {
  return {
      "Rotating tools cut and pull in: keep guards closed and hands, sleeves, hair and jewellery "
      "clear; stop the spindle before measuring, deburring or touching the part.",
      "Check the workholding before every cut: a part, clamp or fixture that comes loose at "
      "spindle speed is thrown with great force.",
      "Fine metal dust from sanding and polishing is combustible (aluminium, magnesium and "
      "titanium dust especially) and harmful to breathe: use dust extraction and respiratory "
      "protection, keep sparks and flames away, and never collect light-alloy dust together with "
      "sparks from grinding steel.",
      std::string(kKinematicBestCase) +
          " These figures are predictions from a model, not measurements: check the first part "
          "before relying on them.",
      "Follow local codes, the machine maker's instructions and licensed practice; they take "
      "precedence over anything in this report.",
  };
}

std::string cautions_help_text(const std::vector<std::string>& cautions) {
  std::string text = "Cautions:\n";
  for (const std::string& c : cautions) text += "  - " + c + "\n";
  return text;
}

std::string render_html_report(const HtmlReport& r) {
  std::string out;
  out += "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n";
  out += "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n";
  out += "<title>" + html_escape(r.title) + "</title>\n<style>" + kStyle + "</style>\n</head>\n";
  out += "<body>\n<main>\n<h1>" + html_escape(r.title) + "</h1>\n";
  if (!r.subtitle.empty()) out += "<p class=\"subtitle\">" + html_escape(r.subtitle) + "</p>\n";
  if (!r.inputs.empty()) {
    out += "<section id=\"inputs\">\n<h2>Inputs</h2>\n<table class=\"kv\">\n<tbody>\n";
    for (const HtmlKeyValue& kv : r.inputs) {
      out += "<tr><th scope=\"row\">" + html_escape(kv.key) + "</th><td>" + html_escape(kv.value) +
             "</td></tr>\n";
    }
    out += "</tbody>\n</table>\n</section>\n";
  }
  section(out, "results", "Results", r.tables, [&] {
    for (const HtmlTable& t : r.tables) table(out, t);
  });
  section(out, "pictures", "Pictures", r.images, [&] {
    for (const HtmlImage& image : r.images) figure(out, image);
  });
  section(out, "profiles", "Profiles", r.profile_plots, [&] {
    for (const HtmlImage& image : r.profile_plots) figure(out, image);
  });
  section(out, "filters", "Cut-off and filters used", r.filters, [&] { list(out, r.filters); });
  section(out, "notes", "Notes", r.notes, [&] { list(out, r.notes); });
  out += "<section id=\"how-to-read\">\n<h2>How to read this report</h2>\n";
  out += kHowToRead;
  out += "</section>\n<section id=\"cautions\">\n<h2>Safety</h2>\n";
  std::vector<std::string> cautions = standard_cautions();
  cautions.insert(cautions.end(), r.cautions.begin(), r.cautions.end());
  list(out, cautions);
  out += "</section>\n</main>\n<script>";
  out += kScript;
  out += "</script>\n</body>\n</html>\n";
  return out;
}

}  // namespace cuspmap

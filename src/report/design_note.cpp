#include "report/design_note.h"

#include "report/device_report.h"
#include "report/markdown_html.h"
#include "report/markdown_report.h"
#include "report/real_parts_text.h"
#include "report/table.h"
#include "report/text_escape.h"

namespace hushgain {

const char* const kDesignNoteCaution =
    "hushgain estimates; it does not certify. Its numbers come from linear "
    "models with generic device classes or the user's own part data and "
    "ideal, uncorrelated noise sources; a real part, a real board (leakage, "
    "dielectric absorption, interference, thermocouple junctions, layout "
    "parasitics) and a real sensor will differ. Front ends connected to "
    "patients, mains-powered sensors and safety systems are governed by their "
    "applicable standards (for example the IEC 60601 and IEC 61010 families, "
    "functional-safety standards) and by licensed engineering practice: "
    "verify every design by measurement and by the review those standards "
    "require, and treat this budget as a starting estimate, not as evidence "
    "of compliance.";

namespace {

// The note up to the plot sheet, as Markdown.
std::string Opening(const DesignNoteInput& in) {
  const Budget& b = *in.budget;
  std::string md = "# Design note: " + EscapeMarkdown(b.stage_name) + "\n\n";
  md += "- stage file: " + EscapeMarkdown(in.stage_file) + "\n";
  md += "- computed by: " + EscapeMarkdown(in.version) + "\n\n";
  md += "## The op-amp\n\n";
  md += "- " + EscapeMarkdown(in.opamp->class_name) + ": " +
        EscapeMarkdown(in.opamp_data) + "\n\n";
  md += RenderMarkdown(OpAmpParameterTable(*in.opamp)) + "\n";
  md += BudgetToMarkdown(b);
  return md;
}

std::string RealParts(const Budget& b) { return RealPartsText(b); }

std::string Closing() {
  return "## Cautions\n\n" + EscapeMarkdown(kDesignNoteCaution) + "\n";
}

const char* const kStyle = R"(
body { font-family: sans-serif; max-width: 60em; margin: 2em auto; padding: 0 1em; color: #111; line-height: 1.4; }
h1 { font-size: 1.6em; border-bottom: 2px solid #333; padding-bottom: .2em; }
h2 { font-size: 1.3em; margin-top: 1.6em; border-bottom: 1px solid #999; }
h3 { font-size: 1.1em; margin-top: 1.2em; }
table { border-collapse: collapse; margin: .6em 0; font-size: .9em; }
th, td { border: 1px solid #bbb; padding: .2em .5em; text-align: left; }
th { background: #eee; }
td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
blockquote { border-left: 4px solid #c60; background: #fff4e8; margin: .6em 0; padding: .4em .8em; }
pre { background: #f6f6f6; padding: .6em; overflow-x: auto; font-size: .85em; }
figure { margin: 1em 0; }
figure svg { max-width: 100%; height: auto; }
@media print {
  body { max-width: none; margin: 0; font-size: 10pt; }
  h2 { page-break-after: avoid; }
  table, figure, pre { page-break-inside: avoid; }
  blockquote { background: none; }
}
)";

// The SVG document from its "<svg" on: the XML declaration and DOCTYPE
// are not allowed inside HTML.
std::string InlineSvg(const std::string& svg) {
  const std::size_t start = svg.find("<svg");
  return start == std::string::npos ? std::string() : svg.substr(start);
}

}  // namespace

std::string DesignNoteMarkdown(const DesignNoteInput& in) {
  std::string md = Opening(in);
  if (const std::string parts = RealParts(*in.budget); !parts.empty())
    md += "\n## Real parts\n\n```\n" + parts +
          (parts.back() == '\n' ? "" : "\n") + "```\n";
  md += "\n## Plots\n\n![noise density, cumulative noise and gains](" +
        in.sheet + ")\n\n";
  md += Closing();
  return md;
}

std::string DesignNoteHtml(const DesignNoteInput& in) {
  std::string html =
      "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n"
      "<title>Design note: " +
      EscapeHtml(in.budget->stage_name) + "</title>\n<style>" + kStyle +
      "</style>\n</head>\n<body>\n";
  html += MarkdownToHtml(Opening(in));
  if (const std::string parts = RealParts(*in.budget); !parts.empty())
    html += "<h2>Real parts</h2>\n<pre>" + EscapeHtml(parts) + "</pre>\n";
  html += "<h2>Plots</h2>\n<figure>\n" + InlineSvg(in.sheet) +
          "\n<figcaption>Noise density, cumulative noise and gains "
          "(gnuplot).</figcaption>\n</figure>\n";
  html += MarkdownToHtml(Closing());
  html += "</body>\n</html>\n";
  return html;
}

}  // namespace hushgain

// The Markdown subset of hushgain's reports, as HTML (report/markdown_html.h).
// Expected strings written by hand from the HTML 5 elements (WHATWG HTML
// Living Standard: h2, ul/li, table/thead/tbody, blockquote, p) and the
// CommonMark rules the reports rely on (backslash escapes of ASCII
// punctuation; pipe tables as GitHub-flavoured Markdown defines them).
#include "report/markdown_html.h"

#include <doctest/doctest.h>

#include "report/markdown_report.h"
#include "report/text_escape.h"
#include "test_support.h"

namespace hushgain {
namespace {

TEST_CASE("headings, lists, paragraphs and quotes become their elements") {
  CHECK(MarkdownToHtml("## Noise budget\n") == "<h2>Noise budget</h2>\n");
  CHECK(MarkdownToHtml("### Offsets\n", 1) == "<h4>Offsets</h4>\n");
  CHECK(MarkdownToHtml("- band: 10 Hz\n- reference: 1 kHz\n") ==
        "<ul>\n<li>band: 10 Hz</li>\n<li>reference: 1 kHz</li>\n</ul>\n");
  CHECK(MarkdownToHtml("one line\nand the next\n\nanother\n") ==
        "<p>one line and the next</p>\n<p>another</p>\n");
  CHECK(MarkdownToHtml("> warning: the swing exceeds the supply\n") ==
        "<blockquote>warning: the swing exceeds the supply</blockquote>\n");
}

TEST_CASE("a pipe table keeps its cells and right-aligns the ---: columns") {
  const std::string md =
      "| contributor | share |\n| --- | ---: |\n| R\\_in | 66.0 % |\n"
      "| a \\| b | \\<0.1 % |\n";
  CHECK(MarkdownToHtml(md) ==
        "<table>\n<thead><tr><th>contributor</th><th class=\"num\">share</th>"
        "</tr></thead>\n<tbody>\n<tr><td>R_in</td><td class=\"num\">66.0 %"
        "</td></tr>\n<tr><td>a | b</td><td class=\"num\">&lt;0.1 %</td></tr>\n"
        "</tbody>\n</table>\n");
}

TEST_CASE("text from the stage file never becomes markup") {
  const std::string name = "<script>alert(\"x\")</script> & 'q' *b* [l](u)";
  const std::string html = MarkdownToHtml("## " + EscapeMarkdown(name) + "\n");
  CHECK(
      html ==
      "<h2>&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt; &amp; &#39;q&#39; "
      "*b* [l](u)</h2>\n");
}

TEST_CASE("every line of a budget's Markdown reaches the HTML") {
  // The T-network stage of the test suite; each table row's first cell and
  // each list item's text must appear once converted.
  const Budget b = test::ComputeOrFail(
      test::TeeStage(10e3, 100e3, 100e3, 1.02e3, test::IdealOpAmp(6e-9, 3e-15)),
      1e-4);
  const std::string md = BudgetToMarkdown(b);
  const std::string html = MarkdownToHtml(md);
  int rows = 0;
  for (std::size_t start = 0; start < md.size();) {
    std::size_t end = md.find('\n', start);
    if (end == std::string::npos) end = md.size();
    const std::string line = md.substr(start, end - start);
    start = end + 1;
    if (line.rfind("- ", 0) == 0) {
      const std::string item = line.substr(2, line.find(':') - 2);
      CHECK(html.find("<li>" + EscapeHtml(item)) != std::string::npos);
      ++rows;
    }
  }
  CHECK(rows >= 5);
  CHECK(html.find("<table>") != std::string::npos);
  CHECK(html.find("\\") == std::string::npos);  // every escape resolved
}

}  // namespace
}  // namespace hushgain

// The Markdown that hushgain's own reports write, as HTML: the subset they
// use and nothing more, so the design note (report/design_note.h) shows
// exactly the sections of `--format markdown` without a second copy of any
// section.
//   "## t", "### t"          <h2>, <h3> (a heading level shifts by `shift`)
//   "- item" lines           one <ul>
//   "| a | b |" + "| --- | ---: |" + rows
//                            <table> with a <thead>; "---:" right-aligns
//   "> text"                 <blockquote>
//   other lines              <p>, consecutive lines joined
// Inline, a backslash escape "\X" stands for X (report/text_escape.h's
// EscapeMarkdown); every character is then HTML-escaped, so text from the
// stage file cannot become markup. No emphasis, links or images: the
// reports write none.
#ifndef HUSHGAIN_REPORT_MARKDOWN_HTML_H_
#define HUSHGAIN_REPORT_MARKDOWN_HTML_H_

#include <string>
#include <string_view>

namespace hushgain {

// &, <, >, " and ' as entities.
std::string EscapeHtml(std::string_view text);

std::string MarkdownToHtml(std::string_view markdown, int heading_shift = 0);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_MARKDOWN_HTML_H_

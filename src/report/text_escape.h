// Quoting text for the languages hushgain writes, so that a stage or
// contributor name is always shown as text and never read as markup or code.
#ifndef HUSHGAIN_REPORT_TEXT_ESCAPE_H_
#define HUSHGAIN_REPORT_TEXT_ESCAPE_H_

#include <string>
#include <string_view>

namespace hushgain {

// Markdown (CommonMark / GitHub tables): a backslash before each of
//   \ ` * _ [ ] < > | ~ #
// (all ASCII punctuation may be backslash-escaped in CommonMark); line
// breaks become spaces, so a cell or heading stays on one line.
std::string EscapeMarkdown(std::string_view text);

// One CSV field per RFC 4180: quoted when it holds a comma, a double quote,
// CR or LF (or starts or ends with a space), with each double quote doubled.
std::string CsvField(std::string_view text);

// A gnuplot single-quoted string literal, quotes included. Inside single
// quotes gnuplot does no backslash, backquote (`...`) or macro (@name)
// processing; the only special sequence is '' for one quote. Control
// characters (a newline would end the command) become spaces. Meant for
// terminals set `noenhanced`, so ^ _ { } @ & are drawn as they are.
std::string GnuplotString(std::string_view text);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TEXT_ESCAPE_H_

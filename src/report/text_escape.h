// Quoting text for the languages hushgain writes, so that a stage or
// contributor name is always shown as text and never read as markup or code.
#ifndef HUSHGAIN_REPORT_TEXT_ESCAPE_H_
#define HUSHGAIN_REPORT_TEXT_ESCAPE_H_

#include <string>
#include <string_view>

namespace hushgain {

// Plain text for the text reports: one line, every control character made
// visible (\n, \r, \t, \xHH, \u00HH: base/control_characters.h), so a stage
// name cannot split a line or drive the terminal (ESC, BEL, CSI).
std::string EscapeText(std::string_view text);

// Markdown (CommonMark / GitHub tables): a backslash before each of
//   \ ` * _ [ ] < > | ~ #
// (all ASCII punctuation may be backslash-escaped in CommonMark); line
// breaks become spaces, so a cell or heading stays on one line; other
// control characters are made visible as EscapeText does.
std::string EscapeMarkdown(std::string_view text);

// A Markdown list item "- label: text\n", the text escaped.
std::string MarkdownItem(const std::string& label, const std::string& text);

// One CSV field per RFC 4180: quoted when it holds a comma, a double quote,
// CR or LF (or starts or ends with a space), with each double quote doubled.
std::string CsvField(std::string_view text);

// A gnuplot double-quoted string literal, quotes included, in which every
// byte other than an ASCII letter or space, or a byte of a UTF-8 sequence
// (>= 0x80), is written as an octal escape \ooo; digits too, because
// gnuplot reads a fourth octal digit after an escape ("\0551" is one
// byte). So the literal
// holds no quote, backquote (`...` runs a shell command), @ (a macro), $ or
// backslash of its own, and no line break (control characters become
// spaces): gnuplot reads back exactly the text and nothing can end the
// string early. (A single-quoted literal is not safe: gnuplot reads a
// leading '' as an empty string.) Meant for terminals set `noenhanced`,
// so ^ _ { } @ & are drawn as they are.
std::string GnuplotString(std::string_view text);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TEXT_ESCAPE_H_

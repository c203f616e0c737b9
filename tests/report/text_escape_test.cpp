#include "report/text_escape.h"

#include <doctest/doctest.h>

namespace hushgain {
namespace {

TEST_CASE("gnuplot strings carry no quote or backquote or macro sign") {
  // gnuplot 5.4 manual, "Strings" and "Substitution": in double quotes a
  // backslash and three octal digits is one byte; backquotes and @ are
  // substituted before a line is parsed, so they must not appear raw.
  CHECK(GnuplotString("R_in") == "\"R\\137in\"");
  // Digits are escaped too: gnuplot would read "\0551" as one byte.
  CHECK(GnuplotString("R1 e 2") == "\"R\\061 e \\062\"");
  CHECK(GnuplotString("-1") == "\"\\055\\061\"");
  CHECK(GnuplotString("it's") == "\"it\\047s\"");
  CHECK(GnuplotString("\"; system(\"x\") ;") ==
        "\"\\042\\073 system\\050\\042x\\042\\051 \\073\"");
  CHECK(GnuplotString("`id` @m $d \\") ==
        "\"\\140id\\140 \\100m \\044d \\134\"");
  // UTF-8 passes as it is: "µV/√Hz".
  CHECK(GnuplotString("\xC2\xB5V") == "\"\xC2\xB5V\"");
}

TEST_CASE("gnuplot strings cannot end the command with a line break") {
  CHECK(GnuplotString("a\nb\r\tc") == "\"a b  c\"");
}

TEST_CASE("markdown escaping keeps names as text on one line") {
  // CommonMark 0.30, section 2.4: any ASCII punctuation may be
  // backslash-escaped.
  CHECK(EscapeMarkdown("R_in") == "R\\_in");
  CHECK(EscapeMarkdown("*a* | <b> [c](d) `e` #f ~g\\") ==
        "\\*a\\* \\| \\<b\\> \\[c\\](d) \\`e\\` \\#f \\~g\\\\");
  CHECK(EscapeMarkdown("two\nlines") == "two lines");
}

TEST_CASE("markdown and text escaping show control characters") {
  // ESC starts an ECMA-48 escape sequence and BEL rings the bell: shown as
  // text (a backslash before x or u is a literal backslash in CommonMark).
  CHECK(EscapeMarkdown("a\x1b]0;t\x07 b") == "a\\x1b\\]0;t\\x07 b");
  CHECK(EscapeText("a\x1b[31m\r\nb") == "a\\x1b[31m\\r\\nb");
}

TEST_CASE("csv fields are quoted only when they need it") {
  // RFC 4180 section 2, rules 5 to 7.
  CHECK(CsvField("R1") == "R1");
  CHECK(CsvField("a,b") == "\"a,b\"");
  CHECK(CsvField("say \"hi\"") == "\"say \"\"hi\"\"\"");
  CHECK(CsvField(" padded") == "\" padded\"");
  CHECK(CsvField("") == "");
}

}  // namespace
}  // namespace hushgain

#include "report/table.h"

#include <doctest/doctest.h>

namespace hushgain {
namespace {

Table Sample() {
  Table t;
  t.header = {"name", "value"};
  t.align = {Table::Align::kLeft, Table::Align::kRight};
  t.AddRow({"R_in", "1.5 kΩ"});
  t.AddRule();
  t.AddRow({"a|b", "2"});
  return t;
}

TEST_CASE("markdown table has a delimiter row with right alignment marks") {
  // GitHub Flavored Markdown spec, "Tables (extension)": the delimiter row
  // follows the header; a colon on the right aligns the column right; a
  // pipe inside a cell is written "\|". Markdown has no inner rules.
  CHECK(RenderMarkdown(Sample()) ==
        "| name | value |\n"
        "| --- | ---: |\n"
        "| R\\_in | 1.5 kΩ |\n"
        "| a\\|b | 2 |\n");
}

TEST_CASE("csv quotes fields with commas and doubles their quotes") {
  // RFC 4180 section 2: records end in CRLF (rule 1); fields holding
  // commas, double quotes or line breaks are enclosed in double quotes
  // (rule 6); a double quote inside is written twice (rule 7, the example
  // "aaa","b""bb","ccc").
  Table t;
  t.header = {"a", "b", "c"};
  t.AddRow({"aaa", "b\"bb", "ccc"});
  t.AddRow({"x,y", "line\nbreak", "plain"});
  t.AddRow({"short"});
  CHECK(RenderCsv(t) ==
        "a,b,c\r\n"
        "aaa,\"b\"\"bb\",ccc\r\n"
        "\"x,y\",\"line\nbreak\",plain\r\n"
        "short,,\r\n");
}

TEST_CASE("text rendering of a table is unchanged by the new renderers") {
  CHECK(RenderText(Sample(), 0) ==
        "name   value\n"
        "------------\n"
        "R_in  1.5 kΩ\n"
        "------------\n"
        "a|b        2\n");
}

}  // namespace
}  // namespace hushgain

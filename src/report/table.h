// A table of already formatted cells, and its renderings: fixed-width text
// (aligned by display width, so "µ" and "√" count as one column), a
// Markdown pipe table and CSV. Any report table (budget, spectrum, sweep)
// is built once as a Table and rendered in the format asked for.
#ifndef HUSHGAIN_REPORT_TABLE_H_
#define HUSHGAIN_REPORT_TABLE_H_

#include <string>
#include <vector>

namespace hushgain {

struct Table {
  enum class Align { kLeft, kRight };
  std::vector<std::string> header;
  std::vector<Align> align;  // one per column; missing ones are left
  std::vector<std::vector<std::string>> rows;
  // Rows after which a rule is drawn (index of the row above the rule).
  std::vector<int> rules_after;

  void AddRow(std::vector<std::string> row) { rows.push_back(std::move(row)); }
  void AddRule() { rules_after.push_back(static_cast<int>(rows.size()) - 1); }
};

// Two spaces between columns, `indent` spaces before each line, a dashed
// rule under the header and at each rules_after. Every cell passes through
// EscapeText (report/text_escape.h): one line, control characters visible.
std::string RenderText(const Table& table, int indent = 2);

// A GitHub-flavoured Markdown pipe table: the header, the delimiter row
// (`---:` for right-aligned columns) and one line per row, every cell
// escaped (report/text_escape.h), so a "|" in a name stays in its cell.
// Markdown has no inner rules: rules_after is ignored. Every line ends in
// "\n".
std::string RenderMarkdown(const Table& table);

// RFC 4180 CSV: the header record, then one record per row, fields quoted
// as needed, records ending in CRLF. Rules are ignored.
std::string RenderCsv(const Table& table);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TABLE_H_

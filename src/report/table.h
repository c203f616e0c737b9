// A table of already formatted cells, and its renderings: fixed-width text
// (aligned by display width, so "µ" and "√" count as one column).
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
// rule under the header and at each rules_after.
std::string RenderText(const Table& table, int indent = 2);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_TABLE_H_

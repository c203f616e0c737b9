#include "report/table.h"

#include <algorithm>

#include "io/units.h"
#include "report/text_escape.h"

namespace hushgain {

std::string RenderText(const Table& given, int indent) {
  // Cells may quote a stage or device file: each stays on one line, its
  // control characters visible.
  Table table = given;
  for (std::string& cell : table.header) cell = EscapeText(cell);
  for (auto& row : table.rows)
    for (std::string& cell : row) cell = EscapeText(cell);
  const std::size_t columns = table.header.size();
  std::vector<int> width(columns, 0);
  auto measure = [&](const std::vector<std::string>& row) {
    for (std::size_t c = 0; c < columns && c < row.size(); ++c)
      width[c] = std::max(width[c], DisplayWidth(row[c]));
  };
  measure(table.header);
  for (const auto& row : table.rows) measure(row);

  int total = 0;
  for (int w : width) total += w;
  total += 2 * static_cast<int>(columns > 0 ? columns - 1 : 0);
  const std::string pad(indent, ' ');
  const std::string rule = pad + std::string(total, '-') + "\n";

  auto line = [&](const std::vector<std::string>& row) {
    std::string out = pad;
    for (std::size_t c = 0; c < columns; ++c) {
      const std::string cell = c < row.size() ? row[c] : "";
      const int gap = width[c] - DisplayWidth(cell);
      const bool right =
          c < table.align.size() && table.align[c] == Table::Align::kRight;
      if (right)
        out += std::string(gap, ' ') + cell;
      else
        out += cell + (c + 1 < columns ? std::string(gap, ' ') : "");
      if (c + 1 < columns) out += "  ";
    }
    while (!out.empty() && out.back() == ' ') out.pop_back();
    return out + "\n";
  };

  std::string out = line(table.header) + rule;
  for (std::size_t r = 0; r < table.rows.size(); ++r) {
    out += line(table.rows[r]);
    if (std::find(table.rules_after.begin(), table.rules_after.end(),
                  static_cast<int>(r)) != table.rules_after.end())
      out += rule;
  }
  return out;
}

std::string RenderMarkdown(const Table& table) {
  const std::size_t columns = table.header.size();
  auto line = [&](const std::vector<std::string>& row) {
    std::string out = "|";
    for (std::size_t c = 0; c < columns; ++c) {
      const std::string cell = c < row.size() ? EscapeMarkdown(row[c]) : "";
      out += " " + cell + " |";
    }
    return out + "\n";
  };
  std::string out = line(table.header) + "|";
  for (std::size_t c = 0; c < columns; ++c) {
    const bool right =
        c < table.align.size() && table.align[c] == Table::Align::kRight;
    out += right ? " ---: |" : " --- |";
  }
  out += "\n";
  for (const auto& row : table.rows) out += line(row);
  return out;
}

std::string RenderCsv(const Table& table) {
  const std::size_t columns = table.header.size();
  auto record = [&](const std::vector<std::string>& row) {
    std::string out;
    for (std::size_t c = 0; c < columns; ++c) {
      if (c > 0) out += ',';
      if (c < row.size()) out += CsvField(row[c]);
    }
    return out + "\r\n";
  };
  std::string out = record(table.header);
  for (const auto& row : table.rows) out += record(row);
  return out;
}

}  // namespace hushgain

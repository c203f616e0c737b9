#include "report/markdown_html.h"

#include <algorithm>
#include <cctype>
#include <vector>

namespace hushgain {
namespace {

// The text of a Markdown line with its backslash escapes resolved, as HTML.
std::string Inline(std::string_view text) {
  std::string plain;
  plain.reserve(text.size());
  for (std::size_t i = 0; i < text.size(); ++i) {
    if (text[i] == '\\' && i + 1 < text.size() &&
        std::ispunct(static_cast<unsigned char>(text[i + 1]))) {
      plain += text[++i];
    } else {
      plain += text[i];
    }
  }
  return EscapeHtml(plain);
}

// The cells of a pipe-table row, split at unescaped "|", trimmed.
std::vector<std::string> Cells(std::string_view line) {
  std::vector<std::string> cells;
  std::string cell;
  std::size_t i = line.find('|');
  if (i == std::string_view::npos) return cells;
  for (++i; i < line.size(); ++i) {
    if (line[i] == '\\' && i + 1 < line.size()) {
      cell += line[i];
      cell += line[++i];
    } else if (line[i] == '|') {
      const auto first = cell.find_first_not_of(' ');
      const auto last = cell.find_last_not_of(' ');
      cells.push_back(first == std::string::npos
                          ? std::string()
                          : cell.substr(first, last - first + 1));
      cell.clear();
    } else {
      cell += line[i];
    }
  }
  return cells;
}

bool IsDelimiterRow(const std::vector<std::string>& cells) {
  if (cells.empty()) return false;
  for (const std::string& c : cells)
    if (c.empty() || c.find_first_not_of("-:") != std::string::npos)
      return false;
  return true;
}

std::vector<std::string_view> SplitLines(std::string_view text) {
  std::vector<std::string_view> lines;
  std::size_t start = 0;
  while (start < text.size()) {
    std::size_t end = text.find('\n', start);
    if (end == std::string_view::npos) end = text.size();
    std::string_view line = text.substr(start, end - start);
    if (!line.empty() && line.back() == '\r') line.remove_suffix(1);
    lines.push_back(line);
    start = end + 1;
  }
  return lines;
}

}  // namespace

std::string EscapeHtml(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '&':
        out += "&amp;";
        break;
      case '<':
        out += "&lt;";
        break;
      case '>':
        out += "&gt;";
        break;
      case '"':
        out += "&quot;";
        break;
      case '\'':
        out += "&#39;";
        break;
      default:
        out += c;
    }
  }
  return out;
}

std::string MarkdownToHtml(std::string_view markdown, int heading_shift) {
  const std::vector<std::string_view> lines = SplitLines(markdown);
  std::string out;
  std::size_t i = 0;
  while (i < lines.size()) {
    const std::string_view line = lines[i];
    if (line.find_first_not_of(' ') == std::string_view::npos) {
      ++i;
    } else if (line.starts_with("#")) {
      const std::size_t level = line.find_first_not_of('#');
      const int h = std::clamp(static_cast<int>(level) + heading_shift, 1, 6);
      const std::string tag = "h" + std::to_string(h);
      out += "<" + tag + ">" +
             Inline(line.substr(std::min(line.size(), level + 1))) + "</" +
             tag + ">\n";
      ++i;
    } else if (line.starts_with("- ")) {
      out += "<ul>\n";
      for (; i < lines.size() && lines[i].starts_with("- "); ++i)
        out += "<li>" + Inline(lines[i].substr(2)) + "</li>\n";
      out += "</ul>\n";
    } else if (line.starts_with("|") && i + 1 < lines.size() &&
               IsDelimiterRow(Cells(lines[i + 1]))) {
      const std::vector<std::string> header = Cells(line);
      const std::vector<std::string> delimiters = Cells(lines[i + 1]);
      auto cell = [&](const char* tag, std::size_t k, const std::string& c) {
        const bool right = k < delimiters.size() && delimiters[k].back() == ':';
        return std::string("<") + tag + (right ? " class=\"num\"" : "") + ">" +
               Inline(c) + "</" + tag + ">";
      };
      out += "<table>\n<thead><tr>";
      for (std::size_t k = 0; k < header.size(); ++k)
        out += cell("th", k, header[k]);
      out += "</tr></thead>\n<tbody>\n";
      for (i += 2; i < lines.size() && lines[i].starts_with("|"); ++i) {
        const std::vector<std::string> row = Cells(lines[i]);
        out += "<tr>";
        for (std::size_t k = 0; k < row.size(); ++k)
          out += cell("td", k, row[k]);
        out += "</tr>\n";
      }
      out += "</tbody>\n</table>\n";
    } else if (line.starts_with(">")) {
      out += "<blockquote>";
      bool first = true;
      for (; i < lines.size() && lines[i].starts_with(">"); ++i) {
        std::string_view q = lines[i].substr(1);
        if (q.starts_with(" ")) q.remove_prefix(1);
        out += (first ? "" : " ") + Inline(q);
        first = false;
      }
      out += "</blockquote>\n";
    } else {
      out += "<p>";
      bool first = true;
      for (; i < lines.size(); ++i) {
        const std::string_view l = lines[i];
        if (l.find_first_not_of(' ') == std::string_view::npos ||
            l.starts_with("#") || l.starts_with("- ") || l.starts_with("|") ||
            l.starts_with(">"))
          break;
        out += (first ? "" : " ") + Inline(l);
        first = false;
      }
      out += "</p>\n";
    }
  }
  return out;
}

}  // namespace hushgain

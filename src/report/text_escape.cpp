#include "report/text_escape.h"

#include <cctype>
#include <cstdio>

#include "base/control_characters.h"

namespace hushgain {

std::string EscapeText(std::string_view text) {
  return EscapeControlCharacters(text, LineBreaks::kEscape);
}

std::string EscapeMarkdown(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '\\':
      case '`':
      case '*':
      case '_':
      case '[':
      case ']':
      case '<':
      case '>':
      case '|':
      case '~':
      case '#':
        out += '\\';
        out += c;
        break;
      case '\n':
      case '\r':
        out += ' ';
        break;
      default:
        out += c;
    }
  }
  return EscapeControlCharacters(out, LineBreaks::kEscape);
}

std::string CsvField(std::string_view text) {
  const bool quote =
      text.find_first_of(",\"\r\n") != std::string_view::npos ||
      (!text.empty() && (text.front() == ' ' || text.back() == ' '));
  if (!quote) return std::string(text);
  std::string out = "\"";
  for (char c : text) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

std::string GnuplotString(std::string_view text) {
  std::string out = "\"";
  for (char c : text) {
    const unsigned char u = static_cast<unsigned char>(c);
    if (std::isalpha(u) || c == ' ' || u >= 0x80) {
      out += c;
    } else if (u < 0x20 || u == 0x7F) {
      out += ' ';
    } else {
      char buf[8];
      std::snprintf(buf, sizeof buf, "\\%03o", u);
      out += buf;
    }
  }
  return out + "\"";
}

std::string MarkdownItem(const std::string& label, const std::string& text) {
  return "- " + label + ": " + EscapeMarkdown(text) + "\n";
}

}  // namespace hushgain

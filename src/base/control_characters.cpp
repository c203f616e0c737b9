#include "base/control_characters.h"

#include <cstddef>

namespace hushgain {
namespace {

constexpr char kHex[] = "0123456789abcdef";

void AppendHex(std::string& out, const char* prefix, unsigned char byte) {
  out += prefix;
  out += kHex[byte >> 4];
  out += kHex[byte & 0xf];
}

bool Continuation(unsigned char byte) { return (byte & 0xC0) == 0x80; }

// The length of the well-formed UTF-8 sequence at text[i] (RFC 3629
// section 4: C2..DF one continuation byte, E0..EF two, F0..F4 three; the
// second byte's narrower ranges after E0, ED, F0 and F4 exclude overlong
// forms, surrogates and code points above U+10FFFF), or 0.
std::size_t Utf8Length(std::string_view text, std::size_t i) {
  const auto lead = static_cast<unsigned char>(text[i]);
  std::size_t n = 0;
  unsigned char low = 0x80, high = 0xBF;
  if (lead >= 0xC2 && lead <= 0xDF) {
    n = 2;
  } else if (lead >= 0xE0 && lead <= 0xEF) {
    n = 3;
    if (lead == 0xE0) low = 0xA0;
    if (lead == 0xED) high = 0x9F;
  } else if (lead >= 0xF0 && lead <= 0xF4) {
    n = 4;
    if (lead == 0xF0) low = 0x90;
    if (lead == 0xF4) high = 0x8F;
  } else {
    return 0;
  }
  if (i + n > text.size()) return 0;
  const auto second = static_cast<unsigned char>(text[i + 1]);
  if (second < low || second > high) return 0;
  for (std::size_t k = 2; k < n; ++k)
    if (!Continuation(static_cast<unsigned char>(text[i + k]))) return 0;
  return n;
}

}  // namespace

std::string EscapeControlCharacters(std::string_view text,
                                    LineBreaks line_breaks) {
  const bool keep = line_breaks == LineBreaks::kKeep;
  std::string out;
  out.reserve(text.size());
  std::size_t i = 0;
  while (i < text.size()) {
    const char c = text[i];
    const auto byte = static_cast<unsigned char>(c);
    if (byte < 0x80) {
      if (keep && c == '\n') {
        out += c;
      } else if (keep && c == '\r' && i + 1 < text.size() &&
                 text[i + 1] == '\n') {
        out += "\r\n";
        ++i;
      } else if (c == '\n') {
        out += "\\n";
      } else if (c == '\r') {
        out += "\\r";
      } else if (c == '\t') {
        out += "\\t";
      } else if (byte < 0x20 || byte == 0x7F) {
        AppendHex(out, "\\x", byte);
      } else {
        out += c;
      }
      ++i;
      continue;
    }
    const std::size_t n = Utf8Length(text, i);
    if (n == 0) {
      AppendHex(out, "\\x", byte);
      ++i;
    } else if (n == 2 && byte == 0xC2 &&
               static_cast<unsigned char>(text[i + 1]) <= 0x9F) {
      AppendHex(out, "\\u00", static_cast<unsigned char>(text[i + 1]));
      i += 2;
    } else {
      out.append(text.substr(i, n));
      i += n;
    }
  }
  return out;
}

}  // namespace hushgain

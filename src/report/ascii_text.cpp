#include "report/ascii_text.h"

#include <array>
#include <utility>

namespace hushgain {
namespace {

// The UTF-8 length announced by a lead byte; 0 for a continuation byte or
// an invalid lead.
std::size_t SequenceLength(unsigned char lead) {
  if (lead < 0x80) return 1;
  if ((lead & 0xE0) == 0xC0) return 2;
  if ((lead & 0xF0) == 0xE0) return 3;
  if ((lead & 0xF8) == 0xF0) return 4;
  return 0;
}

constexpr std::array<std::pair<std::string_view, std::string_view>, 17>
    kSpellings = {{
        {"\xC2\xB5", "u"},        // µ micro sign
        {"\xCE\xBC", "u"},        // μ Greek mu
        {"\xCE\xA9", "Ohm"},      // Ω Greek omega
        {"\xE2\x84\xA6", "Ohm"},  // Ω ohm sign
        {"\xE2\x88\x9A", "rt"},   // √
        {"\xC2\xB0", "deg"},      // °
        {"\xC2\xB1", "+-"},       // ±
        {"\xC3\x97", "x"},        // ×
        {"\xE2\x88\x92", "-"},    // − minus
        {"\xE2\x80\x93", "-"},    // – en dash
        {"\xE2\x80\x94", "-"},    // — em dash
        {"\xE2\x80\xA6", "..."},  // …
        {"\xE2\x89\xA4", "<="},   // ≤
        {"\xE2\x89\xA5", ">="},   // ≥
        {"\xE2\x89\x88", "~"},    // ≈
        {"\xCF\x80", "pi"},       // π
        {"\xC2\xB2", "^2"},       // ²
    }};

}  // namespace

std::string AsciiText(std::string_view utf8) {
  std::string out;
  out.reserve(utf8.size());
  std::size_t i = 0;
  while (i < utf8.size()) {
    const auto lead = static_cast<unsigned char>(utf8[i]);
    if (lead < 0x80) {
      out += utf8[i++];
      continue;
    }
    std::size_t n = SequenceLength(lead);
    bool valid = n > 1 && i + n <= utf8.size();
    for (std::size_t k = 1; valid && k < n; ++k)
      valid = (static_cast<unsigned char>(utf8[i + k]) & 0xC0) == 0x80;
    if (!valid) {
      out += '?';
      ++i;
      continue;
    }
    const std::string_view sequence = utf8.substr(i, n);
    std::string_view spelling = "?";
    if (sequence == "\xE2\x88\xA5") spelling = "||";  // ∥ parallel
    for (const auto& [symbol, ascii] : kSpellings)
      if (sequence == symbol) spelling = ascii;
    out += spelling;
    i += n;
  }
  return out;
}

std::size_t CompleteUtf8Prefix(std::string_view utf8) {
  // Look back at most three bytes for a lead byte whose sequence runs past
  // the end.
  const std::size_t size = utf8.size();
  for (std::size_t back = 1; back <= 3 && back <= size; ++back) {
    const auto byte = static_cast<unsigned char>(utf8[size - back]);
    if ((byte & 0xC0) == 0x80) continue;  // a continuation byte
    const std::size_t n = SequenceLength(byte);
    return n > back ? size - back : size;
  }
  return size;
}

}  // namespace hushgain

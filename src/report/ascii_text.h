// Text for terminals and spreadsheets that only take ASCII (--ascii, or a
// locale whose character set is not UTF-8): the symbols hushgain prints in
// UTF-8 spelled in ASCII, as engineers type them:
//   µ μ -> u      Ω Ω -> Ohm     √ -> rt (so "V/√Hz" -> "V/rtHz")
//   ° -> deg      ± -> +-        × -> x      − – — -> -      … -> ...
//   ≤ -> <=       ≥ -> >=        ≈ -> ~      π -> pi         ² -> ^2
//   ∥ -> ||
// Any other non-ASCII character (from a stage name, say) becomes "?", one
// per character; a byte that is not valid UTF-8 becomes "?" too.
#ifndef HUSHGAIN_REPORT_ASCII_TEXT_H_
#define HUSHGAIN_REPORT_ASCII_TEXT_H_

#include <string>
#include <string_view>

namespace hushgain {

std::string AsciiText(std::string_view utf8);

// The length of the longest prefix of `utf8` that ends on a character
// boundary (a stream filter holds the rest back until it is complete).
std::size_t CompleteUtf8Prefix(std::string_view utf8);

}  // namespace hushgain

#endif  // HUSHGAIN_REPORT_ASCII_TEXT_H_

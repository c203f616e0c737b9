// Control characters made visible, so that text from a stage or device file
// (a name, a description, a key) can reach a terminal without moving the
// cursor, changing the window title, ringing the bell or starting an escape
// sequence (ECMA-48: ESC 0x1B starts one, and so do the C1 controls
// U+0080..U+009F, such as CSI U+009B).
//   "\n", "\r", "\t"  for line feed, carriage return and tab
//   "\xHH"            for every other C0 control (0x00..0x1F), DEL (0x7F)
//                     and a byte that is not part of well-formed UTF-8
//   "\u00HH"          for a C1 control written as UTF-8 (0xC2 0x80..0x9F);
//                     in a JSON string this is the same character
// Other text, UTF-8 included, passes unchanged.
#ifndef HUSHGAIN_BASE_CONTROL_CHARACTERS_H_
#define HUSHGAIN_BASE_CONTROL_CHARACTERS_H_

#include <string>
#include <string_view>

namespace hushgain {

enum class LineBreaks {
  kEscape,  // one line: "\n" and "\r" are escaped too
  kKeep,    // a whole report: a line feed and CR LF stay as they are
};

std::string EscapeControlCharacters(
    std::string_view text, LineBreaks line_breaks = LineBreaks::kEscape);

}  // namespace hushgain

#endif  // HUSHGAIN_BASE_CONTROL_CHARACTERS_H_

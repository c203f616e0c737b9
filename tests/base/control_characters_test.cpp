#include "base/control_characters.h"

#include <doctest/doctest.h>

#include <string>

namespace hushgain {
namespace {

// The control characters are those of ECMA-48 (5th edition, 1991), section
// 5: C0 is 0x00..0x1F, C1 is U+0080..U+009F (CSI is U+009B); DEL is 0x7F.
// UTF-8 encodes U+009B as C2 9B (RFC 3629 section 3).

TEST_CASE("control characters of C0 and DEL become visible on one line") {
  CHECK(EscapeControlCharacters("a\x1b[2Jb\x07") == "a\\x1b[2Jb\\x07");
  CHECK(EscapeControlCharacters("one\r\ntwo\tthree") == "one\\r\\ntwo\\tthree");
  CHECK(EscapeControlCharacters(std::string("nul\0del\x7f", 8)) ==
        "nul\\x00del\\x7f");
}

TEST_CASE("a c1 control in utf-8 becomes its json escape") {
  CHECK(EscapeControlCharacters("x\xC2\x9B"
                                "31m") == "x\\u009b31m");
  CHECK(EscapeControlCharacters("\xC2\x80\xC2\x9F") == "\\u0080\\u009f");
}

TEST_CASE("printable utf-8 passes unchanged") {
  // U+00A0 (no-break space, C2 A0) is the first code point after C1.
  const std::string text =
      "\xC2\xA0\xC2\xB5V/\xE2\x88\x9AHz 4.7 k\xCE\xA9 \xF0\x9F\x94\x8A";
  CHECK(EscapeControlCharacters(text) == text);
}

TEST_CASE("bytes that are not well-formed utf-8 become hex escapes") {
  // RFC 3629 section 4: a lone continuation byte, an overlong C0 80, a
  // truncated sequence and a surrogate (ED A0 80) are all ill-formed.
  CHECK(EscapeControlCharacters("\x9B") == "\\x9b");
  CHECK(EscapeControlCharacters("\xC0\x80") == "\\xc0\\x80");
  CHECK(EscapeControlCharacters("\xE2\x88") == "\\xe2\\x88");
  CHECK(EscapeControlCharacters("\xED\xA0\x80") == "\\xed\\xa0\\x80");
}

TEST_CASE("a whole report keeps its line feeds and crlf record ends") {
  CHECK(EscapeControlCharacters("a\nb\r\nc\rd\x1b", LineBreaks::kKeep) ==
        "a\nb\r\nc\\rd\\x1b");
}

}  // namespace
}  // namespace hushgain

// ASCII spellings of the symbols hushgain prints (report/ascii_text.h).
#include "report/ascii_text.h"

#include <doctest/doctest.h>

#include <string>

namespace hushgain {
namespace {

TEST_CASE("ascii text spells units as engineers type them") {
  CHECK(AsciiText("4.000 \xC2\xB5V/\xE2\x88\x9AHz") == "4.000 uV/rtHz");
  CHECK(AsciiText("10.00 M\xCE\xA9 and 1 k\xE2\x84\xA6") ==
        "10.00 MOhm and 1 kOhm");
  CHECK(AsciiText("15.00 \xC2\xB0"
                  "C, 89.4\xC2\xB0") == "15.00 degC, 89.4deg");
  CHECK(AsciiText("\xC2\xB1"
                  "332.5 mV") == "+-332.5 mV");
  CHECK(AsciiText("GBW / (2\xCF\x80 C f\xC2\xB2), \xE2\x88\x92"
                  "3 dB, R2 \xE2\x88\xA5 R3, \xC3\x97"
                  "1.06") == "GBW / (2pi C f^2), -3 dB, R2 || R3, x1.06");
  CHECK(AsciiText("plain ascii\r\n") == "plain ascii\r\n");
}

TEST_CASE("ascii text marks what it cannot spell, one ? per character") {
  CHECK(AsciiText("Vorverst\xC3\xA4rker \xE2\x82\xAC") == "Vorverst?rker ?");
  // A lone continuation byte, a cut sequence and an invalid lead byte.
  CHECK(AsciiText("a\x80"
                  "b") == "a?b");
  CHECK(AsciiText("a\xE2\x88") == "a??");
  CHECK(AsciiText("\xFF") == "?");
}

TEST_CASE("a stream filter holds back a sequence cut at the end") {
  const std::string text = "1 \xC2\xB5V";
  CHECK(CompleteUtf8Prefix(text) == text.size());
  CHECK(CompleteUtf8Prefix(text.substr(0, 3)) == 2);  // "1 " + lead byte
  CHECK(CompleteUtf8Prefix("\xE2\x88") == 0);
  CHECK(CompleteUtf8Prefix("ab") == 2);
}

}  // namespace
}  // namespace hushgain

// --ascii, and ASCII chosen by a locale whose character set is not UTF-8
// (cli/text_output.h): text and Markdown hold only ASCII bytes and the same
// figures, JSON keeps its data.
#include <doctest/doctest.h>

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/cli_support.h"
#include "cli/temp_folder.h"
#include "report/ascii_text.h"

namespace hushgain::test {
namespace {

bool AllAscii(const std::string& s) {
  for (char c : s)
    if (static_cast<unsigned char>(c) >= 0x80) return false;
  return true;
}

TEST_CASE("--ascii spells the budget's text and markdown in ascii") {
  const std::string stage = ExamplePath("geophone-preamp");
  for (const char* format : {"text", "markdown"}) {
    INFO(format);
    const RunResult utf8 =
        RunBinary(HUSHGAIN_BINARY, {"budget", stage, "--format", format});
    const RunResult before = RunBinary(
        HUSHGAIN_BINARY, {"--ascii", "budget", stage, "--format", format});
    const RunResult after = RunBinary(
        HUSHGAIN_BINARY, {"budget", stage, "--format", format, "--ascii"});
    REQUIRE(utf8.exit_code == 0);
    REQUIRE(before.exit_code == 0);
    CHECK_FALSE(AllAscii(utf8.out));
    CHECK(AllAscii(before.out));
    CHECK(before.out == after.out);
    // The same report, symbol for symbol.
    CHECK(before.out == AsciiText(utf8.out));
    CHECK(before.out.find("uV") != std::string::npos);
  }
}

TEST_CASE("--ascii leaves json as it is") {
  const std::string stage = ExamplePath("geophone-preamp");
  const RunResult a = RunBinary(HUSHGAIN_BINARY, {"budget", stage, "--json"});
  const RunResult b =
      RunBinary(HUSHGAIN_BINARY, {"--ascii", "budget", stage, "--json"});
  CHECK(a.exit_code == 0);
  CHECK(a.out == b.out);
}

TEST_CASE("a locale that is not utf-8 chooses ascii by itself") {
  const std::string stage = ExamplePath("smoke-chamber-receiver");
  // LC_ALL=C: the POSIX locale, ASCII; LC_ALL=C.UTF-8: UTF-8.
  const RunResult c =
      RunBinary("/usr/bin/env", {"LC_ALL=C", HUSHGAIN_BINARY, "tia", "suggest",
                                 stage, "--bandwidth", "20k"});
  const RunResult u =
      RunBinary("/usr/bin/env", {"LC_ALL=C.UTF-8", HUSHGAIN_BINARY, "tia",
                                 "suggest", stage, "--bandwidth", "20k"});
  REQUIRE(c.exit_code == 0);
  REQUIRE(u.exit_code == 0);
  CHECK(AllAscii(c.out));
  CHECK(c.out.find("A/rtHz") != std::string::npos);
  CHECK(c.out == AsciiText(u.out));
  CHECK_FALSE(AllAscii(u.out));
}

TEST_CASE("messages on stderr are spelled in ascii too") {
  TempFolder dir;
  nlohmann::json stage =
      nlohmann::json::parse(ReadAll(ExamplePath("geophone-preamp")));
  stage["stage"]["input_resistor"] = "4.7 k\xCE\xA9x";
  dir.Write("s.json", stage.dump());
  const std::string path = (dir.path() / "s.json").string();
  const RunResult utf8 = RunBinary(HUSHGAIN_BINARY, {"budget", path});
  const RunResult r = RunBinary(HUSHGAIN_BINARY, {"--ascii", "budget", path});
  CHECK(utf8.exit_code == 2);
  CHECK(r.exit_code == 2);
  CHECK_FALSE(AllAscii(utf8.err));
  CHECK(AllAscii(r.err));
  CHECK(r.err == AsciiText(utf8.err));
}

}  // namespace
}  // namespace hushgain::test

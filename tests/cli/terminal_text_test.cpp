// Text from a stage or device file never drives the terminal (issue 12,
// defect 8): before this check a stage name holding ESC and BEL reached
// stdout raw in the text and Markdown reports, so a stage file could set
// the window title, clear the screen or ring the bell. Now every report of
// every format shows control characters as text (README, "Text from your
// files"); JSON keeps the name as data.
#include <doctest/doctest.h>

#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/cli_support.h"
#include "cli/temp_folder.h"

namespace hushgain {
namespace {

using test::ExamplePath;
using test::ReadAll;
using test::RunBinary;
using test::RunResult;

// ECMA-48 (5th edition, 1991): ESC ] 0 ; ... BEL sets the window title in
// xterm's control sequences, ESC [ 2 J clears the screen, C1 CSI (U+009B,
// UTF-8 C2 9B) starts a control sequence like ESC [ does. CR LF would start
// a line of the stage's own making.
const std::string kHostileName =
    "bench\x1b]0;pwned\x07 \x1b[2J\xC2\x9B"
    "31m\r\nfake line";
// The same name as the text reports show it (README: \xHH for C0 controls
// and DEL, \u00HH for C1 controls, \r \n \t).
const std::string kShownName =
    "bench\\x1b]0;pwned\\x07 \\x1b[2J\\u009b31m\\r\\nfake line";

// Empty when `out` carries no control character a terminal would act on;
// else where the first one is. LF is a line break; CR only before LF (CSV
// records end in CR LF, RFC 4180 section 2).
std::string FirstRawControl(const std::string& out) {
  for (std::size_t i = 0; i < out.size(); ++i) {
    const auto c = static_cast<unsigned char>(out[i]);
    const bool crlf = c == '\r' && i + 1 < out.size() && out[i + 1] == '\n';
    const bool c1 = c == 0xC2 && i + 1 < out.size() &&
                    static_cast<unsigned char>(out[i + 1]) >= 0x80 &&
                    static_cast<unsigned char>(out[i + 1]) <= 0x9F;
    if (((c < 0x20 && c != '\n' && !crlf) || c == 0x7F) || c1)
      return "byte " + std::to_string(c) + " at " + std::to_string(i);
  }
  return "";
}

// The example `name` with the hostile stage name, written to `folder`.
std::string HostileStage(const test::TempFolder& folder,
                         const std::string& name) {
  nlohmann::json stage = nlohmann::json::parse(ReadAll(ExamplePath(name)));
  stage["name"] = kHostileName;
  folder.Write(name + ".json", stage.dump(2));
  return (folder.path() / (name + ".json")).string();
}

struct Command {
  std::string example;
  std::vector<std::string> args;  // after the stage file
};

TEST_CASE("a stage name holding esc and bel never reaches stdout raw") {
  test::TempFolder folder;
  const std::vector<std::pair<std::string, Command>> commands = {
      {"budget", {"load-cell-bridge", {}}},
      {"tee sweep", {"geophone-preamp", {}}},
      {"tee search", {"geophone-preamp", {"--max", "100k"}}},
      {"tia suggest", {"smoke-chamber-receiver", {"--bandwidth", "1k"}}},
      {"tia snr", {"smoke-chamber-receiver", {"--power-range", "1n..1u"}}},
      {"spread", {"load-cell-bridge", {"--samples", "200"}}},
  };
  for (const auto& [command, c] : commands) {
    const std::string stage = HostileStage(folder, c.example);
    for (const std::string format : {"text", "markdown", "json", "csv"}) {
      CAPTURE(command);
      CAPTURE(format);
      std::vector<std::string> args;
      const std::size_t space = command.find(' ');
      args.push_back(command.substr(0, space));
      if (space != std::string::npos) args.push_back(command.substr(space + 1));
      args.push_back(stage);
      args.insert(args.end(), c.args.begin(), c.args.end());
      args.insert(args.end(), {"--format", format});
      const RunResult r = RunBinary(HUSHGAIN_BINARY, args);
      REQUIRE(r.exit_code == 0);
      CHECK(FirstRawControl(r.out) == "");
      CHECK(FirstRawControl(r.err) == "");
      if (format == "text") {
        // The name is the report's first line, whole and visible.
        CHECK(test::Lines(r.out).front() == kShownName);
      } else if (format == "markdown") {
        // Line breaks become spaces, punctuation is backslash-escaped.
        CHECK(r.out.find("bench\\x1b\\]0;pwned\\x07 \\x1b\\[2J\\u009b31m  "
                         "fake line") != std::string::npos);
      } else if (format == "json" &&
                 r.out.find("\"stage\"") != std::string::npos) {
        // JSON keeps the name as data: \u001b and \u009b are the same
        // characters (RFC 8259 section 7).
        CHECK(nlohmann::json::parse(r.out)["stage"] == kHostileName);
      }
    }
  }
}

TEST_CASE("a device file's class and source are shown with visible controls") {
  test::TempFolder folder;
  folder.Write("opamps/odd-part.json", R"({
  "kind": "opamp", "class": "odd\u001b[5m part\u0007",
  "source": "bench\u009b2J notes",
  "parameters": {"voltage_noise": "4n", "current_noise": "1f",
                 "open_loop_gain": "1M", "gbw": "3M"}
})");
  const std::string dir = folder.path().string();
  for (const std::string format : {"text", "markdown", "json", "csv"}) {
    CAPTURE(format);
    for (const std::vector<std::string>& args :
         {std::vector<std::string>{"devices", "--devices", dir, "--format",
                                   format},
          std::vector<std::string>{"devices", "odd-part", "--devices", dir,
                                   "--format", format}}) {
      const RunResult r = RunBinary(HUSHGAIN_BINARY, args);
      REQUIRE(r.exit_code == 0);
      CHECK(FirstRawControl(r.out) == "");
    }
  }
  const RunResult text =
      RunBinary(HUSHGAIN_BINARY, {"devices", "odd-part", "--devices", dir});
  CHECK(test::Lines(text.out).front() == "odd-part (odd\\x1b[5m part\\x07)");
  CHECK(text.out.find("user part: bench\\u009b2J notes\n") !=
        std::string::npos);
}

}  // namespace
}  // namespace hushgain

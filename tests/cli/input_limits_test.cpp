// The edges of reading input, run through the built binary (issue 12,
// defects 5 and 6). Before these checks a key given twice in a stage or
// device file was accepted with the last value winning ("resistor": "100k",
// "resistor": "1k" budgeted 1 k with exit 0), and `budget /dev/zero` read
// until the memory ran out. Now a duplicate key is exit 2 naming the JSON
// pointer (RFC 6901) of its second occurrence, and no stage or device file,
// FIFO or standard input is read beyond 16 MiB (README, "Input files").
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <string>
#include <vector>

#include "cli/cli_support.h"

namespace hushgain {
namespace {

using test::ExamplePath;
using test::ReadAll;
using test::RunBinary;
using test::RunResult;
using test::TempFolder;

constexpr std::size_t kLimitBytes = 16u << 20;  // README: 16 MiB

void WriteText(const std::string& path, const std::string& text) {
  std::ofstream(path, std::ios::binary) << text;
}

// `text` with the first occurrence of `from` replaced by `to`.
std::string Replace(std::string text, const std::string& from,
                    const std::string& to) {
  const std::size_t at = text.find(from);
  REQUIRE(at != std::string::npos);
  return text.replace(at, from.size(), to);
}

struct Duplicate {
  std::string from, to;  // an edit of the geophone example
  std::string pointer;   // the JSON pointer of the second occurrence
};

TEST_CASE("a key given twice in a stage file is exit 2 at its second place") {
  TempFolder dir("duplicate-key");
  const std::string stage = ReadAll(ExamplePath("geophone-preamp"));
  const std::vector<Duplicate> cases = {
      {"\"r2\": \"100k\",", "\"r2\": \"100k\", \"r2\": \"1k\",",
       "/stage/feedback/tee/r2"},
      {"\"input_resistor\": \"10k\",",
       "\"input_resistor\": \"10k\", \"input_resistor\": \"1k\",",
       "/stage/input_resistor"},
      {"\"low\": \"10\",", "\"low\": \"10\", \"low\": \"1\",", "/band_Hz/low"},
      {"\"temperature_C\": 15,", "\"temperature_C\": 15, \"name\": \"x\",",
       "/name"},
      {"\"tee\": {", "\"tee\": {}, \"tee\": {", "/stage/feedback/tee"},
  };
  for (const Duplicate& c : cases) {
    CAPTURE(c.pointer);
    const std::string path = dir / "stage.json";
    const std::string text = Replace(stage, c.from, c.to);
    WriteText(path, text);
    const RunResult r = RunBinary(HUSHGAIN_BINARY, {"budget", path});
    CHECK(r.exit_code == 2);
    CHECK(r.err == "error: " + path + ": " + c.pointer +
                       ": duplicate key (given twice in one object)\n");
    CHECK(r.out.empty());
    CHECK(ReadAll(path) == text);
  }
}

TEST_CASE("a duplicate key inside an array names the element's index") {
  TempFolder dir("duplicate-in-array");
  // The pointer's array index counts plain values and objects alike
  // (RFC 6901 section 4: the index of the element).
  WriteText(dir / "s.json", R"({"x": [1, "two", {"a": 1, "a": 2}]})");
  const RunResult r = RunBinary(HUSHGAIN_BINARY, {"budget", dir / "s.json"});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: " + (dir / "s.json") +
                     ": /x/2/a: duplicate key (given twice in one object)\n");
}

TEST_CASE("a key given twice in a device file is exit 2 naming that file") {
  TempFolder dir("duplicate-device");
  namespace fs = std::filesystem;
  const fs::path devices = fs::path(dir / "devices");
  fs::copy(fs::path(HUSHGAIN_SOURCE_DIR) / "devices", devices,
           fs::copy_options::recursive);
  const std::string device = (devices / "opamps/jfet-input.json").string();
  WriteText(device, Replace(ReadAll(device), "\"gbw\": \"5 MHz\",",
                            "\"gbw\": \"5 MHz\", \"gbw\": \"50 MHz\","));
  const RunResult r =
      RunBinary(HUSHGAIN_BINARY, {"budget", ExamplePath("geophone-preamp"),
                                  "--devices", devices.string()});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: " + device +
                     ": /parameters/gbw: duplicate key (given twice in one "
                     "object)\n");
  CHECK(r.out.empty());
}

TEST_CASE("a stage file of exactly 16 MiB is read; one byte more is refused") {
  TempFolder dir("size-limit");
  const std::string stage = ReadAll(ExamplePath("geophone-preamp"));
  REQUIRE(stage.size() < kLimitBytes);
  // JSON allows any amount of white space after the value (RFC 8259
  // section 2), so padding keeps the stage valid.
  const std::string at_limit =
      stage + std::string(kLimitBytes - stage.size(), ' ');
  WriteText(dir / "at.json", at_limit);
  WriteText(dir / "over.json", at_limit + " ");
  const RunResult at = RunBinary(
      HUSHGAIN_BINARY, {"budget", dir / "at.json", "--format", "json"});
  CHECK(at.exit_code == 0);
  const RunResult over =
      RunBinary(HUSHGAIN_BINARY, {"budget", dir / "over.json"});
  CHECK(over.exit_code == 2);
  CHECK(over.err == "error: " + (dir / "over.json") +
                        ": larger than 16 MiB, the limit of an input file\n");
  CHECK(over.out.empty());

  // Standard input has the same limit.
  const RunResult piped =
      RunBinary(HUSHGAIN_BINARY, {"budget", "-"}, "", dir / "over.json");
  CHECK(piped.exit_code == 2);
  CHECK(piped.err ==
        "error: stdin: larger than 16 MiB, the limit of an "
        "input file\n");
}

TEST_CASE("an endless device like /dev/zero is refused at the limit") {
  const RunResult r = RunBinary(HUSHGAIN_BINARY, {"budget", "/dev/zero"});
  CHECK(r.exit_code == 2);
  CHECK(r.err ==
        "error: /dev/zero: larger than 16 MiB, the limit of an input file\n");
  const RunResult piped =
      RunBinary(HUSHGAIN_BINARY, {"budget", "-"}, "", "/dev/zero");
  CHECK(piped.exit_code == 2);
}

TEST_CASE("a stage file on standard input is read as \"-\"") {
  const RunResult file =
      RunBinary(HUSHGAIN_BINARY,
                {"budget", ExamplePath("geophone-preamp"), "--format", "json"});
  const RunResult piped =
      RunBinary(HUSHGAIN_BINARY, {"budget", "-", "--format", "json"}, "",
                ExamplePath("geophone-preamp"));
  CHECK(piped.exit_code == 0);
  CHECK(piped.out == file.out);
}

}  // namespace
}  // namespace hushgain

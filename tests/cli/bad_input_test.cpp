// Every command's bad-input and refusal paths, end to end through the built
// binary: one table of cases per command. Each case writes its files into a
// temporary folder, runs hushgain there, and checks the contract of
// README "Exit codes": the exit code (2 for usage or input, 1 for an
// analysis refused), exactly one line on stderr, which names the file and
// the JSON path (or the option), nothing on stdout, and no file changed.
//
// More bad-input cases of `budget` live in cli_test.cpp (missing fields,
// units, did-you-mean, band edges, malformed JSON, --tolerance); the counts
// of both files are in tests/README.md. A new command adds its table here
// (see "Tables per command" at the end) and its row there.
#include <doctest/doctest.h>

#include <cmath>
#include <map>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/base_stage.h"
#include "cli/run_binary.h"
#include "cli/temp_folder.h"

namespace hushgain::test {
namespace {

using nlohmann::json;

struct BadInputCase {
  std::string what;
  // Files to write, by relative path; "stage.json" is the usual one.
  std::map<std::string, std::string> files;
  std::vector<std::string> args;
  int exit_code;
  // The whole stderr line without its newline; with `prefix_only`, the
  // line's start (for a refusal that quotes a computed figure).
  std::string line;
  bool prefix_only = false;
};

// A valid stage; each case changes one thing.
json GoodStage() { return json::parse(test::BadInputBaseStageText()); }

std::string With(const std::string& pointer, const json& value) {
  json stage = GoodStage();
  stage[json::json_pointer(pointer)] = value;
  return stage.dump(2);
}

void RunCase(const BadInputCase& c) {
  CAPTURE(c.what);
  TempFolder folder;
  for (const auto& [name, text] : c.files) folder.Write(name, text);
  const auto before = folder.Snapshot();
  const RunResult r =
      RunBinary(HUSHGAIN_BINARY, c.args, folder.path().string());
  CHECK(r.exit_code == c.exit_code);
  CHECK(r.out == "");
  CHECK(Lines(r.err).size() == 1);
  if (c.prefix_only)
    CHECK_MESSAGE(r.err.rfind(c.line, 0) == 0, r.err);
  else
    CHECK(r.err == c.line + "\n");
  CHECK(folder.Snapshot() == before);
}

// A device folder holding one op-amp class, `opamp_text`, which the stage
// names.
std::map<std::string, std::string> DeviceFolderWith(
    const std::string& opamp_text) {
  return {{"stage.json", With("/opamp/device", "my-class")},
          {"devs/opamps/my-class.json", opamp_text},
          {"devs/resistors/.keep", ""}};
}

const char* kGoodDevice = R"({
  "kind": "opamp", "class": "test class",
  "illustrative": "class-typical values for budgeting; illustrative, not the data of any real part",
  "parameters": {"voltage_noise": "5 nV/rtHz", "current_noise": "1 pA/rtHz",
                 "open_loop_gain": "120 dB", "gbw": "1 MHz"}})";

std::vector<BadInputCase> BudgetCases() {
  const std::string good = GoodStage().dump(2);
  json tia = GoodStage();
  tia["stage"]["topology"] = "transimpedance";
  // A 1 nF photodiode on 100 kohm: the best C_f gives 86.9 deg.
  json unreachable = GoodStage();
  unreachable["source"] = {{"photodiode", {{"capacitance", "1n"}}}};
  unreachable["stage"] = {
      {"topology", "transimpedance"},
      {"feedback",
       {{"resistor", "100k"},
        {"capacitor", "auto"},
        {"capacitor_target", {{"phase_margin_deg", 89.99}}}}},
      {"load", "10k"}};
  std::string bad_device = kGoodDevice;
  bad_device.replace(bad_device.find("\"1 MHz\""), 7, "\"-1 MHz\"");
  json far_apart = GoodStage();
  far_apart["stage"]["input_resistor"] = 1e-100;
  far_apart["stage"]["feedback"] = {
      {"tee", {{"r1", 1e100}, {"r2", 1e100}, {"r3", 1e-100}}}};
  return {
      {"no stage file named",
       {},
       {"budget"},
       2,
       "error: command line: stage is required"},
      {"an unknown option",
       {{"stage.json", good}},
       {"budget", "--jsno", "stage.json"},
       2,
       "error: command line: budget: unknown option \"--jsno\" (did you "
       "mean \"--json\"?); try budget --help"},
      {"two stage files",
       {{"stage.json", good}},
       {"budget", "stage.json", "other.json"},
       2,
       "error: command line: the following argument was not expected: "
       "other.json"},
      {"a folder as the stage file",
       {{"sub/stage.json", good}},
       {"budget", "sub"},
       2,
       "error: sub: cannot read: is a directory"},
      {"an empty stage file",
       {{"stage.json", ""}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: malformed JSON at line 1, column 1: unexpected end "
       "of input; expected "
       "'[', '{', or a literal"},
      {"bytes that are not text",
       {{"stage.json", "\xff\xfe{}"}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: malformed JSON at line 1, column 1: invalid "
       "literal"},
      {"an array at the top",
       {{"stage.json", "[1, 2]"}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: /: expected an object, got an array"},
      // The number 1e999 starts in column 19 of line 2.
      {"a number beyond the range of a double",
       {{"stage.json", "{\"name\": \"x\",\n \"temperature_C\": 1e999}"}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: malformed JSON at line 2, column 19: a number "
       "beyond the range of a "
       "double"},
      {"text with no number where a resistance goes",
       {{"stage.json", With("/stage/input_resistor", "ten")}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: /stage/input_resistor: expected a resistance, got "
       "\"ten\" (no number)"},
      // Found by the stage fuzzer: a key holding a newline.
      {"a key with a control character is shown escaped, on one line",
       {{"stage.json", With("/source/voltage/resist\nce", "350")}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: /source/voltage/resist\\nce: unknown key (did you "
       "mean "
       "\"resistance\"?)"},
      {"a temperature below absolute zero",
       {{"stage.json", With("/temperature_C", -300)}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: /temperature_C: expected a temperature above "
       "-273.15 °C and below "
       "1000 °C, got -300"},
      {"an unknown topology",
       {{"stage.json", With("/stage/topology", "noninverting")}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: /stage/topology: unknown topology \"noninverting\" "
       "(did you mean "
       "\"inverting\"?)"},
      {"a transimpedance stage with a voltage source",
       {{"stage.json", tia.dump(2)}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: /source: expected \"photodiode\" for a "
       "transimpedance stage"},
      {"a capacitor target without an automatic capacitor",
       {{"stage.json",
         With("/stage/feedback/capacitor_target", "butterworth")}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: /stage/feedback/capacitor_target: only with "
       "\"capacitor\": \"auto\""},
      {"a device file named by a path that does not exist",
       {{"stage.json", With("/opamp/device", "my-amp.json")}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: /opamp/device: cannot read: no such file or "
       "directory (my-amp.json)"},
      {"a device folder that does not exist",
       {{"stage.json", good}},
       {"--devices", "no-such-folder", "budget", "stage.json"},
       2,
       "error: no-such-folder: device folder not found (given by --devices)"},
      {"a device file with a negative GBW",
       DeviceFolderWith(bad_device),
       {"--devices", "devs", "budget", "stage.json"},
       2,
       "error: devs/opamps/my-class.json: /parameters/gbw: expected a positive "
       "frequency, got "
       "\"-1 MHz\""},
      {"a device file that is not JSON",
       DeviceFolderWith("{\"kind\": "),
       {"--devices", "devs", "budget", "stage.json"},
       2,
       "error: devs/opamps/my-class.json: malformed JSON at line 1, column 10: "
       "unexpected end of "
       "input; expected '[', '{', or a literal"},
      // Found by the device fuzzer: GBW 1e-300 Hz over A0 1e300 puts the
      // open-loop pole at 0 Hz, where the loop search never moved on.
      {"an op-amp whose open-loop pole leaves the double range",
       {{"stage.json",
         With("/opamp/set", {{"open_loop_gain", 1e300}, {"gbw", 1e-300}})}},
       {"budget", "stage.json"},
       2,
       "error: stage.json: /opamp/set/gbw: expected a GBW / open_loop_gain "
       "ratio (the open-loop pole) inside the double range, got 1e-300 Hz / "
       "1e+300"},
      // Refused analyses: exit 1, the file named, the reason given.
      {"a phase margin no capacitor can reach",
       {{"stage.json", unreachable.dump(2)}},
       {"budget", "stage.json"},
       1,
       "error: stage.json: analysis refused: no feedback capacitor from 1 aF "
       "to 1 uF gives a phase margin of 89.99 deg (the best found: ",
       true},
      // Resistances 200 decades apart: the loop gain underflows to zero.
      {"a feedback network beyond the range of a double",
       {{"stage.json", far_apart.dump(2)}},
       {"budget", "stage.json"},
       1,
       "error: stage.json: analysis refused: no usable feedback: the DC loop "
       "gain is below 1e-06 "
       "and its sign is lost in rounding (the feedback network attenuates far "
       "more than the "
       "op-amp gains)"},
  };
}

}  // namespace

// ------------------------------------------------------ Tables per command

TEST_CASE(
    "budget: every bad-input case exits 2 (1 when refused) with one line and "
    "no harm") {
  const std::vector<BadInputCase> cases = BudgetCases();
  CHECK(cases.size() == 21);  // the count in tests/README.md
  for (const BadInputCase& c : cases) RunCase(c);
}

TEST_CASE("budget: the same bad inputs fail the same way with --json") {
  for (BadInputCase c : BudgetCases()) {
    if (c.args.size() < 2 || c.args.front() != "budget" ||
        c.args[1] == "--jsno")
      continue;
    c.args.insert(c.args.begin() + 1, "--json");
    RunCase(c);
  }
}

TEST_CASE(
    "budget: warnings go to stderr, one line each, and into the JSON; the exit "
    "code stays 0") {
  // 4 V into 100 ohm is 40 mA, beyond the zero-drift class's 15 mA limit;
  // ±4 V also exceeds half of its 5.5 V supply span.
  json stage = GoodStage();
  stage["stage"]["load"] = "100";
  stage["full_scale_output_V"] = 4;
  TempFolder folder;
  folder.Write("stage.json", stage.dump(2));
  const RunResult text = RunBinary(HUSHGAIN_BINARY, {"budget", "stage.json"},
                                   folder.path().string());
  CHECK(text.exit_code == 0);
  const std::vector<std::string> lines = Lines(text.err);
  REQUIRE(lines.size() == 2);
  for (const std::string& line : lines) CHECK(line.rfind("warning: ", 0) == 0);
  CHECK(text.err.find("beyond its 15 mA output limit") != std::string::npos);
  CHECK(text.err.find("exceeds half the 5.5 V supply span") !=
        std::string::npos);

  const RunResult as_json =
      RunBinary(HUSHGAIN_BINARY, {"budget", "--json", "stage.json"},
                folder.path().string());
  CHECK(as_json.exit_code == 0);
  CHECK(as_json.err == text.err);
  const json doc = json::parse(as_json.out);
  REQUIRE(doc.at("warnings").size() == 2);
  for (std::size_t i = 0; i < 2; ++i)
    CHECK("warning: " + doc.at("warnings").at(i).get<std::string>() ==
          lines[i]);
  // The current itself: 4 V (1/100 + 1/100k) at the virtual ground
  // (tests/budget/output_drive_test.cpp has the closed forms).
  CHECK(std::abs(doc.at("full_scale_output_current_A").get<double>() /
                     (4.0 / 100 + 4.0 / 100e3) -
                 1) < 1e-5);
  CHECK(doc.at("output_current_limit_A").get<double>() == 0.015);
}

}  // namespace hushgain::test

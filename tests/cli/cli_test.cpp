// End-to-end tests of the built hushgain binary: every example through
// `budget` and `budget --json`, its figures against expectations derived
// independently (tests/cli/expected/derive_expected.py), and bad input:
// exit code 2, one line on stderr naming the file and the JSON path (or the
// option), nothing on stdout, nothing on disk changed.
#include <doctest/doctest.h>
#include <unistd.h>

#include <algorithm>
#include <cmath>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <map>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "cli/base_stage.h"
#include "cli/run_binary.h"
#include "cli/temp_folder.h"
#include "test_support.h"

namespace hushgain::test {
namespace {

namespace fs = std::filesystem;
using nlohmann::json;

// The engine integrates to a relative error of 1e-4 on the total output
// noise power, about 5e-5 on an rms; derive_expected.py integrates to 1e-11
// and stores 10 digits. 2e-4 on an rms (and on a ratio of two rms values)
// leaves room for the engine's error estimate being conservative by 2x, and
// still catches any change of the model (a missing contributor, a wrong
// noise gain or a lost 1/f term moves these figures by 1e-3 or more).
constexpr double kRelNoiseExpected = 2e-4;
// The DC offsets come from one linear solve on each side: rounding only,
// plus the 10 stored digits.
constexpr double kRelOffsetExpected = 1e-8;
// An "auto" feedback capacitor: the engine bisects ln C_f to 1e-7 and reads
// Q at a -90 degree point it bisects in ln f to 1e-12; Q moves about as
// 1/C_f, so 1e-5 on C_f is 100x the bisection's width and still 500x
// finer than the 0.5 % that separates the section 7 closed form.
constexpr double kRelCapacitorExpected = 1e-5;

RunResult Hushgain(const std::vector<std::string>& args,
                   const std::string& working_dir = "") {
  return RunBinary(HUSHGAIN_BINARY, args, working_dir);
}

std::vector<fs::path> Examples() {
  std::vector<fs::path> out;
  for (const fs::directory_entry& e :
       fs::directory_iterator(fs::path(HUSHGAIN_SOURCE_DIR) / "examples"))
    if (e.path().extension() == ".json") out.push_back(e.path());
  std::sort(out.begin(), out.end());
  return out;
}

// The value at a JSON pointer such as "/noise/output_rms_V"; fails the
// test when it is missing.
const json& At(const json& doc, const std::string& pointer) {
  const json::json_pointer p(pointer);
  REQUIRE_MESSAGE(doc.contains(p), "missing key " << pointer);
  return doc.at(p);
}

void CheckFiniteNumber(const json& doc, const std::string& pointer) {
  const json& v = At(doc, pointer);
  CHECK_MESSAGE(v.is_number(), pointer << " is " << v.dump());
  if (v.is_number())
    CHECK_MESSAGE(std::isfinite(v.get<double>()), pointer << " = " << v);
}

// A valid stage; each bad-input case below changes one thing.
json GoodStage() { return json::parse(test::BadInputBaseStageText()); }

// Runs `hushgain args...` in a temporary folder holding stage.json with
// `stage_text`, and checks the bad-input contract: exit code 2, nothing on
// stdout, exactly the one line `expected_line` on stderr, and the folder
// (the input file included) unchanged afterwards.
void CheckBadInput(const std::string& stage_text,
                   const std::vector<std::string>& args,
                   const std::string& expected_line) {
  TempFolder folder;
  folder.Write("stage.json", stage_text);
  const auto before = folder.Snapshot();
  const RunResult r = Hushgain(args, folder.path().string());
  CHECK(r.exit_code == 2);
  CHECK(r.out == "");
  CHECK(Lines(r.err).size() == 1);
  CHECK(r.err == expected_line + "\n");
  CHECK(folder.Snapshot() == before);
}

void CheckBadStage(const json& stage, const std::string& expected_line) {
  CheckBadInput(stage.dump(2), {"budget", "stage.json"}, expected_line);
  // The same file asked for JSON output fails the same way.
  CheckBadInput(stage.dump(2), {"budget", "--json", "stage.json"},
                expected_line);
}

}  // namespace

TEST_CASE("the repository holds at least three examples") {
  CHECK(Examples().size() >= 3);
}

TEST_CASE("every example runs through budget with exit code 0") {
  for (const fs::path& example : Examples()) {
    CAPTURE(example);
    const std::string before = ReadAll(example);
    const RunResult r = Hushgain({"budget", example.string()});
    CHECK(r.exit_code == 0);
    CHECK(r.err.find("error") == std::string::npos);
    // The table opens with the stage's name from the file.
    const std::string name = json::parse(before).at("name");
    REQUIRE_FALSE(Lines(r.out).empty());
    CHECK(Lines(r.out)[0] == name);
    CHECK(r.out.find("total") != std::string::npos);
    CHECK(ReadAll(example) == before);
  }
}

TEST_CASE(
    "budget --json of every example has the documented keys as finite values") {
  for (const fs::path& example : Examples()) {
    CAPTURE(example);
    const RunResult r = Hushgain({"budget", "--json", example.string()});
    REQUIRE(r.exit_code == 0);
    const json doc = json::parse(r.out);  // throws (fails) on bad JSON

    for (const char* key :
         {"/noise/output_rms_V", "/noise/output_peak_to_peak_V",
          "/noise/input_referred_rms", "/signal_gain/magnitude",
          "/reference_frequency_Hz", "/band_Hz/0", "/band_Hz/1",
          "/temperature_K", "/offset/vos_V", "/offset/ib_V", "/offset/ios_V",
          "/offset/worst_case_V", "/offset/rss_V"})
      CheckFiniteNumber(doc, key);
    CHECK(At(doc, "/band_Hz").size() == 2);
    CHECK(At(doc, "/noise/input_referred_unit").is_string());

    const json& contributors = At(doc, "/noise/contributors");
    REQUIRE(contributors.is_array());
    CHECK_FALSE(contributors.empty());
    double share_sum = 0, power_sum = 0;
    for (const json& c : contributors) {
      CHECK(c.contains("name"));
      CHECK(c.contains("kind"));
      CHECK(At(c, "/name").is_string());
      CHECK(At(c, "/kind").is_string());
      CheckFiniteNumber(c, "/output_rms_V");
      CheckFiniteNumber(c, "/share");
      share_sum += c.value("share", 0.0);
      const double rms = c.value("output_rms_V", 0.0);
      power_sum += rms * rms;
    }
    // Uncorrelated contributors add in power (DESIGN.md); the shares are
    // fractions of the total power, and p-p is 6.6 x rms (REFERENCES.md
    // section 5, common practice).
    const double total = At(doc, "/noise/output_rms_V").get<double>();
    CHECK(RelErr(share_sum, 1.0) < kRelTight);
    CHECK(RelErr(std::sqrt(power_sum), total) < kRelTight);
    CHECK(RelErr(At(doc, "/noise/output_peak_to_peak_V").get<double>(),
                 6.6 * total) < kRelTight);

    const json stage_file = json::parse(ReadAll(example));
    if (stage_file.at("/stage/feedback"_json_pointer).contains("tee")) {
      CheckFiniteNumber(doc, "/tee/equivalent_resistance_ohm");
      CheckFiniteNumber(doc, "/tee/plain_output_rms_V");
      CheckFiniteNumber(doc, "/tee/noise_cost_ratio");
    } else {
      CHECK_FALSE(doc.contains("tee"));
    }
  }
}

TEST_CASE("budget --json of every example matches the derived expectations") {
  // tests/cli/expected/<example>.json: figures derived without the engine
  // by tests/cli/expected/derive_expected.py (REFERENCES.md section 6 noise
  // gains and section 4 white + 1/f integrals, and an own nodal analysis of
  // the DESIGN.md macro model with a direct solve per source), with the
  // temperature laws of budget/stage_at_temperature.h (values given at 25 °C)
  // and section 8 excess noise from the DC drops, both written there anew,
  // and for a stage with a chain its filter from scipy.signal's prototypes
  // and the converter's definitions;
  // each entry names its method and, where a closed form exists, its
  // distance from it.
  const std::map<std::string, std::string> pointer_of = {
      {"output_rms_V", "/noise/output_rms_V"},
      {"input_referred_rms", "/noise/input_referred_rms"},
      {"worst_case_V", "/offset/worst_case_V"},
      {"noise_cost_ratio", "/tee/noise_cost_ratio"},
      {"feedback_capacitor_F", "/feedback_capacitor_F"},
      {"charge_gain_V_per_C", "/charge/charge_gain_V_per_C"},
      {"input_referred_charge_rms_C", "/noise/input_referred_charge_rms_C"},
      {"output_rms_V_at_min", "/temperature/min/output_rms_V"},
      {"output_rms_V_at_max", "/temperature/max/output_rms_V"},
      {"worst_case_V_at_min", "/temperature/min/worst_case_V"},
      {"worst_case_V_at_max", "/temperature/max/worst_case_V"},
      {"chain_analog_rms_V", "/chain/analog_rms_V"},
      {"chain_total_rms_V", "/chain/total_rms_V"},
      {"adc_snr_dB", "/adc/snr_dB"},
      {"adc_enob_bits", "/adc/enob_bits"},
      {"adc_noise_free_bits", "/adc/noise_free_bits"},
      {"adc_effective_resolution_bits", "/adc/effective_resolution_bits"},
  };
  for (const fs::path& example : Examples()) {
    CAPTURE(example);
    const fs::path expected_path = fs::path(HUSHGAIN_SOURCE_DIR) / "tests" /
                                   "cli" / "expected" / example.filename();
    REQUIRE_MESSAGE(fs::exists(expected_path),
                    "no expectations for " << example.filename());
    const json expected = json::parse(ReadAll(expected_path));
    const RunResult r = Hushgain({"budget", "--json", example.string()});
    REQUIRE(r.exit_code == 0);
    const json doc = json::parse(r.out);

    const json& figures = expected.at("figures");
    CHECK(figures.contains("output_rms_V"));
    CHECK(figures.contains("worst_case_V"));
    for (auto it = figures.begin(); it != figures.end(); ++it) {
      CAPTURE(it.key());
      REQUIRE(pointer_of.count(it.key()) == 1);
      const double want = it.value().at("value").get<double>();
      const double got = At(doc, pointer_of.at(it.key())).get<double>();
      const double tolerance =
          it.key().rfind("worst_case_V", 0) == 0 ? kRelOffsetExpected
          : it.key() == "feedback_capacitor_F"   ? kRelCapacitorExpected
                                                 : kRelNoiseExpected;
      CHECK_MESSAGE(
          RelErr(got, want) < tolerance,
          got << " against " << want << " (" << it.value().at("method") << ")");
    }
    // Contributors listed on their own (each resistor's excess noise sits
    // far under the total's tolerance), found by name.
    if (!expected.contains("contributors_output_rms_V")) continue;
    const json& listed = expected.at("contributors_output_rms_V");
    for (auto it = listed.begin(); it != listed.end(); ++it) {
      CAPTURE(it.key());
      const json* found = nullptr;
      for (const json& c : At(doc, "/noise/contributors"))
        if (c.at("name") == it.key()) found = &c;
      REQUIRE_MESSAGE(found != nullptr, "no contributor " << it.key());
      const double want = it.value().at("value").get<double>();
      const double got = found->at("output_rms_V").get<double>();
      CHECK_MESSAGE(
          RelErr(got, want) < kRelNoiseExpected,
          got << " against " << want << " (" << it.value().at("method") << ")");
    }
  }
}

TEST_CASE("the bad-input stage is good before it is broken") {
  TempFolder folder;
  folder.Write("stage.json", GoodStage().dump(2));
  const RunResult r =
      Hushgain({"budget", "stage.json"}, folder.path().string());
  CHECK(r.exit_code == 0);
  CHECK(r.err == "");
}

TEST_CASE("a missing field is named by its JSON path") {
  json stage = GoodStage();
  stage["stage"].erase("input_resistor");
  CheckBadStage(stage,
                "error: stage.json: /stage/input_resistor: missing (required)");
}

TEST_CASE("an unknown device gets a did-you-mean") {
  json stage = GoodStage();
  stage["opamp"]["device"] = "zero-drfit";
  CheckBadStage(stage,
                "error: stage.json: /opamp/device: unknown op-amp device "
                "\"zero-drfit\" (did you mean \"zero-drift\"?)");
}

TEST_CASE("a negative resistor is refused") {
  json stage = GoodStage();
  stage["stage"]["input_resistor"] = "-1k";
  CheckBadStage(stage,
                "error: stage.json: /stage/input_resistor: expected a positive "
                "resistance, got \"-1k\"");
}

TEST_CASE("a zero resistor is refused") {
  json stage = GoodStage();
  stage["stage"]["feedback"]["resistor"] = 0;
  CheckBadStage(stage,
                "error: stage.json: /stage/feedback/resistor: expected a "
                "positive resistance, got 0");
}

TEST_CASE("a low band edge above the high edge is refused") {
  json stage = GoodStage();
  stage["band_Hz"] = {{"low", "10k"}, {"high", "1k"}};
  CheckBadStage(stage,
                "error: stage.json: /band_Hz/high: expected a frequency above "
                "the low edge (10.00 kHz), got \"1k\"");
}

TEST_CASE("a low band edge at zero is refused") {
  json stage = GoodStage();
  stage["band_Hz"]["low"] = 0;
  CheckBadStage(stage,
                "error: stage.json: /band_Hz/low: expected a positive "
                "frequency (1/f noise diverges at 0 Hz), got 0");
}

TEST_CASE("malformed JSON is reported with its line and column") {
  // Line 3 lacks the comma between two members; the parser stops at the
  // end of the string it did not expect, "high", whose closing quote is in
  // column 29.
  const std::string text =
      "{\n"
      "  \"name\": \"x\",\n"
      "  \"band_Hz\": {\"low\": 1 \"high\": 2}\n"
      "}\n";
  CheckBadInput(text, {"budget", "stage.json"},
                "error: stage.json: malformed JSON at line 3, column 29: "
                "unexpected string literal; expected '}'");
}

TEST_CASE("truncated JSON is reported just after its last character") {
  const std::string text = "{\n  \"name\": \"x\",\n";
  CheckBadInput(text, {"budget", "stage.json"},
                "error: stage.json: malformed JSON at line 3, column 1: "
                "unexpected end of input; expected string literal");
}

TEST_CASE("an unknown unit names the text that failed") {
  json stage = GoodStage();
  stage["stage"]["input_resistor"] = "10 kV";
  CheckBadStage(stage,
                "error: stage.json: /stage/input_resistor: expected a "
                "resistance, got \"10 kV\" (unknown unit \"kV\")");
}

TEST_CASE("an object where a resistance goes is refused") {
  json stage = GoodStage();
  stage["stage"]["input_resistor"] = {{"value", "1k"}};
  CheckBadStage(stage,
                "error: stage.json: /stage/input_resistor: expected a "
                "resistance, got an object");
}

TEST_CASE("a boolean where a resistance goes is refused") {
  json stage = GoodStage();
  stage["stage"]["feedback"]["resistor"] = true;
  CheckBadStage(stage,
                "error: stage.json: /stage/feedback/resistor: expected a "
                "resistance, got a boolean");
}

TEST_CASE("an unknown key gets a did-you-mean") {
  json stage = GoodStage();
  stage["stage"].erase("load");
  stage["stage"]["laod"] = "10k";
  CheckBadStage(stage,
                "error: stage.json: /stage/laod: unknown key (did you mean "
                "\"load\"?)");
}

TEST_CASE("a missing stage file is named") {
  CheckBadInput(GoodStage().dump(), {"budget", "no-such-stage.json"},
                "error: no-such-stage.json: cannot read: no such file or "
                "directory");
}

TEST_CASE("an unknown subcommand gets a did-you-mean") {
  CheckBadInput(GoodStage().dump(), {"budgte", "stage.json"},
                "error: unknown command \"budgte\" (did you mean "
                "\"budget\"?); try --help");
}

// Each command with a misspelled option: before, tee sweep, tee search and
// tia suggest ran with their defaults (exit 0) and the others named the
// word without a suggestion.
TEST_CASE("every command refuses a misspelled option with a did-you-mean") {
  const struct {
    std::vector<std::string> args;
    std::string message;
  } cases[] = {
      {{"budget", "stage.json", "--formt", "json"},
       "budget: unknown option \"--formt\" (did you mean \"--format\"?); "
       "try budget --help"},
      {{"tee", "sweep", "stage.json", "--pionts", "3"},
       "tee sweep: unknown option \"--pionts\" (did you mean "
       "\"--points\"?); try tee sweep --help"},
      {{"tee", "search", "stage.json", "--max", "100k", "--gain-tolerance",
        "0.1%"},
       "tee search: unknown option \"--gain-tolerance\" (did you mean "
       "\"--gain-tol\"?); try tee search --help"},
      {{"tia", "suggest", "stage.json", "--bandwidth", "10k", "--mx", "1M"},
       "tia suggest: unknown option \"--mx\" (did you mean \"--max\"?); "
       "try tia suggest --help"},
      {{"plot", "stage.json", "-o", "x.png", "--onl=gain"},
       "plot: unknown option \"--onl\" (did you mean \"--only\"?); try "
       "plot --help"},
      {{"spread", "stage.json", "--sampels", "10"},
       "spread: unknown option \"--sampels\" (did you mean "
       "\"--samples\"?); try spread --help"},
      {{"--devics", "x", "budget", "stage.json"},
       "unknown option \"--devics\" (did you mean \"--devices\"?); try "
       "--help"},
  };
  for (const auto& c : cases) {
    CAPTURE(c.message);
    CheckBadInput(GoodStage().dump(), c.args,
                  "error: command line: " + c.message);
  }
}

// README, "Warnings": each warning once on stderr, and the same text with
// the report (text: "warning: ..." lines at its end; JSON: `warnings`).
TEST_CASE("warnings go to stderr and stay with the report") {
  int warned = 0;
  for (const fs::path& example : Examples()) {
    CAPTURE(example);
    const RunResult text = Hushgain({"budget", example.string()});
    const RunResult js = Hushgain({"budget", "--json", example.string()});
    REQUIRE(text.exit_code == 0);
    const json warnings = json::parse(js.out).at("warnings");
    std::vector<std::string> err_lines = Lines(text.err);
    CHECK(err_lines.size() == warnings.size());
    for (std::size_t i = 0; i < err_lines.size() && i < warnings.size(); ++i) {
      const std::string line = "warning: " + warnings[i].get<std::string>();
      CHECK(err_lines[i] == line);
      CHECK(text.out.find("\n" + line + "\n") != std::string::npos);
      ++warned;
    }
  }
  CHECK(warned > 0);  // at least one example has something to say
}

TEST_CASE("a --tolerance outside 0 to 1 is refused") {
  CheckBadInput(GoodStage().dump(),
                {"budget", "--tolerance", "0", "stage.json"},
                "error: command line: --tolerance: expected a relative "
                "tolerance in (0, 1), got 0");
  CheckBadInput(GoodStage().dump(),
                {"budget", "--tolerance", "1.5", "stage.json"},
                "error: command line: --tolerance: expected a relative "
                "tolerance in (0, 1), got 1.5");
}

TEST_CASE("a --tolerance that is not a number is refused") {
  CheckBadInput(GoodStage().dump(),
                {"budget", "--tolerance", "tight", "stage.json"},
                "error: command line: --tolerance: expected a number, got "
                "\"tight\"");
}

}  // namespace hushgain::test

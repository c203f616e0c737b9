// `hushgain budget` of a stage with a chain, end to end: the converter's
// figures under the JSON keys adc.snr_dB, adc.enob_bits,
// adc.noise_free_bits and adc.effective_resolution_bits, the chain table in
// text and Markdown agreeing with the JSON, the CSV table, and the examples
// without a chain printing no chain at all.
#include <doctest/doctest.h>

#include <cmath>
#include <cstdio>
#include <nlohmann/json.hpp>
#include <string>

#include "cli/base_stage.h"
#include "cli/cli_support.h"
#include "cli/temp_folder.h"
#include "io/units.h"
#include "test_support.h"

namespace hushgain {
namespace {

using nlohmann::json;
using test::RelErr;
using test::RunHushgain;
using test::TempFolder;

std::string StageWithChain() {
  json stage = json::parse(test::BadInputBaseStageText());
  stage["chain"] = json::parse(R"({
      "filter": {"kind": "butterworth", "order": 2, "cutoff": "2k"},
      "adc": {"bits": 16, "full_scale": "4.096", "sample_rate": "100k",
              "snr_dB": 90}})");
  return stage.dump(2);
}

TEST_CASE("budget of a stage with a chain reports the converter's figures") {
  TempFolder dir("chain");
  const std::string path = dir.Write("stage.json", StageWithChain()).string();
  const auto r = RunHushgain({"budget", "--format", "json", path});
  REQUIRE(r.exit_code == 0);
  const json j = json::parse(r.out);
  REQUIRE(j.contains("adc"));
  REQUIRE(j.contains("chain"));
  const json& adc = j["adc"];
  const double total = j["chain"]["total_rms_V"].get<double>();
  // The definitions (budget/chain_block.h, REFERENCES.md section 13):
  // SNR against a full-scale sine of rms 4.096 / (2 sqrt 2), ENOB
  // (SNR - 1.76) / 6.02 with exact constants, noise-free bits
  // log2(FS / (6.6 rms)), effective resolution log2(FS / rms).
  CHECK(RelErr(adc["snr_dB"].get<double>(),
               20 * std::log10(4.096 / (2 * std::sqrt(2.0)) / total)) <
        test::kRelTight);
  CHECK(RelErr(adc["enob_bits"].get<double>(),
               (adc["snr_dB"].get<double>() - 10 * std::log10(1.5)) /
                   (20 * std::log10(2.0))) < test::kRelTight);
  CHECK(RelErr(adc["noise_free_bits"].get<double>(),
               std::log2(4.096 / (6.6 * total))) < test::kRelTight);
  CHECK(RelErr(adc["effective_resolution_bits"].get<double>(),
               std::log2(4.096 / total)) < test::kRelTight);
  // The front end's white density through a 2nd-order Butterworth adds to
  // the converter's 90 dB: the SNR is below 90 dB.
  CHECK(adc["snr_dB"].get<double>() < 90.0);
  double power = 0;
  for (const json& block : j["chain"]["blocks"])
    power += std::pow(block["rms_V"].get<double>(), 2);
  CHECK(RelErr(std::sqrt(power), total) < 1e-12);

  // Text and Markdown show the same rows.
  const auto text = RunHushgain({"budget", path});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("Signal chain to the converter: 16 bits, 4.096 V full "
                      "scale (peak to peak), 100.0 kHz sampling (Nyquist "
                      "50.00 kHz)") != std::string::npos);
  const std::string front =
      FormatEng(j["chain"]["blocks"][0]["rms_V"].get<double>(), "V");
  CHECK(text.out.find("front end") != std::string::npos);
  CHECK(text.out.find(front) != std::string::npos);
  const auto md = RunHushgain({"budget", "--format", "markdown", path});
  REQUIRE(md.exit_code == 0);
  CHECK(md.out.find("| front end | " + front + " |") != std::string::npos);
  CHECK(md.out.find("- converter: SNR ") != std::string::npos);
}

TEST_CASE("budget --chain-csv writes the chain table in SI numbers") {
  TempFolder dir("chain-csv");
  const std::string path = dir.Write("stage.json", StageWithChain()).string();
  const std::string csv = dir / "chain.csv";
  const auto r = RunHushgain({"budget", "--chain-csv", csv, path});
  REQUIRE(r.exit_code == 0);
  const auto rows = test::ReadCsv(test::ReadAll(csv));
  REQUIRE(rows.size() == 6);
  CHECK(rows[0] ==
        std::vector<std::string>{"block", "rms_V", "lsb_rms", "share"});
  CHECK(rows[1][0] == "front end");
  CHECK(rows[5][0] == "total");
  const json j =
      json::parse(RunHushgain({"budget", "--format", "json", path}).out);
  CHECK(RelErr(std::stod(rows[5][1]), j["chain"]["total_rms_V"].get<double>()) <
        1e-8);
  CHECK(RelErr(std::stod(rows[5][2]), j["adc"]["noise_lsb_rms"].get<double>()) <
        1e-8);
}

TEST_CASE("budget --chain-csv of a stage without a chain is refused") {
  TempFolder dir("chain-csv-none");
  const auto r = RunHushgain({"budget", "--chain-csv", dir / "chain.csv",
                              test::ExamplePath("load-cell-bridge")});
  CHECK(r.exit_code == 2);
  CHECK(r.out.empty());
  CHECK(r.err ==
        "error: command line: --chain-csv: the stage has no \"chain\" "
        "block\n");
  CHECK(dir.Files().empty());
}

TEST_CASE(
    "plot draws the chain's panel and its cumulative noise reaches the "
    "budget's") {
  TempFolder dir("chain-plot");
  const std::string path = dir.Write("stage.json", StageWithChain()).string();
  const std::string svg = dir / "sheet.svg";
  const std::string script = dir / "sheet.gp";
  const auto r = RunHushgain({"plot", path, "-o", svg, "--script", script});
  REQUIRE(r.exit_code == 0);
  CHECK(test::ReadAll(svg).find("Signal chain: noise at the converter") !=
        std::string::npos);
  // The last line of the $chain datablock: the cumulative analog rms at
  // the converter's input up to where the count stopped, by the trapezoid
  // in log f on 50 points a decade (integrate/cumulative_power.h: about
  // 2e-4 on a white density), against the budget's adaptive integral.
  const std::string gp = test::ReadAll(script);
  const std::size_t start = gp.find("$chain << EOD\n");
  REQUIRE(start != std::string::npos);
  const std::size_t end = gp.find("\nEOD\n", start);
  const std::string last =
      gp.substr(gp.rfind('\n', end - 1) + 1, end - gp.rfind('\n', end - 1) - 1);
  double f = 0, rms = 0, db = 0;
  REQUIRE(std::sscanf(last.c_str(), "%lf %lf %lf", &f, &rms, &db) == 3);
  const json j =
      json::parse(RunHushgain({"budget", "--format", "json", path}).out);
  CHECK(RelErr(f, j["chain"]["fold"]["counted_to_Hz"].get<double>()) < 1e-6);
  CHECK(RelErr(rms, j["chain"]["analog_rms_V"].get<double>()) < 0.01);
}

TEST_CASE("budget of the two-stage example names its second stage file") {
  // examples/two-stage: a x(-20) front end whose chain names
  // gain-stage-x10.json, an inverting R_f/R_in = 20k/2k stage on the
  // precision-bipolar class (A0 135 dB): its DC gain is
  // -(R_f/R_in) A0/(A0 + NG) (REFERENCES.md section 11); the class's 60 ohm
  // output resistance into the 10 k load and R_f lowers the loop gain by
  // under 1 %, which moves the gain by parts in 1e8: 1e-6 covers it.
  const std::string examples = std::string(HUSHGAIN_SOURCE_DIR) + "/examples";
  const std::string front = examples + "/two-stage/geophone-front-end.json";
  const auto r = RunHushgain({"budget", "--format", "json", front});
  REQUIRE(r.exit_code == 0);
  const json j = json::parse(r.out);
  const json& second = j["chain"]["second_stage"];
  CHECK(second["stage"] == "gain-stage-x10.json");
  CHECK(second["name"] == "second gain stage x10");
  const double a0 = std::pow(10.0, 135.0 / 20);
  CHECK(RelErr(second["gain_dc"].get<double>(), -10 * a0 / (a0 + 11)) < 1e-6);
  const json& blocks = j["chain"]["blocks"];
  REQUIRE(blocks.size() == 5);
  CHECK(blocks[1]["name"] == "second stage gain-stage-x10.json");
  double own = 0;
  for (const json& c : j["chain"]["second_stage_contributors"])
    own += std::pow(c["rms_V"].get<double>(), 2);
  CHECK(RelErr(std::sqrt(own), blocks[1]["rms_V"].get<double>()) < 1e-12);
  const auto text = RunHushgain({"budget", front});
  REQUIRE(text.exit_code == 0);
  CHECK(text.out.find("  second stage gain-stage-x10.json  ") !=
        std::string::npos);
  CHECK(text.out.find("stage file gain-stage-x10.json (\"second gain stage "
                      "x10\", precision bipolar), its network solved") !=
        std::string::npos);

  // A relative path from another working folder, and standard input read
  // in the pair's folder (its paths relative to the working folder), give
  // the same chain.
  const auto relative = test::RunBinary(
      HUSHGAIN_BINARY,
      {"budget", "--format", "json", "two-stage/geophone-front-end.json"},
      examples);
  REQUIRE(relative.exit_code == 0);
  const auto piped =
      test::RunBinary(HUSHGAIN_BINARY, {"budget", "--format", "json", "-"},
                      examples + "/two-stage", front);
  REQUIRE(piped.exit_code == 0);
  for (const auto& other : {relative, piped})
    CHECK(json::parse(other.out)["chain"] == j["chain"]);
}

TEST_CASE("a second stage file that is not there is one line naming its path") {
  // Standard input elsewhere: the path is taken from the working folder,
  // where no such file is.
  TempFolder dir("chain-second-missing");
  const std::string front = std::string(HUSHGAIN_SOURCE_DIR) +
                            "/examples/two-stage/geophone-front-end.json";
  const auto piped = test::RunBinary(HUSHGAIN_BINARY, {"budget", "-"},
                                     dir.path().string(), front);
  CHECK(piped.exit_code == 2);
  CHECK(piped.out.empty());
  CHECK(piped.err ==
        "error: stdin: /chain/second_stage/stage: cannot read: no such file "
        "or directory (gain-stage-x10.json)\n");
  // A file naming itself.
  json self = json::parse(test::ReadAll(front));
  self["chain"]["second_stage"]["stage"] = "self.json";
  const std::string path = dir.Write("self.json", self.dump(2)).string();
  const auto r = RunHushgain({"budget", path});
  CHECK(r.exit_code == 2);
  CHECK(r.out.empty());
  CHECK(r.err == "error: " + path +
                     ": /chain/second_stage/stage: names this stage file "
                     "itself (" +
                     path + "): a stage cannot follow itself\n");
}

TEST_CASE(
    "a second stage file hands on its warnings and names its largest part") {
  // The second stage R_in 1 M, R_f 10 M on the precision-bipolar class:
  // at its output R_in's 4kT R_in (R_f/R_in)^2 is ten times R_f's 4kT R_f
  // and far above e_n NG = 8 nV x 11 (REFERENCES.md section 6), so it is
  // the block's largest contributor; 10 M against the class's 4 pF pins
  // leaves it a low phase margin, which its own budget warns of.
  TempFolder dir("chain-second-warnings");
  json front = json::parse(test::BadInputBaseStageText());
  front["stage"]["input_resistor"] = "100k";
  front["chain"] = json::parse(R"({"second_stage": {"stage": "second.json"},
      "adc": {"bits": 16, "full_scale": "4.096", "sample_rate": "100k"}})");
  json second = json::parse(test::BadInputBaseStageText());
  second["name"] = "noisy second";
  second.erase("source");
  second["opamp"]["device"] = "precision-bipolar";
  second["stage"]["input_resistor"] = "1M";
  second["stage"]["feedback"]["resistor"] = "10M";
  const std::string front_path = dir.Write("front.json", front.dump(2));
  const std::string second_path = dir.Write("second.json", second.dump(2));
  const auto r = RunHushgain({"budget", front_path});
  REQUIRE(r.exit_code == 0);
  // Its band and temperature are the front stage's here, so its own
  // budget's warnings are the ones it hands on.
  const auto alone = RunHushgain({"budget", second_path});
  REQUIRE(alone.exit_code == 0);
  const std::string prefix = "warning: ";
  int handed_on = 0;
  for (const std::string& line : test::Lines(alone.err)) {
    REQUIRE(line.rfind(prefix, 0) == 0);
    CAPTURE(line);
    CHECK(r.err.find(prefix + "second stage second.json: " +
                     line.substr(prefix.size()) + "\n") != std::string::npos);
    ++handed_on;
  }
  CHECK(handed_on >= 1);
  CHECK(alone.err.find("phase margin") != std::string::npos);
  CHECK(r.out.find("  dominant               second stage second.json (") !=
        std::string::npos);
  const std::size_t dominant = r.out.find("  dominant ");
  CHECK(r.out.find("its largest contributor R_in (", dominant) !=
        std::string::npos);
}

TEST_CASE("examples without a chain print no chain") {
  for (const std::string& example : test::ExamplePaths()) {
    const json stage = json::parse(test::ReadAll(example));
    if (stage.contains("chain")) continue;
    CAPTURE(example);
    const auto r = RunHushgain({"budget", "--format", "json", example});
    REQUIRE(r.exit_code == 0);
    const json j = json::parse(r.out);
    CHECK_FALSE(j.contains("chain"));
    CHECK_FALSE(j.contains("adc"));
    const auto text = RunHushgain({"budget", example});
    CHECK(text.out.find("Signal chain") == std::string::npos);
  }
}

}  // namespace
}  // namespace hushgain

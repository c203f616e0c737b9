// `hushgain tee sweep` and `hushgain tee search` end to end: the built
// binary is run, its exit code, whole stderr message and output checked.
#include <doctest/doctest.h>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>
#include <string>
#include <vector>

#include "cli/run_binary.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RunResult;

// Runs the binary in the source folder with `args`, plain words split at
// spaces (no shell: nothing here needs quoting).
RunResult RunHushgain(const std::string& args) {
  std::vector<std::string> words;
  std::istringstream in(args);
  for (std::string word; in >> word;) words.push_back(word);
  return test::RunBinary(HUSHGAIN_BINARY, words, HUSHGAIN_SOURCE_DIR);
}

const char* kTee = "examples/geophone-preamp.json";

void CheckBadInput(const std::string& args, const std::string& message) {
  const RunResult r = RunHushgain(args);
  CAPTURE(args);
  CHECK(r.exit_code == 2);
  CHECK(r.err == message + "\n");
  CHECK(r.out.empty());
}

TEST_CASE("tee commands refuse bad input with one line and exit code 2") {
  const std::string search = std::string("tee search ") + kTee + " ";
  CheckBadInput(search + "--series E97 --max 100k",
                "error: command line: --series: unknown series \"E97\" (did "
                "you mean \"E96\"?)");
  CheckBadInput(search + "--max 100k --gain-tol=-0.5%",
                "error: command line: --gain-tol: expected a non-negative "
                "tolerance, got \"-0.5%\"");
  CheckBadInput(search + "--series E6 --min 101 --max 140",
                "error: command line: --min/--max: no E6 value lies between "
                "101.0 \xCE\xA9 and 140.0 \xCE\xA9");
  CheckBadInput(search + "--min 10k --max 1k",
                "error: command line: --max: 1.000 k\xCE\xA9 is below --min "
                "(10.00 k\xCE\xA9)");
  CheckBadInput(search + "--max ten",
                "error: command line: --max: expected a resistance, got "
                "\"ten\" (no number)");
  CheckBadInput(search + "--max 100k --rank noize",
                "error: command line: --rank: unknown ranking \"noize\" (did "
                "you mean \"noise\"?)");
  CheckBadInput(search + "--max 100k --input-min 1k",
                "error: command line: --input-min: needs --free-input");
  CheckBadInput(search + "--max 100k --top 0",
                "error: command line: --top: expected 1 to 10000, got 0");
  CheckBadInput("tee sweep examples/load-cell-bridge.json",
                "error: examples/load-cell-bridge.json: /stage/feedback: tee "
                "sweep needs a T network (\"tee\"), this stage has one "
                "resistor");
  CheckBadInput(std::string("tee sweep ") + kTee + " --min 20M",
                "error: command line: --min: 20.00 M\xCE\xA9 is not below the "
                "equivalent resistance (10.00 M\xCE\xA9)");
  // A photodiode stage's gain is a transimpedance: no V/V target to search
  // for (it was refused naming an internal field, "target_gain ... inf").
  CheckBadInput("tee search examples/smoke-chamber-receiver.json --max 100k",
                "error: examples/smoke-chamber-receiver.json: /stage/topology: "
                "tee search needs a voltage source (its gain target is R_eq / "
                "(R_source + R_in)); a transimpedance stage's gain is R_eq "
                "itself, and tee sweep takes a T network there");
  CheckBadInput(
      "tee search examples/smoke-chamber-receiver.json --max 100k --gain 100",
      "error: examples/smoke-chamber-receiver.json: /stage/topology: "
      "tee search needs a voltage source (its gain target is R_eq / "
      "(R_source + R_in)); a transimpedance stage's gain is R_eq "
      "itself, and tee sweep takes a T network there");
  CheckBadInput("tee swep x.json",
                "error: command line: unknown tee command \"swep\" (did you "
                "mean \"sweep\"?); try tee --help");
}

TEST_CASE("a search with nothing in tolerance says what to relax, exit 1") {
  const RunResult r = RunHushgain(std::string("tee search ") + kTee +
                                  " --series E6 --max 100k --gain-tol 0.1%");
  CHECK(r.exit_code == 1);
  CHECK(r.err ==
        "error: examples/geophone-preamp.json: no T network of E6 values "
        "from 100.0 \xCE\xA9 to 100.0 k\xCE\xA9 has a gain within 0.1 % of "
        "909.447; relax --gain-tol, widen --min/--max or take a denser "
        "--series\n");
  CHECK(r.out.empty());
}

TEST_CASE("tee search prints networks in tolerance, least noise first") {
  // The example's own gain is Req / (R_source + R_in) = 10.2 M / 11 k
  // (R1 = R2 = 100k, R3 = 1.02k; Kennelly's Req). The tolerance applies to
  // the engine's DC gain (finite A0), and the rows come in order of
  // input-referred noise, the default ranking.
  const double target = (100e3 + 100e3 + 100e3 * 100e3 / 1.02e3) / 11e3;
  const RunResult r = RunHushgain(std::string("tee search ") + kTee +
                                  " --series E96 --max 100k --gain-tol 0.5% "
                                  "--top 5 --csv");
  REQUIRE(r.exit_code == 0);
  // RFC 4180 records (CRLF), read by test::ReadCsv.
  const auto rows = test::ReadCsv(r.out);
  REQUIRE(rows.size() == 6);
  CHECK(rows[0][0] == "rank");
  CHECK(rows[0][5] == "signal_gain_dc");
  CHECK(rows[0][9] == "input_rms_V");
  double previous = 0;
  for (int i = 1; i <= 5; ++i) {
    const double r_in = std::stod(rows[i][1]);
    const double gain = std::fabs(std::stod(rows[i][5]));
    const double input_rms = std::stod(rows[i][9]);
    CHECK(r_in == 10e3);
    for (int c = 2; c <= 4; ++c) {
      const double v = std::stod(rows[i][c]);
      CHECK((v >= 100 && v <= 100e3));
    }
    CHECK(std::fabs(gain / target - 1) <= 0.005);
    CHECK(input_rms >= previous);
    previous = input_rms;
  }
}

TEST_CASE("tee search over a wide range lists only networks in tolerance") {
  // From 1 ohm to 10 MOhm the ideal-gain window holds networks whose noise
  // gain reaches 1e7, far beyond the op-amp's A0: before, those led the
  // list with gain errors near -93 %.
  const RunResult r = RunHushgain(std::string("tee search ") + kTee +
                                  " --series E24 --min 1 --max 10M "
                                  "--gain-tol 0.5% --top 10 --rank noise "
                                  "--csv");
  REQUIRE(r.exit_code == 0);
  const auto rows = test::ReadCsv(r.out);
  REQUIRE(rows.size() == 11);
  REQUIRE(rows[0][6] == "gain_error");
  for (std::size_t i = 1; i < rows.size(); ++i)
    CHECK(std::fabs(std::stod(rows[i][6])) <= 0.005);
}

TEST_CASE("tee search prints the same bytes on any number of threads") {
  // The list and every count in the report are properties of the search,
  // not of how the workers met (before, the closed-form count varied).
  const std::string search = std::string("tee search ") + kTee +
                             " --series E96 --max 100k --gain-tol 1% "
                             "--free-input --top 8 ";
  for (const char* format : {"--format text", "--json"}) {
    CAPTURE(format);
    const RunResult one = RunHushgain(search + format + " --threads 1");
    const RunResult two = RunHushgain(search + format + " --threads 2");
    const RunResult all = RunHushgain(search + format + " --threads 0");
    REQUIRE(one.exit_code == 0);
    CHECK(one.out == two.out);
    CHECK(one.out == all.out);
  }
}

TEST_CASE("tee sweep JSON starts at the plain resistor") {
  const RunResult r = RunHushgain(std::string("tee sweep ") + kTee + " --json");
  REQUIRE(r.exit_code == 0);
  const nlohmann::json doc = nlohmann::json::parse(r.out);
  const double req = 100e3 + 100e3 + 100e3 * 100e3 / 1.02e3;
  CHECK(test::RelErr(doc["equivalent_resistance_ohm"].get<double>(), req) <
        test::kRelTight);
  const auto& rows = doc["rows"];
  REQUIRE(rows.size() == 13);
  CHECK(rows[0]["plain"].get<bool>());
  CHECK(rows[0]["noise_cost_ratio"].get<double>() == 1.0);
  CHECK(rows[12]["noise_cost_ratio"].get<double>() > 1.0);
}

}  // namespace

TEST_CASE(
    "tee sweep --min 300 flags the rows whose offset exceeds full scale") {
  // The geophone's full scale is 10 V; down at 300 ohm the T network's
  // noise gain (3.3e4) takes the worst-case offset to 10.79 V. Every row
  // whose offset is beyond 10 V carries offset>FS, and no other row does.
  const RunResult r =
      RunHushgain(std::string("tee sweep ") + kTee + " --min 300 --format csv");
  REQUIRE(r.exit_code == 0);
  const auto rows = test::ReadCsv(r.out);
  REQUIRE(rows.size() > 2);
  const auto& header = rows[0];
  const auto at = [&](const std::string& name) {
    const auto it = std::find(header.begin(), header.end(), name);
    REQUIRE(it != header.end());
    return static_cast<std::size_t>(it - header.begin());
  };
  const std::size_t flags = at("flags"), offset = at("offset_worst_case_V");
  int flagged = 0;
  for (std::size_t i = 1; i < rows.size(); ++i) {
    CAPTURE(i);
    const bool beyond = std::stod(rows[i][offset]) > 10.0;
    CHECK((rows[i][flags].find("offset>FS") != std::string::npos) == beyond);
    flagged += beyond;
  }
  CHECK(flagged >= 1);
  CHECK(r.err.find("the worst-case output offset (10.79 V) exceeds the "
                   "full-scale swing") != std::string::npos);
}

}  // namespace hushgain

// --format on `tia suggest` and `spread` (README, "Commands"): every format
// carries the same figures. JSON is the reference; CSV holds the same SI
// numbers to the 9 significant digits CsvNumber prints, Markdown the same
// table as text, and the text report is what it was before --format.
#include <doctest/doctest.h>

#include <cmath>
#include <nlohmann/json.hpp>
#include <string>
#include <vector>

#include "cli/cli_support.h"
#include "test_support.h"

namespace hushgain::test {
namespace {

using nlohmann::json;

// CsvNumber prints %.9g: a relative rounding of at most 5e-9.
constexpr double kRelCsvDigits = 1e-8;

RunResult Hushgain(const std::vector<std::string>& args) {
  return RunBinary(HUSHGAIN_BINARY, args);
}

double Number(const std::string& cell) { return std::stod(cell); }

TEST_CASE("tia suggest: csv and json carry the same proposals") {
  const std::string stage = ExamplePath("smoke-chamber-receiver");
  const RunResult j =
      Hushgain({"tia", "suggest", stage, "--bandwidth", "20k", "--json"});
  const RunResult c = Hushgain(
      {"tia", "suggest", stage, "--bandwidth", "20k", "--format", "csv"});
  REQUIRE(j.exit_code == 0);
  REQUIRE(c.exit_code == 0);
  const json rows = json::parse(j.out)["rows"];
  const auto records = ReadCsv(c.out);
  REQUIRE(records.size() == rows.size() + 1);
  CHECK(records[0][0] == "rf_ohm");
  CHECK(records[0][1] == "cf_F");
  CHECK(records[0][10] == "meets_target");
  const int best = json::parse(j.out)["best"];
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const auto& r = records[i + 1];
    CHECK(RelErr(Number(r[0]), rows[i]["rf_ohm"]) < kRelCsvDigits);
    CHECK(RelErr(Number(r[1]), rows[i]["cf_F"]) < kRelCsvDigits);
    CHECK(RelErr(Number(r[2]), rows[i]["bandwidth_3db_Hz"]) < kRelCsvDigits);
    CHECK(RelErr(Number(r[7]), rows[i]["input_referred_rms_A"]) <
          kRelCsvDigits);
    CHECK(r[10] == (rows[i]["meets_target"] ? "true" : "false"));
    CHECK(r[11] == (static_cast<int>(i) == best ? "true" : "false"));
  }
}

TEST_CASE("tia suggest: markdown holds the text table's rows") {
  const std::string stage = ExamplePath("smoke-chamber-receiver");
  const RunResult t = Hushgain({"tia", "suggest", stage, "--bandwidth", "20k"});
  const RunResult m = Hushgain(
      {"tia", "suggest", stage, "--bandwidth", "20k", "--format", "markdown"});
  REQUIRE(t.exit_code == 0);
  REQUIRE(m.exit_code == 0);
  CHECK(m.out.rfind("## optical smoke chamber receiver", 0) == 0);
  // Each proposal's R_f and C_f cells appear in both.
  const json rows = json::parse(
      Hushgain({"tia", "suggest", stage, "--bandwidth", "20k", "--json"})
          .out)["rows"];
  int table_rows = 0;
  for (const std::string& line : Lines(m.out))
    if (line.rfind("| ", 0) == 0 && line.find("---") == std::string::npos)
      ++table_rows;
  CHECK(table_rows == static_cast<int>(rows.size()) + 1);  // + header
  CHECK(t.out.find("largest R_f that meets the target") != std::string::npos);
  CHECK(m.out.find("largest R\\_f that meets the target") != std::string::npos);
}

TEST_CASE("tia suggest refuses an unknown format and a contradiction") {
  const std::string stage = ExamplePath("smoke-chamber-receiver");
  const RunResult bad = Hushgain(
      {"tia", "suggest", stage, "--bandwidth", "20k", "--format", "xml"});
  CHECK(bad.exit_code == 2);
  CHECK(bad.err ==
        "error: command line: --format: expected text, json, markdown or "
        "csv, got \"xml\"\n");
  const RunResult both = Hushgain({"tia", "suggest", stage, "--bandwidth",
                                   "20k", "--json", "--format", "csv"});
  CHECK(both.exit_code == 2);
  CHECK(both.err == "error: command line: --json contradicts --format csv\n");
}

TEST_CASE("spread: csv and json carry the same statistics and yields") {
  const std::string stage = ExamplePath("pressure-bridge-outdoor");
  const std::vector<std::string> common = {
      "spread", stage, "--samples",      "3000",
      "--seed", "5",   "--offset-limit", "2m"};
  std::vector<std::string> as_json = common, as_csv = common;
  as_json.push_back("--json");
  as_csv.insert(as_csv.end(), {"--format", "csv"});
  const RunResult j = Hushgain(as_json);
  const RunResult c = Hushgain(as_csv);
  REQUIRE(j.exit_code == 0);
  REQUIRE(c.exit_code == 0);
  const json s = json::parse(j.out);
  CHECK(s["samples"] == 3000);
  CHECK(s["seed"] == 5);
  const auto records = ReadCsv(c.out);
  REQUIRE(records.size() == 4);
  CHECK(records[0] == std::vector<std::string>{
                          "figure", "mean", "sigma", "p_0.135_percent",
                          "p_99.865_percent", "min", "max", "limit", "yield"});
  const char* keys[] = {"gain_error", "offset_V", "noise_rms_V"};
  const char* stats[] = {"mean", "sigma", "p_low", "p_high", "min", "max"};
  for (int f = 0; f < 3; ++f) {
    const auto& r = records[f + 1];
    CHECK(r[0] == keys[f]);
    for (int k = 0; k < 6; ++k) {
      const double want = s[keys[f]][stats[k]];
      INFO(keys[f] << " " << stats[k]);
      CHECK(std::fabs(Number(r[k + 1]) - want) <=
            kRelCsvDigits * std::fabs(want) + 1e-300);
    }
  }
  CHECK(Number(records[2][7]) == doctest::Approx(2e-3));
  CHECK(Number(records[2][8]) == doctest::Approx(double(s["yield"]["offset"])));
  CHECK(records[1][7].empty());  // no gain error limit: no limit, no yield
  CHECK(records[1][8].empty());
  CHECK(s["yield"]["gain_error"].is_null());
  CHECK(s["yield"]["all"] == s["yield"]["offset"]);
}

TEST_CASE("spread: markdown carries the text report's tables") {
  const std::string stage = ExamplePath("geophone-preamp");
  const RunResult t =
      Hushgain({"spread", stage, "--samples", "500", "--noise-limit", "1.2m"});
  const RunResult m =
      Hushgain({"spread", stage, "--samples", "500", "--noise-limit", "1.2m",
                "--format", "markdown"});
  REQUIRE(t.exit_code == 0);
  REQUIRE(m.exit_code == 0);
  CHECK(m.out.rfind("## Monte Carlo: geophone preamp", 0) == 0);
  CHECK(m.out.find("| output noise rms |") != std::string::npos);
  CHECK(m.out.find("### Yield") != std::string::npos);
  CHECK(t.out.find("\nYield\n") != std::string::npos);
  // The same yield figure in both.
  const std::string yield_row = "| all limits |  | ";
  const std::size_t at = m.out.find(yield_row);
  REQUIRE(at != std::string::npos);
  const std::string figure = m.out.substr(
      at + yield_row.size(),
      m.out.find(" |", at + yield_row.size()) - (at + yield_row.size()));
  CHECK(t.out.find("all limits") != std::string::npos);
  CHECK(t.out.find(figure) != std::string::npos);
}

}  // namespace
}  // namespace hushgain::test

// `hushgain spread` end to end: the built binary (HUSHGAIN_BINARY) on stage
// files written here; exit codes and whole error messages (README, "Exit
// codes"), the CSV and its independence from the thread count.
#include <doctest/doctest.h>
#include <unistd.h>

#include <algorithm>
#include <cstdlib>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>
#include <vector>

#include "cli/cli_support.h"

namespace hushgain {
namespace {

namespace fs = std::filesystem;
using test::RunResult;

// `hushgain --devices <source devices> args...`.
RunResult Run(std::vector<std::string> args) {
  args.insert(args.begin(),
              {"--devices", std::string(HUSHGAIN_SOURCE_DIR) + "/devices"});
  return test::RunHushgain(args);
}

std::string StageText(const std::string& temperature,
                      const std::string& tolerance) {
  return R"({
  "name": "cli spread stage",
  "temperature_C": )" +
         temperature + R"(,
  "band_Hz": {"low": "1", "high": "1k"},
  "opamp": {"device": "jfet-input"},
  "source": {"voltage": {"resistance": "100"}},
  "stage": {"topology": "inverting", "input_resistor": "10k", "feedback": {"resistor": "1M"}},
  "resistors": {"technology": "thin-film", "tolerance": ")" +
         tolerance + R"("}
})";
}

TEST_CASE("spread refuses zero samples with one line naming the option") {
  test::TempFolder s("spread-cli");
  const fs::path stage = s.Write("stage.json", StageText("25", "0.1%"));
  const RunResult r = Run({"spread", stage.string(), "--samples", "0"});
  CHECK(r.exit_code == 2);
  CHECK(r.err ==
        "error: command line: --samples: expected 1 to 100000000, got 0\n");
  CHECK(r.out.empty());
}

TEST_CASE("spread refuses a minimum temperature above the maximum") {
  test::TempFolder s("spread-cli");
  const fs::path stage =
      s.Write("stage.json", StageText(R"({"min": 70, "max": -20})", "0.1%"));
  const RunResult r = Run({"spread", stage.string(), "--samples", "10"});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: " + stage.string() +
                     ": /temperature_C: expected min <= nominal <= max, got "
                     "min 70, nominal 25, max -20\n");
}

TEST_CASE(
    "spread refuses a negative tolerance and a limit that is not a voltage") {
  test::TempFolder s("spread-cli");
  const fs::path bad = s.Write("bad.json", StageText("25", "-0.1%"));
  const RunResult r = Run({"spread", bad.string()});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: " + bad.string() +
                     ": /resistors/tolerance: expected a tolerance from 0 to "
                     "below 100 %, got \"-0.1%\"\n");
  const fs::path good = s.Write("good.json", StageText("25", "0.1%"));
  const RunResult limit = Run(
      {"spread", good.string(), "--samples", "10", "--offset-limit", "5Hz"});
  CHECK(limit.exit_code == 2);
  CHECK(limit.err.rfind("error: command line: --offset-limit: expected a "
                        "voltage, got \"5Hz\"",
                        0) == 0);
}

TEST_CASE("spread refuses a CSV in a missing folder before running") {
  test::TempFolder s("spread-cli");
  const fs::path stage = s.Write("stage.json", StageText("25", "0.1%"));
  const std::string csv = (s.path() / "missing" / "x.csv").string();
  const RunResult r =
      Run({"spread", stage.string(), "--samples", "10", "--csv", csv});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: " + csv + ": cannot write: no such folder\n");
}

TEST_CASE(
    "spread writes every sample to the CSV, the same for any thread count "
    "and on stdout") {
  test::TempFolder s("spread-cli");
  const fs::path stage =
      s.Write("stage.json", StageText(R"({"min": -20, "max": 70})", "1%"));
  const fs::path one = s.path() / "one.csv", two = s.path() / "two.csv";
  const RunResult a =
      Run({"spread", stage.string(), "--samples", "5000", "--seed", "3",
           "--threads", "1", "--csv", one.string(), "--offset-limit", "5m",
           "--gain-error-limit", "1%"});
  const RunResult b =
      Run({"spread", stage.string(), "--samples", "5000", "--seed", "3",
           "--threads", "2", "--csv", two.string(), "--offset-limit", "5m",
           "--gain-error-limit", "1%"});
  // More samples than one piece of the CSV (4096 rows), written as they
  // are formatted; on stdout ("-") the same bytes.
  const RunResult piped = Run({"spread", stage.string(), "--samples", "5000",
                               "--seed", "3", "--csv", "-"});
  REQUIRE(a.exit_code == 0);
  REQUIRE(b.exit_code == 0);
  REQUIRE(piped.exit_code == 0);
  const std::string csv = test::ReadAll(one);
  CHECK(csv == test::ReadAll(two));
  CHECK(csv == piped.out);
  CHECK(a.out == b.out);
  CHECK(csv.rfind("index,temperature_C,vos_V,ios_A,gain,gain_error,offset_V,"
                  "noise_rms_V,flags,R_source_ohm,"
                  "R_in_ohm,R_f_ohm\n",
                  0) == 0);
  long lines = 0;
  for (char c : csv) lines += c == '\n';
  CHECK(lines == 5001);
  CHECK(a.out.find("5000 samples, seed 3") != std::string::npos);
  CHECK(a.out.find("all limits") != std::string::npos);
  // No temporary file is left beside the CSV.
  int files = 0;
  for (const auto& e : fs::directory_iterator(s.path()))
    files += e.path().extension() == ".csv";
  CHECK(files == 2);
}

}  // namespace

TEST_CASE("spread flags every sample whose offset leaves no room") {
  // A 20 V full scale on the jfet-input class's 36 V span (half 18 V):
  // every sample's swing leaves the rails, so the flags column of each
  // names it and the summary counts them all. Before, no column existed.
  test::TempFolder s("spread-cli");
  std::string text = StageText("25", "1%");
  text.insert(text.rfind('}'), R"(, "full_scale_output_V": 20)");
  const fs::path stage = s.Write("flags.json", text);
  const fs::path csv = s.path() / "flags.csv";
  const RunResult r =
      Run({"spread", stage.string(), "--samples", "50", "--csv", csv.string()});
  REQUIRE(r.exit_code == 0);
  // The per-sample file is plain LF-ended lines of unquoted cells.
  std::vector<std::vector<std::string>> rows;
  std::istringstream lines(test::ReadAll(csv));
  for (std::string line; std::getline(lines, line);) {
    rows.emplace_back();
    std::istringstream cells(line);
    for (std::string cell; std::getline(cells, cell, ',');)
      rows.back().push_back(cell);
  }
  REQUIRE(rows.size() == 51);
  const auto& header = rows[0];
  const auto flags = std::find(header.begin(), header.end(), "flags");
  REQUIRE(flags != header.end());
  const std::size_t col = flags - header.begin();
  for (std::size_t i = 1; i < rows.size(); ++i)
    CHECK(rows[i][col].find("FS>supply") != std::string::npos);
  CHECK(r.out.find("flagged: 50 of 50 samples cannot work as asked") !=
        std::string::npos);
}

}  // namespace hushgain

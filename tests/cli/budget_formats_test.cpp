// `hushgain budget --format markdown|csv|json` and `--spectrum`, end to end
// on every example: the tables agree with the JSON budget, and the spectrum
// integrates to the budget's totals.
#include <doctest/doctest.h>

#include <algorithm>
#include <cmath>
#include <nlohmann/json.hpp>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include "budget/budget.h"
#include "cli/cli_support.h"
#include "io/units.h"
#include "test_support.h"

namespace hushgain {
namespace {

using nlohmann::json;
using test::RelErr;
using test::RunHushgain;
using test::TempFolder;

// Markdown and text cells carry 4 significant digits: a value read back is
// within half a unit of the 4th digit, 5e-4 relative at worst.
constexpr double kRelFourDigits = 5e-4;
// The CSV spectrum on 50 points per decade, integrated by the trapezoid in
// log f, against the adaptive band integral: the issue asks for 1 %.
constexpr double kRelSpectrum = 0.01;

json BudgetJson(const std::string& example) {
  const auto r = RunHushgain({"budget", "--format", "json", example});
  REQUIRE(r.exit_code == 0);
  return json::parse(r.out);
}

// The cells of the Markdown table row whose first cell is `first`.
std::vector<std::string> MarkdownRow(const std::string& markdown,
                                     const std::string& first) {
  std::istringstream in(markdown);
  std::string line;
  while (std::getline(in, line)) {
    if (line.rfind("| " + first + " |", 0) != 0) continue;
    std::vector<std::string> cells;
    std::size_t start = 1;
    while (start < line.size()) {
      std::size_t end = line.find(" |", start);
      if (end == std::string::npos) break;
      std::string cell = line.substr(start, end - start);
      cell.erase(0, cell.find_first_not_of(' '));
      cells.push_back(cell);
      start = end + 2;
    }
    return cells;
  }
  return {};
}

double Parse(const std::string& text, Quantity q) {
  const std::optional<double> v = ParseQuantity(text, q);
  INFO("cell: " << text);
  REQUIRE(v.has_value());
  return *v;
}

std::vector<std::vector<std::string>> ParseCsv(const std::string& text) {
  // The files hold no quoted fields (names are plain); records end in CRLF.
  std::vector<std::vector<std::string>> rows;
  std::size_t start = 0;
  while (start < text.size()) {
    std::size_t end = text.find("\r\n", start);
    REQUIRE(end != std::string::npos);
    std::vector<std::string> fields;
    std::string record = text.substr(start, end - start);
    std::size_t s = 0;
    for (;;) {
      std::size_t comma = record.find(',', s);
      fields.push_back(record.substr(s, comma - s));
      if (comma == std::string::npos) break;
      s = comma + 1;
    }
    rows.push_back(fields);
    start = end + 2;
  }
  return rows;
}

TEST_CASE("the markdown budget's totals equal the JSON budget's totals") {
  for (const std::string& example : test::ExamplePaths()) {
    INFO("example " << example);
    const json j = BudgetJson(example);
    const auto r = RunHushgain({"budget", "--format", "markdown", example});
    REQUIRE(r.exit_code == 0);
    const std::string& md = r.out;
    CHECK(md.rfind("## Noise budget: ", 0) == 0);

    const std::vector<std::string> total = MarkdownRow(md, "total");
    REQUIRE(total.size() == 7);
    CHECK(RelErr(Parse(total[5], Quantity::kVoltage),
                 j["noise"]["output_rms_V"]) < kRelFourDigits);
    CHECK(RelErr(Parse(total[4], Quantity::kVoltageDensity),
                 j["noise"]["output_density_V_per_rtHz"]) < kRelFourDigits);
    // One row per contributor, each with its rms; negligible excess
    // contributors share one "other excess (N)" row, whose rms adds theirs
    // in power.
    double folded_power = 0;
    int folded = 0;
    for (const json& c : j["noise"]["contributors"]) {
      const std::string name = c["name"];
      if (c["kind"] == "excess" &&
          c["share"].get<double>() < kNegligibleExcessShare) {
        folded_power += std::pow(c["output_rms_V"].get<double>(), 2);
        ++folded;
        continue;
      }
      std::string escaped;
      for (char ch : name)
        escaped += ch == '_' ? std::string("\\_") : std::string(1, ch);
      const std::vector<std::string> row = MarkdownRow(md, escaped);
      INFO("contributor " << name);
      REQUIRE(row.size() == 7);
      if (c["output_rms_V"].get<double>() > 1e-15)
        CHECK(RelErr(Parse(row[5], Quantity::kVoltage), c["output_rms_V"]) <
              kRelFourDigits);
    }
    if (folded > 0) {
      const std::vector<std::string> row =
          MarkdownRow(md, "other excess (" + std::to_string(folded) + ")");
      REQUIRE(row.size() == 7);
      CHECK(RelErr(Parse(row[5], Quantity::kVoltage), std::sqrt(folded_power)) <
            kRelFourDigits);
    }
    const std::vector<std::string> worst = MarkdownRow(md, "worst case");
    const std::vector<std::string> rss = MarkdownRow(md, "root-sum-square");
    REQUIRE(worst.size() == 2);
    REQUIRE(rss.size() == 2);
    CHECK(RelErr(Parse(worst[1], Quantity::kVoltage),
                 j["offset"]["worst_case_V"]) < kRelFourDigits);
    CHECK(RelErr(Parse(rss[1], Quantity::kVoltage), j["offset"]["rss_V"]) <
          kRelFourDigits);
    if (j.contains("tee")) {
      const std::vector<std::string> tee = MarkdownRow(md, "output noise rms");
      REQUIRE(tee.size() == 4);
      CHECK(RelErr(Parse(tee[1], Quantity::kVoltage),
                   j["noise"]["output_rms_V"]) < kRelFourDigits);
      CHECK(RelErr(Parse(tee[2], Quantity::kVoltage),
                   j["tee"]["plain_output_rms_V"]) < kRelFourDigits);
    }
  }
}

TEST_CASE("the csv budget holds every contributor with SI numbers") {
  for (const std::string& example : test::ExamplePaths()) {
    INFO("example " << example);
    const json j = BudgetJson(example);
    const auto r = RunHushgain({"budget", "--format", "csv", example});
    REQUIRE(r.exit_code == 0);
    const auto rows = ParseCsv(r.out);
    const auto& contributors = j["noise"]["contributors"];
    REQUIRE(rows.size() == contributors.size() + 2);
    CHECK(rows[0][0] == "contributor");
    CHECK(rows[0][2] == "output_rms_V");
    for (std::size_t i = 0; i < contributors.size(); ++i) {
      CHECK(rows[i + 1][0] == contributors[i]["name"].get<std::string>());
      // "%.9g": read back within 1e-8 relative.
      CHECK(RelErr(std::stod(rows[i + 1][2]), contributors[i]["output_rms_V"]) <
            1e-8);
    }
    CHECK(rows.back()[0] == "total");
    CHECK(RelErr(std::stod(rows.back()[2]), j["noise"]["output_rms_V"]) < 1e-8);
  }
}

TEST_CASE("the spectrum csv integrates to the budget's output rms") {
  TempFolder dir("spectrum");
  for (const std::string& example : test::ExamplePaths()) {
    INFO("example " << example);
    const json j = BudgetJson(example);
    const std::string csv = dir / (test::Stem(example) + ".csv");
    const auto r = RunHushgain({"budget", "--spectrum", csv, example});
    REQUIRE(r.exit_code == 0);
    const auto rows = ParseCsv(test::ReadAll(csv));
    REQUIRE(rows.size() > 50);
    const std::vector<std::string>& header = rows[0];
    CHECK(header[0] == "f_Hz");
    const std::size_t columns = header.size();
    CHECK(header[columns - 4] == "total_V_per_rtHz");
    // V/A for a current source (a photodiode), V/V for a voltage source.
    CHECK(header[columns - 3] == (j["noise"]["input_referred_unit"] == "A"
                                      ? "signal_gain_V_per_A"
                                      : "signal_gain_V_per_V"));
    CHECK(header[columns - 2] == "noise_gain_V_per_V");
    CHECK(header[columns - 1] == "loop_gain_V_per_V");
    // The band edges are on the grid.
    const double f_low = j["band_Hz"][0], f_high = j["band_Hz"][1];
    CHECK(RelErr(std::stod(rows[1][0]), f_low) < 1e-8);
    CHECK(RelErr(std::stod(rows.back()[0]), f_high) < 1e-8);

    // Trapezoid in u = ln f of S(f) f, for every column of densities.
    std::vector<double> power(columns, 0.0);
    for (std::size_t i = 2; i < rows.size(); ++i) {
      const double f0 = std::stod(rows[i - 1][0]), f1 = std::stod(rows[i][0]);
      const double du = std::log(f1 / f0);
      for (std::size_t c = 1; c < columns - 3; ++c) {
        const double d0 = std::stod(rows[i - 1][c]), d1 = std::stod(rows[i][c]);
        power[c] += 0.5 * du * (d0 * d0 * f0 + d1 * d1 * f1);
      }
    }
    CHECK(RelErr(std::sqrt(power[columns - 4]), j["noise"]["output_rms_V"]) <
          kRelSpectrum);
    // Each contributor with a share above 1 % also matches its own rms.
    for (const json& c : j["noise"]["contributors"]) {
      if (c["share"].get<double>() < 0.01) continue;
      const std::string column = c["name"].get<std::string>() + "_V_per_rtHz";
      const auto it = std::find(header.begin(), header.end(), column);
      REQUIRE(it != header.end());
      CHECK(RelErr(std::sqrt(power[it - header.begin()]), c["output_rms_V"]) <
            kRelSpectrum);
    }
  }
}

TEST_CASE("a T network's budget carries its pi equivalent in JSON") {
  // The geophone example's T: R1 = R2 = 100k, R3 = 1.02k, a 10 V full
  // scale. Star-mesh (Kennelly 1899): S = R1 R2 + R2 R3 + R3 R1, arms S/R3,
  // S/R2, S/R1; the output arm draws 10 V / (S/R1) at full scale.
  const json doc = BudgetJson(test::ExamplePath("geophone-preamp"));
  const double r1 = 100e3, r2 = 100e3, r3 = 1.02e3;
  const double s = r1 * r2 + r2 * r3 + r3 * r1;
  REQUIRE(doc.contains("tee"));
  const json& pi = doc["tee"]["pi"];
  CHECK(RelErr(pi["bridge_ohm"].get<double>(), s / r3) < test::kRelTight);
  CHECK(RelErr(pi["input_arm_ohm"].get<double>(), s / r2) < test::kRelTight);
  CHECK(RelErr(pi["output_arm_ohm"].get<double>(), s / r1) < test::kRelTight);
  CHECK(RelErr(pi["output_arm_current_A"].get<double>(), 10 * r1 / s) <
        test::kRelTight);
  const json& fraction = pi["input_arm_current_fraction"];
  for (const char* at : {"dc", "reference", "band_high"}) {
    CAPTURE(at);
    REQUIRE(fraction.contains(at));
    CHECK(fraction[at].get<double>() > 0);
  }
  // The fraction grows with frequency as |A(f)| falls.
  CHECK(fraction["dc"].get<double>() < fraction["reference"].get<double>());
  CHECK(fraction["reference"].get<double>() <
        fraction["band_high"].get<double>());
}

TEST_CASE("the JSON budget always carries the sensitivities") {
  // Every parameter of the geophone example that is not zero has a row;
  // the offset of its op-amp is Vos NG + ..., so d ln offset / d ln Vos is
  // Vos NG over the worst case: near 1 where Vos dominates (its Ib and Ios
  // are picoamperes into 10 M).
  const json doc = BudgetJson(test::ExamplePath("geophone-preamp"));
  REQUIRE(doc.contains("sensitivity"));
  const json& rows = doc["sensitivity"];
  REQUIRE(rows.is_array());
  std::vector<std::string> names;
  for (const json& r : rows) names.push_back(r["parameter"].get<std::string>());
  for (const char* p : {"R_in", "R1", "R2", "R3", "e_n", "GBW", "Vos"})
    CHECK(std::find(names.begin(), names.end(), p) != names.end());
  for (const json& r : rows)
    if (r["parameter"] == "Vos")
      CHECK(std::fabs(r["offset"].get<double>() - 1) < 0.01);
  CHECK(doc["sensitivity_method"]["largest_error_estimate"].get<double>() <
        1e-4);
  // Text shows it only on request.
  const auto plain =
      RunHushgain({"budget", test::ExamplePath("geophone-preamp")});
  CHECK(plain.out.find("Which part to change") == std::string::npos);
  const auto asked = RunHushgain(
      {"budget", "--sensitivity", test::ExamplePath("geophone-preamp")});
  REQUIRE(asked.exit_code == 0);
  CHECK(asked.out.find("Which part to change") != std::string::npos);
  CHECK(asked.out.find("the change that pays most: halving ") !=
        std::string::npos);
}

TEST_CASE("--json is the same as --format json") {
  const std::string stage = test::ExamplePath("load-cell-bridge");
  const auto a = RunHushgain({"budget", "--json", stage});
  const auto b = RunHushgain({"budget", "--format", "json", stage});
  CHECK(a.exit_code == 0);
  CHECK(a.out == b.out);
  CHECK(json::parse(a.out).contains("noise"));
}

TEST_CASE("a bad --format is one line naming the option and exit code 2") {
  const std::string stage = test::ExamplePath("load-cell-bridge");
  auto r = RunHushgain({"budget", "--format", "markdwn", stage});
  CHECK(r.exit_code == 2);
  CHECK(r.err ==
        "error: command line: --format: expected text, json, markdown or csv, "
        "got \"markdwn\" (did you mean \"markdown\"?)\n");
  CHECK(r.out.empty());
  r = RunHushgain({"budget", "--json", "--format", "csv", stage});
  CHECK(r.exit_code == 2);
  CHECK(r.err == "error: command line: --json contradicts --format csv\n");
}

TEST_CASE("--spectrum into a missing folder fails and leaves nothing") {
  TempFolder dir("spectrumfail");
  const std::string target = dir / "no-such-folder/spectrum.csv";
  const auto r = RunHushgain(
      {"budget", "--spectrum", target, test::ExamplePath("load-cell-bridge")});
  CHECK(r.exit_code == 2);
  CHECK(r.err.rfind("error: " + target + ": cannot write", 0) == 0);
  CHECK(dir.Files().empty());
}

}  // namespace
}  // namespace hushgain

// `hushgain tee sweep|search --format markdown|csv|json` and `--plot`, end
// to end on the T-network example: the Markdown and CSV tables hold the
// JSON's figures, the pictures are valid PNG and SVG, names from the stage
// stay text, and the errors are one line with their exit code.
#include <doctest/doctest.h>

#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include "cli/cli_support.h"
#include "io/units.h"
#include "test_support.h"

namespace hushgain {
namespace {

using nlohmann::json;
using test::HostileStageNames;
using test::ReadAll;
using test::RelErr;
using test::RunHushgain;
using test::TempFolder;

// Markdown cells carry 4 significant digits (5e-4 relative at worst); the
// noise cost "x1.0603" 5 (5e-5 relative at worst, near 1). CSV cells are
// "%.9g".
constexpr double kRelFourDigits = 5e-4;
constexpr double kRelCost = 5e-5;
constexpr double kRelCsv = 1e-8;
// A two-panel sheet is far above this; an empty or cut picture below.
constexpr std::size_t kMinPictureBytes = 20000;

const std::vector<std::string> kSearch = {"--series",   "E96",  "--max", "100k",
                                          "--gain-tol", "0.5%", "--top", "6"};

std::string Example() { return test::ExamplePath("geophone-preamp"); }

test::RunResult Tee(const std::string& sub, std::vector<std::string> args,
                    const std::string& stage = Example()) {
  std::vector<std::string> all = {"tee", sub, stage};
  if (sub == "search") all.insert(all.end(), kSearch.begin(), kSearch.end());
  all.insert(all.end(), args.begin(), args.end());
  return RunHushgain(all);
}

json TeeJson(const std::string& sub) {
  const auto r = Tee(sub, {"--format", "json"});
  REQUIRE(r.exit_code == 0);
  return json::parse(r.out);
}

// The cells of every Markdown table row after the delimiter row.
std::vector<std::vector<std::string>> MarkdownRows(const std::string& md) {
  std::vector<std::vector<std::string>> rows;
  std::istringstream in(md);
  bool body = false;
  for (std::string line; std::getline(in, line);) {
    if (line.rfind("| ---", 0) == 0) {
      body = true;
      continue;
    }
    if (!body || line.rfind("| ", 0) != 0) continue;
    std::vector<std::string> cells;
    std::size_t start = 2;
    for (std::size_t end; (end = line.find(" |", start)) != std::string::npos;
         start = end + 3)
      cells.push_back(line.substr(start, end - start));
    rows.push_back(cells);
  }
  return rows;
}

double Cell(const std::string& text, Quantity q) {
  if (text.rfind("x", 0) == 0) return std::stod(text.substr(1));
  const std::optional<double> v = ParseQuantity(text, q);
  INFO("cell " << text);
  REQUIRE(v.has_value());
  return *v;
}

TEST_CASE("tee sweep markdown holds the JSON's figures, one row per network") {
  const json j = TeeJson("sweep");
  const auto r = Tee("sweep", {"--format", "markdown"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.rfind("## T-network sweep: geophone preamp", 0) == 0);
  CHECK(r.out.find("\n- temperature: ") != std::string::npos);
  CHECK(r.out.find("\n- band: ") != std::string::npos);
  CHECK(r.out.find("\n- gain kept: ") != std::string::npos);
  const auto rows = MarkdownRows(r.out);
  const json& jr = j["rows"];
  REQUIRE(rows.size() == jr.size());
  for (std::size_t i = 0; i < rows.size(); ++i) {
    INFO("row " << i);
    REQUIRE(rows[i].size() == 11);  // ..., noise cost, out-arm I, flags
    CHECK(RelErr(Cell(rows[i][0], Quantity::kResistance),
                 jr[i]["largest_ohm"]) < kRelFourDigits);
    CHECK(RelErr(Cell(rows[i][1], Quantity::kResistance), jr[i]["r1_ohm"]) <
          kRelFourDigits);
    if (!jr[i]["plain"].get<bool>()) {
      CHECK(RelErr(Cell(rows[i][2], Quantity::kResistance), jr[i]["r2_ohm"]) <
            kRelFourDigits);
      CHECK(RelErr(Cell(rows[i][3], Quantity::kResistance), jr[i]["r3_ohm"]) <
            kRelFourDigits);
    } else {
      CHECK(rows[i][3] == "(plain)");
    }
    CHECK(RelErr(Cell(rows[i][4], Quantity::kGain), jr[i]["noise_gain_dc"]) <
          kRelFourDigits);
    CHECK(RelErr(Cell(rows[i][5], Quantity::kVoltage), jr[i]["output_rms_V"]) <
          kRelFourDigits);
    CHECK(RelErr(Cell(rows[i][6], Quantity::kVoltage), jr[i]["input_rms_V"]) <
          kRelFourDigits);
    CHECK(RelErr(Cell(rows[i][7], Quantity::kVoltage),
                 jr[i]["offset_worst_case_V"]) < kRelFourDigits);
    CHECK(RelErr(Cell(rows[i][8], Quantity::kRatio),
                 jr[i]["noise_cost_ratio"]) < kRelCost);
  }
}

TEST_CASE("tee search markdown holds the JSON's figures in rank order") {
  const json j = TeeJson("search");
  const auto r = Tee("search", {"--format", "markdown"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.rfind("## T-network search: geophone preamp", 0) == 0);
  CHECK(r.out.find("\n- target gain: ") != std::string::npos);
  const auto rows = MarkdownRows(r.out);
  const json& best = j["best"];
  REQUIRE(rows.size() == best.size());
  REQUIRE(rows.size() == 6);
  for (std::size_t i = 0; i < rows.size(); ++i) {
    INFO("rank " << i + 1);
    REQUIRE(rows[i].size() == 13);  // ..., out-arm I, flags
    CHECK(rows[i][0] == std::to_string(i + 1));
    const char* ohm_keys[] = {"r_in_ohm", "r1_ohm", "r2_ohm", "r3_ohm"};
    for (int k = 0; k < 4; ++k)
      CHECK(RelErr(Cell(rows[i][1 + k], Quantity::kResistance),
                   best[i][ohm_keys[k]]) < kRelFourDigits);
    CHECK(RelErr(Cell(rows[i][7], Quantity::kVoltage),
                 best[i]["output_rms_V"]) < kRelFourDigits);
    CHECK(RelErr(Cell(rows[i][9], Quantity::kVoltage),
                 best[i]["offset_worst_case_V"]) < kRelFourDigits);
    CHECK(RelErr(Cell(rows[i][10], Quantity::kRatio),
                 best[i]["noise_cost_ratio"]) < kRelCost);
  }
}

TEST_CASE(
    "tee sweep and search CSV parse as RFC 4180 with the JSON's numbers") {
  const json sweep = TeeJson("sweep");
  const auto r = Tee("sweep", {"--format", "csv"});
  REQUIRE(r.exit_code == 0);
  CHECK(Tee("sweep", {"--csv"}).out == r.out);  // --csv is a synonym
  const auto records = test::ReadCsv(r.out);
  REQUIRE(records.size() == sweep["rows"].size() + 1);
  const std::vector<std::string>& h = records[0];
  CHECK(h[0] == "largest_ohm");
  for (std::size_t i = 1; i < records.size(); ++i) {
    const json& row = sweep["rows"][i - 1];
    INFO("row " << i);
    REQUIRE(records[i].size() == h.size());
    for (const char* key :
         {"largest_ohm", "r1_ohm", "noise_gain_dc", "output_rms_V",
          "offset_worst_case_V", "noise_cost_ratio"}) {
      const auto at = std::find(h.begin(), h.end(), key);
      REQUIRE(at != h.end());
      CHECK(RelErr(std::stod(records[i][at - h.begin()]), row[key]) < kRelCsv);
    }
    // Kennelly's Req = R1 + R2 + R1 R2 / R3 is the same on every tee row.
    if (records[i][4] == "0") {
      const double r1 = std::stod(records[i][1]), r2 = std::stod(records[i][2]),
                   r3 = std::stod(records[i][3]);
      CHECK(RelErr(r1 + r2 + r1 * r2 / r3, sweep["equivalent_resistance_ohm"]) <
            1e-6);
    }
  }

  const json search = TeeJson("search");
  const auto s = Tee("search", {"--format", "csv"});
  REQUIRE(s.exit_code == 0);
  CHECK(Tee("search", {"--csv"}).out == s.out);
  const auto ranked = test::ReadCsv(s.out);
  REQUIRE(ranked.size() == search["best"].size() + 1);
  CHECK(ranked[0][8] == "output_rms_V");
  for (std::size_t i = 1; i < ranked.size(); ++i)
    CHECK(RelErr(std::stod(ranked[i][8]),
                 search["best"][i - 1]["output_rms_V"]) < kRelCsv);
}

TEST_CASE("tee format options conflict in one line, exit code 2") {
  struct Case {
    std::vector<std::string> args;
    std::string message;
  };
  const std::vector<Case> cases = {
      {{"--csv", "--json"}, "--csv: cannot be combined with --json"},
      {{"--json", "--format", "markdown"},
       "--json contradicts --format markdown"},
      {{"--csv", "--format", "json"}, "--csv contradicts --format json"},
      {{"--format", "markdwn"},
       "--format: expected text, json, markdown or csv, got \"markdwn\" (did "
       "you mean \"markdown\"?)"},
      {{"--plot", "out.gif"},
       "--plot: expected a file name ending in .png, .svg or .pdf, got "
       "\"out.gif\""},
  };
  for (const char* sub : {"sweep", "search"})
    for (const Case& c : cases) {
      const auto r = Tee(sub, c.args);
      INFO(sub << " " << c.message);
      CHECK(r.exit_code == 2);
      CHECK(r.err == "error: command line: " + c.message + "\n");
      CHECK(r.out.empty());
    }
  // --format text and --json agree: JSON.
  CHECK(Tee("sweep", {"--json", "--format", "text"}).out ==
        Tee("sweep", {"--format", "json"}).out);
}

TEST_CASE("tee sweep and search --plot write a valid PNG and a valid SVG") {
  TempFolder dir("teeplot");
  for (const char* sub : {"sweep", "search"}) {
    INFO(sub);
    const std::string png = dir / (std::string(sub) + ".png");
    const auto p = Tee(sub, {"--plot", png});
    INFO("stderr: " << p.err);
    REQUIRE(p.exit_code == 0);
    CHECK_FALSE(p.out.empty());  // the table is printed as well
    const std::string bytes = ReadAll(png);
    // PNG signature, ISO/IEC 15948 (PNG 2nd ed.) section 5.2.
    CHECK(bytes.compare(0, 8, "\x89PNG\r\n\x1a\n") == 0);
    CHECK(bytes.size() > kMinPictureBytes);

    const std::string svg = dir / (std::string(sub) + ".svg");
    const auto s = Tee(sub, {"--plot", svg});
    REQUIRE(s.exit_code == 0);
    const std::string text = ReadAll(svg);
    CHECK(text.size() > kMinPictureBytes);
    std::string why;
    CHECK_MESSAGE(test::WellFormedXml(text, &why), why);
    const std::string decoded = test::DecodeXmlEntities(text);
    CHECK(decoded.find(
              ">geophone preamp, 10 M equivalent feedback from 100 k parts<") !=
          std::string::npos);
    CHECK(decoded.find(std::string(sub) == "sweep"
                           ? ">Total output noise and noise cost against the "
                             "largest resistor<"
                           : ">Output noise and worst-case offset of each "
                             "network<") != std::string::npos);
  }
  // No temporary file is left beside the pictures.
  for (const std::string& f : dir.Files())
    CHECK(f.find(".tmp-") == std::string::npos);
  CHECK(dir.Files().size() == 4);
}

TEST_CASE("tee --plot draws a hostile stage name as text and runs nothing") {
  TempFolder dir("teeinject");
  const std::string pwned = dir / "pwned";
  const std::vector<std::string> names = HostileStageNames(pwned);
  for (const std::string& name : names) {
    INFO("name " << name);
    json stage = json::parse(ReadAll(Example()));
    stage["name"] = name;
    const std::string stage_path = dir / "stage.json";
    {
      std::ofstream out(stage_path);
      out << stage.dump(2);
    }
    for (const char* sub : {"sweep", "search"}) {
      INFO(sub);
      const std::string svg = dir / "out.svg";
      const auto r =
          Tee(sub, {"--plot", svg, "--format", "markdown"}, stage_path);
      INFO("stderr: " << r.err);
      REQUIRE(r.exit_code == 0);
      CHECK_FALSE(std::filesystem::exists(pwned));
      const std::string text = ReadAll(svg);
      std::string why;
      CHECK_MESSAGE(test::WellFormedXml(text, &why), why);
      CHECK(test::DecodeXmlEntities(text).find(">" + name + "<") !=
            std::string::npos);
      // In the Markdown heading the name's markup characters are escaped
      // (CommonMark 0.30, section 2.4): no raw | * < ` can open markup.
      const std::string heading = r.out.substr(0, r.out.find('\n'));
      const std::string title = heading.substr(heading.find(": ") + 2);
      for (std::size_t k = 0; k < title.size(); ++k)
        if (std::string("|*<>`").find(title[k]) != std::string::npos)
          CHECK((k > 0 && title[k - 1] == '\\'));
    }
  }
}

TEST_CASE("tee --plot without gnuplot names the package and writes nothing") {
  TempFolder dir("teenognuplot");
  for (const char* sub : {"sweep", "search"}) {
    std::vector<std::string> args = {"tee", sub, Example()};
    if (std::string(sub) == "search")
      args.insert(args.end(), kSearch.begin(), kSearch.end());
    args.push_back("--plot");
    args.push_back(dir / "out.png");
    const auto r = RunHushgain(args, {"PATH=" + dir / "empty-path"});
    CHECK(r.exit_code == 3);
    CHECK(r.err == "error: tee " + std::string(sub) +
                       " --plot needs gnuplot, which is not on PATH; install "
                       "the Debian package gnuplot-nox (apt-get install "
                       "gnuplot-nox)\n");
    CHECK(r.out.empty());
    CHECK(dir.Files().empty());
  }
}

}  // namespace
}  // namespace hushgain

// The T-network sweep and search tables: one list of columns rendered as
// text, Markdown and CSV, so every rendering holds the same figures; the
// Markdown sections for a design note; hostile stage names kept as text.
#include "report/tee_tables.h"

#include <doctest/doctest.h>

#include <optional>
#include <sstream>
#include <string>
#include <vector>

#include "io/units.h"
#include "report/tee_report.h"
#include "test_support.h"

namespace hushgain {
namespace {

using test::RelErr;

// Display cells carry 4 significant digits (FormatEng): half a unit of the
// 4th digit is at most 5e-4 relative. CSV cells are "%.9g".
constexpr double kRelFourDigits = 5e-4;
constexpr double kRelCsv = 1e-8;

Budget RowBudget(double output_rms_v, double offset_v, double noise_gain) {
  Budget b;
  b.stage_name = "bench | *tee* <b>";
  b.temperature_k = 298.15;
  b.band_low_hz = 10;
  b.band_high_hz = 5e3;
  b.input_unit = "V";
  b.signal_gain_dc = -909.0;
  b.noise_gain_dc = noise_gain;
  b.output_rms_v = output_rms_v;
  b.input_rms = output_rms_v / 909.0;
  b.offset.worst_case_v = offset_v;
  return b;
}

// Req = 10 MΩ; the plain row and the row with L = 100 kΩ of the default
// rule (design/tee_sweep.h): R1 = R2 = L, R3 = L^2 / (Req - 2 L), so that
// Kennelly's R1 + R2 + R1 R2 / R3 gives Req back.
TeeSweepResult SmallSweep() {
  const double req = 10e6, l = 100e3;
  TeeSweepResult s;
  s.equivalent_ohm = req;
  TeeSweepRow plain;
  plain.largest_ohm = req;
  plain.plain = true;
  plain.tee = {req, 0, 0};
  plain.budget = RowBudget(929.6e-6, 0.2729, 909.6);
  plain.noise_cost_ratio = 1.0;
  TeeSweepRow tee;
  tee.largest_ohm = l;
  tee.tee = {l, l, l * l / (req - 2 * l)};
  tee.budget = RowBudget(985.6e-6, 0.3023, 1007.0);
  tee.noise_cost_ratio = 985.6e-6 / 929.6e-6;
  s.rows = {plain, tee};
  return s;
}

// A display cell read back: "100.0 kΩ", "985.6 µV", "x1.0603", "909.6".
double DisplayValue(const std::string& cell, Quantity q) {
  if (!cell.empty() && cell[0] == 'x') return std::stod(cell.substr(1));
  const std::optional<double> v = ParseQuantity(cell, q);
  INFO("cell " << cell);
  REQUIRE(v.has_value());
  return *v;
}

TEST_CASE("the RFC 4180 reader reads the RFC's own examples") {
  // RFC 4180 section 2, rules 6 and 7: "aaa","b""bb","ccc" and a quoted
  // line break.
  const auto r =
      test::ReadCsv("\"aaa\",\"b\"\"bb\",\"ccc\"\r\nzzz,\"x\r\ny\",\r\n");
  REQUIRE(r.size() == 2);
  CHECK(r[0] == std::vector<std::string>{"aaa", "b\"bb", "ccc"});
  CHECK(r[1] == std::vector<std::string>{"zzz", "x\r\ny", ""});
}

TEST_CASE("sweep tables in display and CSV cells hold the same figures") {
  const TeeSweepResult s = SmallSweep();
  const Table display = SweepTable(s, TeeCells::kDisplay);
  const Table csv = SweepTable(s, TeeCells::kCsv);
  CHECK(display.header ==
        std::vector<std::string>{"largest", "R1", "R2", "R3", "e_n NG",
                                 "output rms", "input rms", "offset worst",
                                 "noise cost", "out-arm I", "flags"});
  CHECK(csv.header == std::vector<std::string>{
                          "largest_ohm", "r1_ohm", "r2_ohm", "r3_ohm", "plain",
                          "noise_gain_dc", "output_rms_V", "input_rms_V",
                          "offset_worst_case_V", "noise_cost_ratio",
                          "output_arm_current_A", "flags"});
  REQUIRE(display.rows.size() == 2);
  REQUIRE(csv.rows.size() == 2);
  // The plain row names itself; its CSV record says plain = 1.
  CHECK(display.rows[0][2] == "-");
  CHECK(display.rows[0][3] == "(plain)");
  CHECK(csv.rows[0][4] == "1");
  CHECK(csv.rows[1][4] == "0");
  // Column by column, display and CSV agree (display column d is CSV
  // column c).
  const std::vector<std::pair<int, int>> pairs = {
      {0, 0}, {1, 1}, {4, 5}, {5, 6}, {6, 7}, {7, 8}, {8, 9}};
  const Quantity kinds[] = {Quantity::kResistance, Quantity::kResistance,
                            Quantity::kGain,       Quantity::kVoltage,
                            Quantity::kVoltage,    Quantity::kVoltage,
                            Quantity::kRatio};
  for (int r = 0; r < 2; ++r)
    for (std::size_t k = 0; k < pairs.size(); ++k) {
      const auto [d, c] = pairs[k];
      INFO("row " << r << " column " << display.header[d]);
      CHECK(RelErr(DisplayValue(display.rows[r][d], kinds[k]),
                   std::stod(csv.rows[r][c])) < kRelFourDigits);
    }
  // Kennelly's equivalent resistance of the tee row, from the CSV cells.
  const double r1 = std::stod(csv.rows[1][1]), r2 = std::stod(csv.rows[1][2]),
               r3 = std::stod(csv.rows[1][3]);
  CHECK(RelErr(r1 + r2 + r1 * r2 / r3, 10e6) < kRelCsv);
}

TEST_CASE("sweep CSV is RFC 4180 with SI numbers") {
  const TeeSweepResult s = SmallSweep();
  const auto records = test::ReadCsv(SweepToCsv(s));
  REQUIRE(records.size() == 3);
  for (const auto& r : records) CHECK(r.size() == 12);
  CHECK(records[0][6] == "output_rms_V");
  CHECK(RelErr(std::stod(records[2][6]), 985.6e-6) < kRelCsv);
  // noise cost = output rms / the plain row's (design/tee_sweep.h).
  CHECK(RelErr(std::stod(records[2][9]),
               std::stod(records[2][6]) / std::stod(records[1][6])) < kRelCsv);
}

TEST_CASE("sweep markdown is a heading, a list and one row per network") {
  const std::string md = SweepToMarkdown(SmallSweep());
  // The stage name is escaped (CommonMark 0.30, section 2.4), so its |, *
  // and < stay text and cannot open a cell, emphasis or a tag.
  CHECK(md.rfind("## T-network sweep: bench \\| \\*tee\\* \\<b\\>\n\n", 0) ==
        0);
  CHECK(md.find("- temperature: 25.00 \xC2\xB0"
                "C (298.15 K)\n") != std::string::npos);
  CHECK(md.find("- band: 10.00 Hz to 5.000 kHz\n") != std::string::npos);
  CHECK(md.find("- gain kept: 909 V/V at DC") != std::string::npos);
  CHECK(md.find(RenderMarkdown(SweepTable(SmallSweep(), TeeCells::kDisplay))) !=
        std::string::npos);
  // GFM tables: header, delimiter, then one line per network.
  int table_lines = 0;
  std::istringstream in(md);
  for (std::string line; std::getline(in, line);)
    table_lines += line.rfind("| ", 0) == 0;
  CHECK(table_lines == 1 + 1 + 2);
  CHECK(md.find("| 100.0 k\xCE\xA9 | 100.0 k\xCE\xA9 | 100.0 k\xCE\xA9 | "
                "1.020 k\xCE\xA9 | 1007 | 985.6 \xC2\xB5V |") !=
        std::string::npos);
}

TEST_CASE("search tables show the score only for the weighted ranking") {
  TeeSearchResult s;
  TeeCandidate c;
  c.r_in_ohm = 10e3;
  c.r1_ohm = 100e3;
  c.r2_ohm = 90.9e3;
  c.r3_ohm = 931;
  c.score = 0.5;
  c.budget = RowBudget(980.9e-6, 0.3008, 1003);
  s.best = {c};
  TeeSearchQuery q;
  q.series = "E96";
  q.min_ohm = 100;
  q.max_ohm = 100e3;
  q.target_gain = 909.447;
  q.gain_tolerance = 0.005;
  q.ranking = TeeRanking::kNoise;
  const Table noise = SearchTable(s, q, TeeCells::kDisplay);
  // The flags column closes every table; before it the output-arm
  // current, and before that the ranking's column.
  REQUIRE(noise.header.size() >= 2);
  CHECK(noise.header.back() == "flags");
  CHECK(noise.header[noise.header.size() - 3] == "noise cost");
  q.ranking = TeeRanking::kWeighted;
  const Table weighted = SearchTable(s, q, TeeCells::kDisplay);
  CHECK(weighted.header[weighted.header.size() - 3] == "score");
  const Table csv = SearchTable(s, q, TeeCells::kCsv);
  CHECK(csv.header[csv.header.size() - 3] == "score");
  // gain error = |gain| / target - 1, in percent on display.
  const double error = 909.0 / 909.447 - 1;
  CHECK(RelErr(std::stod(csv.rows[0][6]), error) < kRelCsv);
  char expected[32];
  std::snprintf(expected, sizeof expected, "%+.3f %%", 100 * error);
  CHECK(noise.rows[0][5] == expected);

  const std::string md = SearchToMarkdown(s, q);
  CHECK(md.rfind("## T-network search: bench \\| \\*tee\\* \\<b\\>\n", 0) == 0);
  CHECK(md.find("- target gain: 909.447 within 0.5 %; ranked by weighted") !=
        std::string::npos);
  CHECK(md.find("| 1 | 10.00 k\xCE\xA9 | 100.0 k\xCE\xA9 | 90.90 k\xCE\xA9 | "
                "931.0 \xCE\xA9 |") != std::string::npos);
}

}  // namespace
}  // namespace hushgain

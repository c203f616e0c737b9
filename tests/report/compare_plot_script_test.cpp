// The `compare --plot` script, read as text: one bar per op-amp in the
// ranking's order (the first at the top), its segments by kind in proportion
// to the shares and adding up to the input-referred rms, the verdict beside
// it, a refused op-amp with its word and no bar, and device and stage names
// only as escaped literals.
#include "report/compare_plot_script.h"

#include <doctest/doctest.h>

#include <sstream>
#include <string>
#include <vector>

#include "report/text_escape.h"

namespace hushgain {
namespace {

// Names that would run a command if they reached gnuplot unquoted.
const char* kHostile = "\"; system(\"touch pwned\") ; `id` @x '";

OpAmpComparisonRow Row(const std::string& name, double rms,
                       NoiseKindShares shares) {
  OpAmpComparisonRow r;
  r.device = name;
  r.budget.input_rms = rms;
  r.shares = shares;
  return r;
}

OpAmpComparison Comparison() {
  OpAmpComparison c;
  c.band_low_hz = 1;
  c.band_high_hz = 1e3;
  c.input_unit = "V";
  c.rows.push_back(Row("quiet", 2e-6, {0.5, 0.25, 0.25, 0}));
  c.rows.push_back(Row(kHostile, 4e-6, {0.1, 0.2, 0.3, 0.4}));
  OpAmpComparisonRow refused;
  refused.device = "broken";
  refused.status = Status::Fail("no feedback capacitor");
  c.rows.push_back(refused);
  return c;
}

std::string Block(const std::string& gp, const std::string& name) {
  const std::string start = "$" + name + " << EOD\n";
  const std::size_t from = gp.find(start);
  REQUIRE(from != std::string::npos);
  const std::size_t end = gp.find("EOD\n", from + start.size());
  return gp.substr(from + start.size(), end - from - start.size());
}

// The records of a datablock: x y x_low x_high y_low y_high.
std::vector<std::vector<double>> Records(const std::string& block) {
  std::vector<std::vector<double>> out;
  std::istringstream lines(block);
  std::string line;
  while (std::getline(lines, line)) {
    std::istringstream fields(line);
    std::vector<double> record;
    double v = 0;
    while (fields >> v) record.push_back(v);
    out.push_back(record);
  }
  return out;
}

TEST_CASE("the compare sheet splits each bar by kind in the ranking's order") {
  Stage stage;
  stage.name = kHostile;
  ComparePlotOptions options;
  options.output_path = "/tmp/x.svg";
  options.format = PlotFormat::kSvg;
  const OpAmpComparison c = Comparison();
  const std::string gp = BuildComparePlotScript(stage, c, options);
  // The bars in µV (the largest is 4 µV); the first row at y = 3.
  std::vector<std::vector<std::vector<double>>> kinds;
  for (int k = 0; k < 4; ++k)
    kinds.push_back(Records(Block(gp, "kind" + std::to_string(k))));
  for (const auto& kind : kinds) REQUIRE(kind.size() == 2);  // refused: none
  const double rms[] = {2, 4};
  const double y[] = {3, 2};
  const double shares[2][4] = {{0.5, 0.25, 0.25, 0}, {0.1, 0.2, 0.3, 0.4}};
  for (int row = 0; row < 2; ++row) {
    CAPTURE(row);
    double from = 0;
    for (int k = 0; k < 4; ++k) {
      const std::vector<double>& seg = kinds[k][row];
      REQUIRE(seg.size() == 6);
      CHECK(seg[1] == doctest::Approx(y[row]));
      CHECK(seg[2] == doctest::Approx(from));
      from += shares[row][k] * rms[row];
      CHECK(seg[3] == doctest::Approx(from));
    }
    CHECK(from == doctest::Approx(rms[row]));  // the segments fill the bar
  }
  CHECK(gp.find(GnuplotString("input-referred noise rms (\xC2\xB5V)")) !=
        std::string::npos);
  // Each op-amp named on its line, the refused one with its verdict.
  CHECK(gp.find("\"quiet\" 3") != std::string::npos);
  CHECK(gp.find("\"broken\" 1") != std::string::npos);
  CHECK(gp.find("\"refused\" at first 0, first 1") != std::string::npos);
  CHECK(gp.find(GnuplotString("2.000 \xC2\xB5V  fits") +
                " at first 2, first 3") != std::string::npos);
  CHECK(gp.find("with boxxyerror") != std::string::npos);
  // Names reach gnuplot only as escaped literals.
  CHECK(gp.find(GnuplotString(kHostile) + " 2") != std::string::npos);
  CHECK(gp.find("system(\"touch") == std::string::npos);
  CHECK(gp.find("`id`") == std::string::npos);
}

TEST_CASE("the compare sheet keeps its legend when every op-amp is refused") {
  // Empty datablocks alone would leave gnuplot nothing to plot: a line
  // below the axis carries the key entries.
  OpAmpComparison c = Comparison();
  c.rows.erase(c.rows.begin(), c.rows.begin() + 2);
  const std::string gp = BuildComparePlotScript(Stage{}, c, {});
  CHECK(Block(gp, "kind0").empty());
  CHECK(gp.find("plot -1 notitle, keyentry with boxes") != std::string::npos);
  CHECK(gp.find("using 1:2:3:4:5:6") == std::string::npos);
  CHECK(gp.find("\"refused\" at first 0, first 1") != std::string::npos);
}

}  // namespace
}  // namespace hushgain

// The T-network pictures' gnuplot scripts, read as text: the data inline,
// the axes with units, the plain-resistor end marked, the noise cost axis
// linked to the noise axis, and names from the stage only as escaped
// literals.
#include "report/tee_plot_script.h"

#include <doctest/doctest.h>

#include <sstream>
#include <string>

#include "report/plot_axes.h"
#include "report/text_escape.h"

namespace hushgain {
namespace {

// A name that would run a command if it reached gnuplot unquoted.
const char* kHostile = "\"; system(\"touch pwned\") ; `id` @x '";

Budget RowBudget(double output_rms_v, double offset_v) {
  Budget b;
  b.stage_name = kHostile;
  b.temperature_k = 298.15;
  b.band_low_hz = 10;
  b.band_high_hz = 5e3;
  b.output_rms_v = output_rms_v;
  b.offset.worst_case_v = offset_v;
  return b;
}

TeeSweepResult SmallSweep() {
  TeeSweepResult s;
  s.equivalent_ohm = 10e6;
  TeeSweepRow plain;
  plain.largest_ohm = 10e6;
  plain.plain = true;
  plain.tee = {10e6, 0, 0};
  plain.budget = RowBudget(900e-6, 0.25);
  plain.noise_cost_ratio = 1;
  TeeSweepRow tee;
  tee.largest_ohm = 100e3;
  tee.tee = {100e3, 100e3, 1e10 / 9.8e6};
  tee.budget = RowBudget(990e-6, 0.3);
  tee.noise_cost_ratio = 1.1;
  s.rows = {plain, tee};
  return s;
}

int Count(const std::string& text, const std::string& what) {
  int n = 0;
  for (std::size_t at = text.find(what); at != std::string::npos;
       at = text.find(what, at + 1))
    ++n;
  return n;
}

std::string Block(const std::string& gp, const std::string& name) {
  const std::string start = "$" + name + " << EOD\n";
  const std::size_t from = gp.find(start);
  REQUIRE(from != std::string::npos);
  const std::size_t to = gp.find("EOD\n", from + start.size());
  return gp.substr(from + start.size(), to - from - start.size());
}

TEST_CASE("the sweep script draws noise and offset against the largest R") {
  TeePlotOptions o;
  o.format = PlotFormat::kSvg;
  o.output_path = "/tmp/sweep.svg.tmp-1";
  o.stage_largest_ohm = 100e3;
  const std::string gp = BuildSweepPlotScript(SmallSweep(), o);
  CHECK(gp.rfind("set terminal svg ", 0) == 0);
  CHECK(gp.find("noenhanced") != std::string::npos);
  CHECK(Count(gp, "\nplot ") == 2);
  CHECK(Count(gp, "set logscale x\n") == 2);
  // Rows in µV and mV (the largest values are 990 µV and 300 mV): L, output
  // rms, worst-case offset.
  CHECK(Block(gp, "sweep") == "10000000 900 250\n100000 990 300\n");
  CHECK(Block(gp, "plain") == "10000000 900 250\n");
  // The noise cost axis is the noise axis over the plain row's rms, so the
  // one curve reads in both (cost = rms / plain rms, design/tee_sweep.h).
  // Linear (990 / 900 < 3): 8 % of the span below, 12 % above, with the
  // span 90 µV.
  const double lo = 900 - 0.08 * 90, hi = 990 + 0.12 * 90;
  CHECK(gp.find("set yrange [" + PlotNumber(lo) + ":" + PlotNumber(hi) +
                "]\nset y2range [" + PlotNumber(lo / 900) + ":" +
                PlotNumber(hi / 900) + "]\n") != std::string::npos);
  // Units on the axes.
  CHECK(gp.find("set ylabel " +
                GnuplotString("output noise rms over the band (\xC2\xB5V)")) !=
        std::string::npos);
  CHECK(gp.find("set xlabel " +
                GnuplotString("largest resistor of the network (\xCE\xA9)")) !=
        std::string::npos);
  // The plain end is ringed and named; the stage's own network is marked.
  CHECK(gp.find("title " + GnuplotString("plain R_f = 10.00 M\xCE\xA9: "
                                         "900.0 \xC2\xB5V")) !=
        std::string::npos);
  CHECK(gp.find("set arrow from first 100000, graph 0 to first 100000") !=
        std::string::npos);
  CHECK(gp.rfind("unset multiplot\nset output\n") == gp.size() - 27);
}

TEST_CASE("the noise cost axis has tics at round ratios") {
  TeePlotOptions o;
  o.output_path = "x.png";
  const std::string gp = BuildSweepPlotScript(SmallSweep(), o);
  CHECK(gp.rfind("set terminal pngcairo ", 0) == 0);
  // The axis spans about x0.99 .. x1.11 of the plain rms (8 % and 12 % of
  // the span added below and above): a fifth of that, 0.024, rounds up to
  // a step of 0.05.
  CHECK(gp.find(GnuplotString("x1.00") + " 1,") != std::string::npos);
  CHECK(gp.find(GnuplotString("x1.05") + " 1.05,") != std::string::npos);
  CHECK(gp.find(GnuplotString("x1.10") + " 1.1") != std::string::npos);
}

TEST_CASE("stage names reach the T-network scripts only as escaped text") {
  TeePlotOptions o;
  o.output_path = "x.svg";
  TeeSearchResult search;
  TeeCandidate c;
  c.r_in_ohm = 10e3;
  c.r1_ohm = 100e3;
  c.r2_ohm = 90.9e3;
  c.r3_ohm = 931;
  c.budget = RowBudget(980e-6, 0.3);
  search.best = {c, c};
  TeeSearchQuery q;
  q.series = "E96";
  q.min_ohm = 100;
  q.max_ohm = 100e3;
  q.target_gain = 909;
  q.gain_tolerance = 0.005;
  q.ranking = TeeRanking::kNoise;
  for (const std::string& gp : {BuildSweepPlotScript(SmallSweep(), o),
                                BuildSearchPlotScript(search, q, o)}) {
    // The name once, as the heading's literal (GnuplotString is checked in
    // text_escape_test.cpp); none of its quotes, backquotes or calls raw.
    CHECK(Count(gp, "set label 1 " + GnuplotString(kHostile) + " ") == 1);
    CHECK(gp.find("system(") == std::string::npos);
    CHECK(gp.find('`') == std::string::npos);
    CHECK(gp.find('@') == std::string::npos);
  }
}

TEST_CASE("the search script draws each network by rank") {
  TeePlotOptions o;
  o.output_path = "x.png";
  TeeSearchResult search;
  for (int i = 0; i < 3; ++i) {
    TeeCandidate c;
    c.r_in_ohm = 10e3;
    c.r1_ohm = 100e3;
    c.r2_ohm = 90e3 + 1e3 * i;
    c.r3_ohm = 900 + 10 * i;
    c.budget = RowBudget(980e-6 + 1e-6 * i, 0.3 + 0.001 * i);
    search.best.push_back(c);
  }
  TeeSearchQuery q;
  q.series = "E24";
  q.min_ohm = 100;
  q.max_ohm = 100e3;
  q.target_gain = 909;
  q.gain_tolerance = 0.01;
  q.ranking = TeeRanking::kOffset;
  const std::string gp = BuildSearchPlotScript(search, q, o);
  CHECK(Count(gp, "\nplot ") == 2);
  // rank, rms (µV), offset (mV), R_in, R1, R2, R3.
  CHECK(Block(gp, "best") ==
        "1 980 300 10000 100000 90000 900\n"
        "2 981 301 10000 100000 91000 910\n"
        "3 982 302 10000 100000 92000 920\n");
  CHECK(gp.find("set xtics (" + GnuplotString("#1") + " 1, " +
                GnuplotString("#2") + " 2, " + GnuplotString("#3") + " 3)") !=
        std::string::npos);
  CHECK(gp.find(GnuplotString("rank (best first, by offset)")) !=
        std::string::npos);
  // No free input: R1, R2, R3 drawn, R_in not.
  CHECK(gp.find(GnuplotString("R3 (tee to ground)")) != std::string::npos);
  CHECK(gp.find("title " + GnuplotString("R_in")) == std::string::npos);
}

}  // namespace
}  // namespace hushgain
